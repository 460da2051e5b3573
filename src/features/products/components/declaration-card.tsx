import { useEffect, useId, useState } from 'react'
import { formatDate } from '@shared/domain/dates/dates'
import { Badge } from '@/components/ui/badge'
import { Button } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { Field, Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { LoadingBlock } from '@/components/ui/spinner'
import { toast } from '@/components/ui/toast'
import { useConfirmDeclaration, useDeclaration } from '@/features/products/api/declaration'
import { ApiError } from '@/lib/api-client'

const pct = (n: number) => (n >= 10 ? n.toFixed(0) : n >= 1 ? n.toFixed(1) : n.toFixed(2))

/**
 * The ingredient list drafted from the recipe, heaviest first, which the owner reads, may edit,
 * and confirms as the label's wording.
 */
export function DeclarationCard({ productId }: { productId: number }) {
  const declaration = useDeclaration(productId)
  const confirm = useConfirmDeclaration(productId)
  const [text, setText] = useState('')
  const [error, setError] = useState<string | null>(null)
  const tableId = useId()
  const d = declaration.data

  useEffect(() => {
    if (d) setText(d.confirmed?.text ?? d.draft.text)
  }, [d])

  const submit = async () => {
    setError(null)
    try {
      await confirm.mutateAsync(text)
      toast.success('Declaration confirmed.')
    } catch (err) {
      setError(err instanceof ApiError ? (err.fieldErrors[0]?.message ?? err.message) : 'That did not work.')
    }
  }

  return (
    <Card>
      <CardHeader
        title="Ingredient declaration"
        description="Drafted from the recipe in descending order of weight as added (21 CFR 701.3(a); EU 1223/2009 Art. 19(1)(g))."
        actions={
          d?.confirmed ? (
            d.confirmed.text === d.draft.text ? (
              <Badge tone="green">Confirmed</Badge>
            ) : (
              <Badge tone="honey">Differs from the draft</Badge>
            )
          ) : d ? (
            <Badge tone="neutral">Not confirmed</Badge>
          ) : null
        }
      />
      <CardBody className="flex flex-col gap-5">
        {declaration.isPending ? (
          <LoadingBlock label="Drafting the declaration…" />
        ) : declaration.isError || !d ? (
          <FormError
            message={
              declaration.error instanceof Error ? declaration.error.message : 'The draft could not be made.'
            }
          />
        ) : (
          <>
            <div>
              <h3 className="text-sm font-medium text-ink-800">Draft from “{d.recipeName}”</h3>
              <p className="mt-1 rounded-md bg-cream-100 px-3 py-2 text-sm text-ink-900">{d.draft.text}</p>
              <p className="mt-1 text-xs text-ink-600">
                Weights for one mould ({Math.round(d.oilWeightG)} g of oils). Net weight on the label:{' '}
                {d.netWeightG} g ({d.netWeightOz.toFixed(2)} oz).
              </p>
            </div>
            <div role="region" aria-labelledby={tableId} tabIndex={0} className="overflow-x-auto">
              <table className="w-full text-sm">
                <caption id={tableId} className="sr-only">
                  Declaration entries by weight
                </caption>
                <thead className="border-b border-cream-300 text-left text-xs text-ink-700 uppercase">
                  <tr>
                    <th scope="col" className="py-1.5 pr-3 font-medium">
                      Entry
                    </th>
                    <th scope="col" className="py-1.5 pr-3 text-right font-medium">
                      Grams as added
                    </th>
                    <th scope="col" className="py-1.5 text-right font-medium">
                      Share
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {d.draft.entries.map((e) => (
                    <tr key={e.label} className="border-b border-cream-200 last:border-0">
                      <td className="py-1.5 pr-3">
                        {e.label}
                        {e.minor ? <span className="ml-2 text-xs text-ink-600">1 % or less</span> : null}
                      </td>
                      <td className="py-1.5 pr-3 text-right tabular-nums">{e.grams.toFixed(1)}</td>
                      <td className="py-1.5 text-right tabular-nums">{pct(e.pct)} %</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
            {d.notes.length > 0 ? (
              <ul className="list-disc space-y-1 pl-5 text-sm text-ink-700">
                {d.notes.map((n) => (
                  <li key={n}>{n}</li>
                ))}
              </ul>
            ) : null}
            <p className="text-sm text-ink-700">
              The draft is an aid. A bar sold only as soap is regulated as soap, not as a cosmetic (21 CFR
              701.20); the studio’s own assessment, local labelling rules and licensed advice decide what the
              label says.
            </p>
            {d.confirmed ? (
              <div className="rounded-md border border-olive-200 bg-olive-50 px-3 py-2 text-sm">
                <p className="font-medium text-olive-900">
                  Confirmed on {formatDate(d.confirmed.confirmedAt.slice(0, 10))}
                </p>
                <p className="mt-1 text-ink-900">{d.confirmed.text}</p>
              </div>
            ) : null}
            {error ? <FormError message={error} /> : null}
            <Field label="Label wording" hint="Edit if the studio words it differently, then confirm.">
              <Textarea rows={3} value={text} onChange={(e) => setText(e.target.value)} />
            </Field>
            <div className="flex flex-wrap gap-2">
              <Button onClick={submit} loading={confirm.isPending} disabled={text.trim() === ''}>
                Confirm declaration
              </Button>
              {text !== d.draft.text ? (
                <Button variant="ghost" onClick={() => setText(d.draft.text)}>
                  Use the draft
                </Button>
              ) : null}
            </div>
          </>
        )}
      </CardBody>
    </Card>
  )
}
