import { formatDate } from '@shared/domain/dates/dates'
import type { OrderDto, OrderLineDto } from '@shared/schemas/orders'
import { Badge } from '@/components/ui/badge'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { Money } from '@/components/ui/money'
import { casesText, formatMoment } from '@/features/orders/components/format'

function LineStock({ line, showLots }: { line: OrderLineDto; showLots: boolean }) {
  if (line.preorder && line.allocations.length === 0) {
    return <Badge tone="honey">Pre-order, promised for {formatDate(line.promisedDate!)}</Badge>
  }
  if (!showLots)
    return line.preorder ? (
      <Badge tone="green">Pre-order, set aside</Badge>
    ) : (
      <Badge tone="green">Set aside</Badge>
    )
  if (line.allocations.length === 0) return <span className="text-ink-600">No bars held</span>
  return (
    <ul className="flex flex-col gap-0.5 text-xs">
      {line.allocations.map((a) => (
        <li key={a.batchId}>
          <span className="font-mono text-ink-900">{a.lotCode}</span>{' '}
          <span className="text-ink-700">· {a.bars} bars</span>
        </li>
      ))}
    </ul>
  )
}

/** An order's lines, totals and history. `showLots` names the batch lot behind every line (the studio's view). */
export function OrderDetail({ order, showLots = false }: { order: OrderDto; showLots?: boolean }) {
  const priced = order.totalCents !== undefined
  const events: [string, string | null, string | null][] = [
    ['Placed', order.placedAt, order.placedBy ? `by ${order.placedBy}` : null],
    ['Confirmed', order.confirmedAt, null],
    [
      'Packed',
      order.packedAt,
      order.packerName ? `by ${order.packerName}${order.cartons ? `, ${order.cartons} cartons` : ''}` : null,
    ],
    ['Shipped', order.shippedAt, null],
    ['Cancelled', order.cancelledAt, order.cancelReason],
  ]
  return (
    <div className="grid gap-6 lg:grid-cols-3">
      <Card className="self-start lg:col-span-2">
        <CardHeader
          title="Lines"
          description={`${casesText(order.lines.reduce((n, l) => n + l.cases, 0))} · ${order.lines.length} ${order.lines.length === 1 ? 'product' : 'products'}`}
        />
        <div role="region" aria-label="Order lines" tabIndex={0} className="overflow-x-auto">
          <table className="w-full border-collapse text-sm">
            <caption className="sr-only">Order lines</caption>
            <thead className="border-b border-cream-300 bg-cream-50 text-left text-xs font-medium tracking-wide text-ink-700 uppercase">
              <tr>
                <th scope="col" className="py-2.5 pr-3 pl-4 sm:pl-6">
                  Product
                </th>
                <th scope="col" className="px-3 py-2.5 text-right">
                  Cases
                </th>
                <th scope="col" className="px-3 py-2.5 text-right">
                  Bars
                </th>
                {priced ? (
                  <>
                    <th scope="col" className="px-3 py-2.5 text-right">
                      Per bar
                    </th>
                    <th scope="col" className="px-3 py-2.5 text-right">
                      Line total
                    </th>
                  </>
                ) : null}
                <th scope="col" className="py-2.5 pr-4 pl-3 sm:pr-6">
                  {showLots ? 'Lots' : 'Stock'}
                </th>
              </tr>
            </thead>
            <tbody>
              {order.lines.map((l) => (
                <tr key={l.id} className="border-b border-cream-200 align-top last:border-b-0">
                  <td className="py-2.5 pr-3 pl-4 sm:pl-6">
                    <span className="block font-medium text-ink-900">{l.name}</span>
                    <span className="block text-xs text-ink-600">
                      {l.sku} · {l.casePack} a case
                    </span>
                  </td>
                  <td className="px-3 py-2.5 text-right tabular-nums">{l.cases}</td>
                  <td className="px-3 py-2.5 text-right tabular-nums">{l.bars}</td>
                  {priced ? (
                    <>
                      <td className="px-3 py-2.5 text-right">
                        <Money cents={l.unitPriceCents ?? 0} currency={order.currency} />
                      </td>
                      <td className="px-3 py-2.5 text-right">
                        <Money cents={l.lineTotalCents ?? 0} currency={order.currency} />
                      </td>
                    </>
                  ) : null}
                  <td className="py-2.5 pr-4 pl-3 sm:pr-6">
                    <LineStock line={l} showLots={showLots} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </Card>

      <div className="flex flex-col gap-6">
        {priced ? (
          <Card>
            <CardHeader title="Totals" />
            <CardBody>
              <dl className="flex flex-col gap-1.5 text-sm">
                <div className="flex justify-between gap-3">
                  <dt className="text-ink-700">Merchandise</dt>
                  <dd>
                    <Money cents={order.subtotalCents!} currency={order.currency} />
                  </dd>
                </div>
                <div className="flex justify-between gap-3">
                  <dt className="text-ink-700">
                    Shipping ({(order.weightG / 1000).toLocaleString('en-US', { maximumFractionDigits: 1 })}{' '}
                    kg)
                  </dt>
                  <dd>
                    <Money cents={order.shippingCents!} currency={order.currency} />
                  </dd>
                </div>
                <div className="flex justify-between gap-3">
                  <dt className="text-ink-700">
                    {order.taxExempt ? 'Tax exempt (certificate on file)' : 'Tax'}
                  </dt>
                  <dd>
                    <Money cents={order.taxCents!} currency={order.currency} />
                  </dd>
                </div>
                <div className="mt-1 flex justify-between gap-3 border-t border-cream-200 pt-2 text-base font-medium text-ink-900">
                  <dt>Total</dt>
                  <dd>
                    <Money cents={order.totalCents!} currency={order.currency} />
                  </dd>
                </div>
              </dl>
            </CardBody>
          </Card>
        ) : null}
        <Card>
          <CardHeader title="Details" />
          <CardBody>
            <dl className="flex flex-col gap-2 text-sm">
              <div>
                <dt className="text-ink-700">Shop</dt>
                <dd className="text-ink-900">{order.shopName}</dd>
              </div>
              <div>
                <dt className="text-ink-700">PO number</dt>
                <dd className="text-ink-900">{order.poNumber ?? '—'}</dd>
              </div>
              {order.requestedShipDate ? (
                <div>
                  <dt className="text-ink-700">Ship on or after</dt>
                  <dd className="text-ink-900">{formatDate(order.requestedShipDate)}</dd>
                </div>
              ) : null}
              {order.note ? (
                <div>
                  <dt className="text-ink-700">Note</dt>
                  <dd className="whitespace-pre-wrap text-ink-900">{order.note}</dd>
                </div>
              ) : null}
              {order.isOpeningOrder ? (
                <div>
                  <dt className="sr-only">Kind</dt>
                  <dd>
                    <Badge tone="sky">Opening order</Badge>
                  </dd>
                </div>
              ) : null}
            </dl>
            <h3 className="mt-4 text-sm font-medium text-ink-900">History</h3>
            <ol className="mt-1 flex flex-col gap-1 text-sm">
              {events
                .filter(([, at]) => at)
                .map(([what, at, extra]) => (
                  <li key={what} className="text-ink-800">
                    <span className="font-medium">{what}</span> {formatMoment(at!)}
                    {extra ? <span className="block text-ink-600">{extra}</span> : null}
                  </li>
                ))}
            </ol>
          </CardBody>
        </Card>
      </div>
    </div>
  )
}
