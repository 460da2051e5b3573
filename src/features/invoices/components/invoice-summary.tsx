import { formatDate } from '@shared/domain/dates/dates'
import type { InvoiceDto } from '@shared/schemas/invoices'
import { PAYMENT_METHOD_LABELS } from '@shared/schemas/payments'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { Money } from '@/components/ui/money'

/** The invoice's lines, its totals, and the money received against it. */
export function InvoiceSummary({ invoice }: { invoice: InvoiceDto }) {
  const credit = invoice.kind === 'credit_note'
  const m = (cents: number) => <Money cents={cents} currency={invoice.currency} />
  const rows: [string, number, boolean][] = [
    ['Subtotal', invoice.subtotalCents, false],
    ['Shipping', invoice.shippingCents, false],
    [
      invoice.taxExempt
        ? 'Tax (exempt, resale certificate)'
        : `Tax${invoice.taxRatePct ? ` (${invoice.taxRatePct} %)` : ''}`,
      invoice.taxCents,
      false,
    ],
    [credit ? 'Total credited' : 'Total', invoice.totalCents, true],
    ...(credit
      ? []
      : ([
          ['Paid', invoice.paidCents, false],
          ['Amount due', invoice.outstandingCents, true],
        ] as [string, number, boolean][])),
  ]
  return (
    <>
      <Card>
        <CardHeader title="Lines" />
        <div role="region" aria-label="Invoice lines" tabIndex={0} className="overflow-x-auto">
          <table className="w-full text-sm">
            <caption className="sr-only">Invoice lines</caption>
            <thead className="border-b border-cream-300 bg-cream-50 text-left text-xs tracking-wide text-ink-700 uppercase">
              <tr>
                <th scope="col" className="px-4 py-2.5 sm:px-6">
                  SKU
                </th>
                <th scope="col" className="px-3 py-2.5">
                  Product
                </th>
                <th scope="col" className="px-3 py-2.5 text-right">
                  Cases
                </th>
                <th scope="col" className="px-3 py-2.5 text-right">
                  Bars
                </th>
                <th scope="col" className="px-3 py-2.5 text-right">
                  Unit price
                </th>
                <th scope="col" className="px-4 py-2.5 text-right sm:px-6">
                  Amount
                </th>
              </tr>
            </thead>
            <tbody>
              {invoice.lines.map((l) => (
                <tr key={l.id} className="border-b border-cream-200 last:border-b-0">
                  <td className="px-4 py-2.5 font-mono sm:px-6">{l.sku}</td>
                  <td className="px-3 py-2.5">{l.description}</td>
                  <td className="px-3 py-2.5 text-right tabular-nums">
                    {l.cases} × {l.casePack}
                  </td>
                  <td className="px-3 py-2.5 text-right tabular-nums">{l.bars}</td>
                  <td className="px-3 py-2.5 text-right">{m(l.unitPriceCents)}</td>
                  <td className="px-4 py-2.5 text-right sm:px-6">{m(l.lineTotalCents)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <CardBody className="border-t border-cream-200">
          <dl className="ml-auto grid max-w-sm grid-cols-[1fr_auto] gap-x-6 gap-y-1.5 text-sm">
            {rows.map(([label, cents, strong]) => (
              <div key={label} className="contents">
                <dt className={strong ? 'font-medium text-ink-900' : 'text-ink-700'}>{label}</dt>
                <dd className={strong ? 'text-right font-medium text-ink-900' : 'text-right'}>{m(cents)}</dd>
              </div>
            ))}
          </dl>
        </CardBody>
      </Card>
      {!credit ? (
        <Card>
          <CardHeader title="Payments received" />
          <CardBody>
            {invoice.payments.length === 0 ? (
              <p className="text-sm text-ink-700">Nothing received yet.</p>
            ) : (
              <ul className="divide-y divide-cream-200 text-sm">
                {invoice.payments.map((p) => (
                  <li key={p.id} className="flex flex-wrap items-baseline justify-between gap-2 py-2">
                    <span>
                      {formatDate(p.receivedOn)} · {PAYMENT_METHOD_LABELS[p.method]}
                      {p.reference ? ` · ${p.reference}` : ''}
                      {p.recordedBy ? (
                        <span className="block text-xs text-ink-600">Recorded by {p.recordedBy}</span>
                      ) : null}
                    </span>
                    <span className="text-right font-medium">
                      {m(p.amountCents)}
                      {p.refundedCents > 0 ? (
                        <span className="block text-xs font-normal text-ink-600">
                          {m(p.refundedCents)} refunded
                        </span>
                      ) : null}
                    </span>
                  </li>
                ))}
              </ul>
            )}
          </CardBody>
        </Card>
      ) : null}
    </>
  )
}
