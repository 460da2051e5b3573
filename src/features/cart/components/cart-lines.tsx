import type { ReactNode } from 'react'
import { formatDate } from '@shared/domain/dates/dates'
import type { CartDto, CartLineDto } from '@shared/schemas/orders'
import { Badge } from '@/components/ui/badge'
import { Button } from '@/components/ui/button'
import { Money } from '@/components/ui/money'
import { Stepper } from '@/components/ui/stepper'
import { useRemoveCartLine, useSetCartLine } from '@/features/cart/api/cart'
import { breakRange } from '@/lib/price-breaks'

const cases = (n: number) => `${n} ${n === 1 ? 'case' : 'cases'}`

/** What today's stock says about a line, and what the buyer can do about it. */
function StockNote({
  line,
  onPreorder,
  onReady,
  pending,
}: {
  line: CartLineDto
  onPreorder: () => void
  onReady: () => void
  pending: boolean
}) {
  switch (line.stock) {
    case 'ready':
      return <Badge tone="green">Ready now</Badge>
    case 'short':
      return (
        <div className="flex flex-col items-start gap-1.5">
          <Badge tone="clay">Only {cases(line.readyCases)} ready now</Badge>
          {line.promisedDate ? (
            <Button size="sm" variant="secondary" onClick={onPreorder} loading={pending}>
              Pre-order instead (ready {formatDate(line.promisedDate)})
            </Button>
          ) : (
            <p className="text-xs text-clay-700">Nothing curing covers it: lower the cases.</p>
          )}
        </div>
      )
    case 'preorder':
      return (
        <div className="flex flex-col items-start gap-1.5">
          <Badge tone="honey">Pre-order, ready {formatDate(line.promisedDate!)}</Badge>
          {line.readyCases >= line.cases ? (
            <Button size="sm" variant="ghost" onClick={onReady} loading={pending}>
              Order from ready stock instead
            </Button>
          ) : null}
        </div>
      )
    case 'preorder_short':
      return <Badge tone="clay">More than curing stock can promise: lower the cases</Badge>
    case 'unavailable':
      return <Badge tone="neutral">No longer available: remove it</Badge>
  }
}

type Props = {
  cart: CartDto
  /** Problems the last attempt to place the order found, by product (from the server). */
  lineErrors: ReadonlyMap<number, string>
  renderTile?: (line: CartLineDto) => ReactNode
}

/** The cart's lines: cases can change in place, each with its break, its total and today's stock. */
export function CartLines({ cart, lineErrors, renderTile }: Props) {
  const setLine = useSetCartLine()
  const remove = useRemoveCartLine()
  const busy = (productId: number) =>
    (setLine.isPending && setLine.variables?.productId === productId) ||
    (remove.isPending && remove.variables === productId)

  return (
    <ul className="flex flex-col divide-y divide-cream-200" aria-label="Lines in your cart">
      {cart.lines.map((line) => {
        const error = lineErrors.get(line.productId)
        return (
          <li
            key={line.productId}
            className="flex flex-col gap-3 py-4 first:pt-0 last:pb-0 sm:flex-row sm:items-start"
          >
            <div className="flex min-w-0 flex-1 items-start gap-3">
              {renderTile?.(line)}
              <div className="min-w-0">
                <p className="font-medium text-ink-900">{line.name}</p>
                <p className="text-xs text-ink-600">
                  {line.sku} · {line.casePack} bars a case
                </p>
                {line.priceBreak ? (
                  <p className="mt-1 text-sm text-ink-700">
                    <Money cents={line.unitPriceCents} currency={cart.currency} /> a bar
                    {line.priceBreaks.length > 1
                      ? ` (the price for ${breakRange(
                          line.priceBreaks,
                          line.priceBreaks.findIndex((b) => b.minCases === line.priceBreak!.minCases),
                        )})`
                      : ''}
                  </p>
                ) : null}
                {line.nextBreak ? (
                  <p className="text-xs text-olive-800">
                    {cases(line.nextBreak.minCases - line.cases)} more for{' '}
                    <Money cents={line.nextBreak.unitPriceCents} currency={cart.currency} /> a bar
                  </p>
                ) : null}
                <div className="mt-2">
                  <StockNote
                    line={line}
                    pending={busy(line.productId)}
                    onPreorder={() =>
                      setLine.mutate({ productId: line.productId, cases: line.cases, preorder: true })
                    }
                    onReady={() =>
                      setLine.mutate({ productId: line.productId, cases: line.cases, preorder: false })
                    }
                  />
                </div>
                {error ? (
                  <p role="alert" className="mt-2 text-sm text-clay-700">
                    {error}
                  </p>
                ) : null}
              </div>
            </div>
            <div className="flex items-center justify-between gap-3 sm:flex-col sm:items-end">
              <Stepper
                value={line.cases}
                onChange={(n) =>
                  setLine.mutate({ productId: line.productId, cases: n, preorder: line.preorder })
                }
                label={`Cases of ${line.name}`}
                unit="case"
                disabled={line.stock === 'unavailable'}
              />
              <p className="text-sm whitespace-nowrap text-ink-700 tabular-nums">{line.bars} bars</p>
              <p className="font-medium text-ink-900">
                <Money cents={line.lineTotalCents} currency={cart.currency} />
              </p>
              <Button
                size="sm"
                variant="ghost"
                onClick={() => remove.mutate(line.productId)}
                aria-label={`Remove ${line.name}`}
              >
                Remove
              </Button>
            </div>
          </li>
        )
      })}
    </ul>
  )
}
