import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useFieldArray, useForm } from 'react-hook-form'
import { z } from 'zod'
import { formatCents, parseMoneyToCents } from '@shared/domain/money/money'
import { priceCheck } from '@shared/domain/pricing/pricing'
import { PriceBreaksSchema } from '@shared/schemas/pricing'
import type { PricingCell, PricingItem, TierRow } from '@shared/schemas/pricing'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useSavePriceBreaks } from '@/features/pricing/api/pricing'
import { ApiError } from '@/lib/api-client'

const toFormField = (field: string) => (field === 'unitPriceCents' ? 'price' : 'minCases')

// Rows are typed money; once they parse, the shared schema (validatePriceBreaks) checks the ladder.
const FormSchema = z
  .object({
    rows: z.array(
      z.object({
        minCases: z.number({ error: 'Enter the number of cases.' }),
        price: z.string().trim(),
      }),
    ),
  })
  .superRefine(({ rows }, ctx) => {
    const breaks = rows.map((r, i) => {
      const cents = parseMoneyToCents(r.price)
      if (cents === null) {
        ctx.addIssue({ code: 'custom', path: ['rows', i, 'price'], message: 'Enter a price such as 4.50.' })
      } else if (cents === 0) {
        ctx.addIssue({
          code: 'custom',
          path: ['rows', i, 'price'],
          message: 'The price must be more than 0.',
        })
      }
      return { minCases: r.minCases, unitPriceCents: cents || 1 }
    })
    const checked = PriceBreaksSchema.safeParse({ breaks })
    for (const issue of checked.error?.issues ?? []) {
      const [, index, field] = issue.path
      const row = rows[Number(index)]
      // A row whose price did not parse already has its message.
      if (field === 'unitPriceCents' && row && !parseMoneyToCents(row.price)) continue
      ctx.addIssue({
        code: 'custom',
        path: ['rows', Number(index), toFormField(String(field))],
        message: issue.message,
      })
    }
  })
type FormIn = z.input<typeof FormSchema>
type FormOut = z.output<typeof FormSchema>

function amount(cents: number, currency: string) {
  return formatCents(cents, currency).replace(/^[^\d]+/, '')
}

/** One product × tier's case breaks, in a dialog: rows of "from N cases, price per bar". */
export function PriceBreakEditor({
  open,
  onClose,
  item,
  tier,
  cell,
  currency,
}: {
  open: boolean
  onClose: () => void
  item: PricingItem
  tier: TierRow
  cell: PricingCell
  currency: string
}) {
  const save = useSavePriceBreaks()
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(FormSchema),
    defaultValues: {
      rows:
        cell.breaks.length > 0
          ? cell.breaks.map((b) => ({ minCases: b.minCases, price: amount(b.unitPriceCents, currency) }))
          : [
              {
                minCases: 1,
                price: cell.suggestedUnitPriceCents ? amount(cell.suggestedUnitPriceCents, currency) : '',
              },
            ],
    },
  })
  const rows = useFieldArray({ control: form.control, name: 'rows' })
  const watched = form.watch('rows')
  const { errors } = form.formState
  const cost = item.costPerBarCents

  const close = () => {
    setFormError(null)
    onClose()
  }

  const submit = form.handleSubmit(async ({ rows: values }) => {
    setFormError(null)
    const breaks = values.map((r) => ({ minCases: r.minCases, unitPriceCents: parseMoneyToCents(r.price)! }))
    try {
      const { warnings } = await save.mutateAsync({ productId: item.productId, tierId: tier.id, breaks })
      if (warnings.length > 0) toast.info(`Saved. ${warnings.map((w) => w.message).join(' ')}`)
      else toast.success(`${item.sku} · ${tier.name}: breaks saved.`)
      close()
    } catch (err) {
      if (err instanceof ApiError) {
        for (const d of err.fieldErrors) {
          const m = /^breaks\.(\d+)\.(minCases|unitPriceCents)$/.exec(d.field)
          if (m)
            form.setError(`rows.${Number(m[1])}.${toFormField(m[2]!)}` as const, {
              type: 'server',
              message: d.message,
            })
        }
        setFormError(err.code === 'under_cost' ? `Refused: ${err.message}` : err.message)
      } else setFormError('The breaks could not be saved.')
    }
  })

  const rowCheck = (i: number) => {
    const cents = parseMoneyToCents(watched?.[i]?.price ?? '')
    if (!cents || cost == null || cost <= 0) return null
    return priceCheck({ priceCents: cents, costCents: cost, targetMarginPct: tier.targetMarginPct })
  }

  return (
    <Dialog
      open={open}
      onClose={close}
      size="lg"
      title={`${item.sku} · ${tier.name} price breaks`}
      description={
        <>
          {item.name}. Cost per bar {cost == null ? 'not known' : formatCents(cost, currency)}; {tier.name}{' '}
          aims for a {tier.targetMarginPct} % margin
          {cell.suggestedUnitPriceCents
            ? `, so ${formatCents(cell.suggestedUnitPriceCents, currency)} per bar`
            : ''}
          . A shop pays the break of the cases on its order line.
        </>
      }
      dismissible={!save.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={save.isPending}>
            Cancel
          </Button>
          <Button type="submit" form="price-break-form" loading={save.isPending}>
            Save breaks
          </Button>
        </>
      }
    >
      <form id="price-break-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        {formError ? <FormError message={formError} /> : null}
        {errors.rows?.root?.message ? <FormError message={errors.rows.root.message} /> : null}
        {rows.fields.length === 0 ? (
          <p className="text-sm text-ink-700">
            No breaks: shops in {tier.name} cannot order this bar. Add a 1-case break to price it.
          </p>
        ) : null}
        <ol className="flex flex-col gap-3">
          {rows.fields.map((f, i) => {
            const check = rowCheck(i)
            return (
              <li
                key={f.id}
                className="grid grid-cols-[1fr_1fr_auto] items-start gap-3 rounded-md bg-cream-50 p-3"
              >
                <Field label={`From cases (break ${i + 1})`} error={errors.rows?.[i]?.minCases?.message}>
                  <Input
                    type="number"
                    inputMode="numeric"
                    min={1}
                    step={1}
                    {...form.register(`rows.${i}.minCases`, { valueAsNumber: true })}
                  />
                </Field>
                <Field
                  label={`Price per bar (break ${i + 1})`}
                  error={errors.rows?.[i]?.price?.message}
                  hint={
                    check ? (
                      <span
                        className={
                          check.level === 'under_cost'
                            ? 'font-medium text-clay-700'
                            : check.level === 'under_margin'
                              ? 'text-honey-700'
                              : 'text-olive-800'
                        }
                      >
                        {check.marginPct.toFixed(1)} % margin
                        {check.level === 'under_cost'
                          ? ' · under cost'
                          : check.level === 'under_margin'
                            ? ' · under target'
                            : ''}
                      </span>
                    ) : undefined
                  }
                >
                  <Input inputMode="decimal" autoComplete="off" {...form.register(`rows.${i}.price`)} />
                </Field>
                <Button
                  variant="ghost"
                  size="sm"
                  className="mt-7"
                  onClick={() => rows.remove(i)}
                  aria-label={`Remove break ${i + 1}`}
                >
                  Remove
                </Button>
              </li>
            )
          })}
        </ol>
        <div>
          <Button
            variant="secondary"
            size="sm"
            onClick={() => {
              const last = watched?.at(-1)?.minCases
              rows.append({ minCases: Number.isFinite(last) && last ? last * 2 : 1, price: '' })
            }}
          >
            Add a break
          </Button>
        </div>
      </form>
    </Dialog>
  )
}
