import { useState } from 'react'
import { formatDate } from '@shared/domain/dates/dates'
import { formatCents } from '@shared/domain/money/money'
import type { InvoiceDto, InvoicePaymentDto } from '@shared/schemas/invoices'
import { Button } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { RefundDialog } from '@/features/card-payments/components/refund-dialog'

/** The owner's card payments on an invoice, taken through the card service, each refundable. */
export function CardPaymentsPanel({ invoice, onChanged }: { invoice: InvoiceDto; onChanged: () => void }) {
  const [refunding, setRefunding] = useState<InvoicePaymentDto | null>(null)
  const card = invoice.payments.filter((p) => p.refundable)
  if (card.length === 0) return null
  const m = (c: number) => formatCents(c, invoice.currency)
  return (
    <Card>
      <CardHeader
        title="Card payments"
        description="Paid by the shop on the card page; refunds go back to the card."
      />
      <CardBody>
        <ul className="divide-y divide-cream-200 text-sm">
          {card.map((p) => {
            const left = p.amountCents - p.refundedCents
            return (
              <li key={p.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                <span>
                  {formatDate(p.receivedOn)} · {m(p.amountCents)}
                  <span className="block text-xs text-ink-600">
                    {p.refundedCents ? `${m(p.refundedCents)} refunded · ` : ''}
                    <span className="font-mono">{p.reference}</span>
                  </span>
                </span>
                <Button
                  size="sm"
                  variant="secondary"
                  disabled={left === 0}
                  aria-label={`${left === 0 ? 'Refunded' : 'Refund'}: card payment of ${m(p.amountCents)} from ${formatDate(p.receivedOn)}`}
                  onClick={() => setRefunding(p)}
                >
                  {left === 0 ? 'Refunded' : 'Refund'}
                </Button>
              </li>
            )
          })}
        </ul>
      </CardBody>
      {refunding ? (
        <RefundDialog
          payment={refunding}
          invoiceNumber={invoice.number}
          currency={invoice.currency}
          onClose={() => setRefunding(null)}
          onRefunded={onChanged}
        />
      ) : null}
    </Card>
  )
}
