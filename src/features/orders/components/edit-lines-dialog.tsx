import { useId, useState } from 'react'
import { formatDate } from '@shared/domain/dates/dates'
import type { OrderDto, StockShortfallDto } from '@shared/schemas/orders'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Checkbox, Select } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { LoadingBlock } from '@/components/ui/spinner'
import { Stepper } from '@/components/ui/stepper'
import { toast } from '@/components/ui/toast'
import { useEditOrderLines, useOrderProductOptions } from '@/features/orders/api/orders'
import { casesText } from '@/features/orders/components/format'
import { ApiError } from '@/lib/api-client'

type Draft = {
  productId: number
  name: string
  sku: string
  casePack: number
  cases: number
  preorder: boolean
}

const draftOf = (order: OrderDto): Draft[] =>
  order.lines.map((l) => ({
    productId: l.productId,
    name: l.name,
    sku: l.sku,
    casePack: l.casePack,
    cases: l.cases,
    preorder: l.preorder,
  }))

/**
 * The owner changes an order's lines before packing: cases, pre-order, lines off and on. The server
 * checks stock again and re-prices changed lines at today's break; unchanged lines keep their price.
 */
export function EditLinesDialog({
  order,
  open,
  onClose,
}: {
  order: OrderDto
  open: boolean
  onClose: () => void
}) {
  const options = useOrderProductOptions(order.id, open)
  const edit = useEditOrderLines(order.id)
  const addId = useId()
  const [lines, setLines] = useState<Draft[]>(() => draftOf(order))
  const [adding, setAdding] = useState('')
  const [formError, setFormError] = useState<string | null>(null)
  const [lineErrors, setLineErrors] = useState<Map<number, string>>(new Map())
  const byId = new Map((options.data ?? []).map((o) => [o.productId, o]))
  const addable = (options.data ?? []).filter((o) => !lines.some((l) => l.productId === o.productId))
  const own = new Map(order.lines.map((l) => [l.productId, l]))

  const close = () => {
    setLines(draftOf(order))
    setFormError(null)
    setLineErrors(new Map())
    setAdding('')
    onClose()
  }
  const change = (productId: number, patch: Partial<Draft>) =>
    setLines((ls) => ls.map((l) => (l.productId === productId ? { ...l, ...patch } : l)))

  const save = async () => {
    setFormError(null)
    setLineErrors(new Map())
    try {
      await edit.mutateAsync({
        lines: lines.map(({ productId, cases, preorder }) => ({ productId, cases, preorder })),
      })
      toast.success(`Order ${order.number} is updated.`)
      close()
    } catch (err) {
      if (!(err instanceof ApiError)) {
        setFormError(err instanceof Error ? err.message : 'That did not work.')
        return
      }
      const errors = new Map<number, string>()
      if (err.code === 'insufficient_stock' && Array.isArray(err.details)) {
        for (const s of err.details as StockShortfallDto[]) {
          errors.set(
            s.productId,
            s.preorder
              ? `Curing stock can promise ${s.curingBars ?? 0} more bars; this asks for ${s.requestedBars}.`
              : `${s.readyBars} bars are ready for it (its own included); this asks for ${s.requestedBars}.`,
          )
        }
      }
      for (const d of err.fieldErrors) {
        const m = /^lines\.(\d+)\./.exec(d.field)
        const line = m ? lines[Number(m[1])] : undefined
        if (line) errors.set(line.productId, d.message)
      }
      setLineErrors(errors)
      setFormError(err.message)
    }
  }

  return (
    <Dialog
      open={open}
      onClose={close}
      size="lg"
      title={`Change the lines of ${order.number}`}
      description="Stock is checked again when you save. A changed line is priced at today’s break for the shop; lines you leave alone keep their price."
      dismissible={!edit.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={edit.isPending}>
            Discard changes
          </Button>
          <Button onClick={save} loading={edit.isPending} disabled={lines.length === 0}>
            Save lines
          </Button>
        </>
      }
    >
      {options.isPending ? (
        <LoadingBlock label="Loading the shop’s catalogue…" />
      ) : (
        <div className="flex flex-col gap-4">
          {formError ? <FormError message={formError} /> : null}
          {lines.length === 0 ? (
            <p className="text-sm text-clay-700">
              An order needs at least one line: add a product, or cancel the order instead.
            </p>
          ) : null}
          <ul className="flex flex-col divide-y divide-cream-200">
            {lines.map((l) => {
              const option = byId.get(l.productId)
              const held = own.get(l.productId)
              const readyForIt =
                (option?.readyBars ?? 0) +
                (held && !held.preorder ? held.allocations.reduce((n, a) => n + a.bars, 0) : 0)
              return (
                <li
                  key={l.productId}
                  className="flex flex-col gap-2 py-3 sm:flex-row sm:items-start sm:justify-between"
                >
                  <div className="min-w-0">
                    <p className="font-medium text-ink-900">{l.name}</p>
                    <p className="text-xs text-ink-600">
                      {l.sku} · {l.casePack} a case ·{' '}
                      {option
                        ? `${casesText(Math.floor(readyForIt / l.casePack))} ready for it`
                        : 'no longer on sale for this shop (it can stay as it is)'}
                      {option?.nextReady
                        ? ` · next ${option.nextReady.bars} bars on ${formatDate(option.nextReady.date)}`
                        : ''}
                    </p>
                    {option?.nextReady || l.preorder ? (
                      <Checkbox
                        className="mt-1"
                        label="Pre-order from curing stock"
                        checked={l.preorder}
                        onChange={(e) => change(l.productId, { preorder: e.target.checked })}
                      />
                    ) : null}
                    {lineErrors.get(l.productId) ? (
                      <p role="alert" className="mt-1 text-sm text-clay-700">
                        {lineErrors.get(l.productId)}
                      </p>
                    ) : null}
                  </div>
                  <div className="flex items-center gap-2">
                    <Stepper
                      value={l.cases}
                      onChange={(n) => change(l.productId, { cases: n })}
                      label={`Cases of ${l.name}`}
                      unit="case"
                    />
                    <Button
                      size="sm"
                      variant="ghost"
                      aria-label={`Remove ${l.name}`}
                      onClick={() => setLines((ls) => ls.filter((x) => x.productId !== l.productId))}
                    >
                      Remove
                    </Button>
                  </div>
                </li>
              )
            })}
          </ul>
          {addable.length > 0 ? (
            <div className="flex flex-col gap-1.5 border-t border-cream-200 pt-3">
              <label htmlFor={addId} className="text-sm font-medium text-ink-800">
                Add a product
              </label>
              <div className="flex flex-col gap-2 sm:flex-row">
                <Select
                  id={addId}
                  value={adding}
                  onChange={(e) => setAdding(e.target.value)}
                  className="sm:flex-1"
                >
                  <option value="">Choose a product…</option>
                  {addable.map((o) => (
                    <option key={o.productId} value={o.productId}>
                      {o.name} ({o.sku}) · {casesText(o.readyCases)} ready
                    </option>
                  ))}
                </Select>
                <Button
                  variant="secondary"
                  disabled={!adding}
                  onClick={() => {
                    const o = byId.get(Number(adding))
                    if (!o) return
                    setLines((ls) => [
                      ...ls,
                      {
                        productId: o.productId,
                        name: o.name,
                        sku: o.sku,
                        casePack: o.casePack,
                        cases: 1,
                        preorder: false,
                      },
                    ])
                    setAdding('')
                  }}
                >
                  Add line
                </Button>
              </div>
            </div>
          ) : null}
        </div>
      )}
    </Dialog>
  )
}
