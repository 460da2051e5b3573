import { formatDate } from '@shared/domain/dates/dates'
import { formatCents } from '@shared/domain/money/money'
import type { InvoiceDto } from '@shared/schemas/invoices'
import { renderEmail } from './layout'
import type { Email } from './layout'

type Common = { studioName: string; name: string; link: string; invoice: InvoiceDto }

/** The receipt for a card payment taken through the hosted card-payment page. */
export function cardReceiptEmail(
  p: Common & { amountCents: number; paidOn: string; reference: string },
): Email {
  const { invoice } = p
  const money = (c: number) => formatCents(c, invoice.currency)
  return renderEmail({
    subject: `Receipt: ${money(p.amountCents)} paid by card on invoice ${invoice.number}`,
    studioName: p.studioName,
    greeting: `Hello ${p.name},`,
    blocks: [
      {
        kind: 'p',
        text: `Thank you: we received ${money(p.amountCents)} by card on ${formatDate(p.paidOn)} for invoice ${invoice.number} (order ${invoice.orderNumber}).`,
      },
      {
        kind: 'list',
        items: [
          `Invoice total: ${money(invoice.totalCents)}`,
          `Received so far: ${money(invoice.paidCents)}`,
          invoice.outstandingCents === 0
            ? 'Still owed: nothing, the invoice is paid'
            : `Still owed: ${money(invoice.outstandingCents)}`,
          `Card payment reference: ${p.reference}`,
        ],
      },
      { kind: 'button', text: 'Your invoices', href: p.link },
      {
        kind: 'small',
        text: 'Keep this e-mail as your receipt. Your card statement shows the studio as the payee.',
      },
    ],
  })
}

/** A refund of (part of) a card payment, back to the card it came from. */
export function cardRefundEmail(p: Common & { amountCents: number; reference: string }): Email {
  const { invoice } = p
  const money = (c: number) => formatCents(c, invoice.currency)
  return renderEmail({
    subject: `Refund: ${money(p.amountCents)} back to your card for invoice ${invoice.number}`,
    studioName: p.studioName,
    greeting: `Hello ${p.name},`,
    blocks: [
      {
        kind: 'p',
        text: `We refunded ${money(p.amountCents)} of your card payment on invoice ${invoice.number} (order ${invoice.orderNumber}). Card refunds usually take a few working days to show on a statement (common practice).`,
      },
      {
        kind: 'list',
        items: [
          `Received on the invoice now: ${money(invoice.paidCents)}`,
          `Still owed: ${money(invoice.outstandingCents)}`,
          `Refund reference: ${p.reference}`,
        ],
      },
      { kind: 'button', text: 'Your invoices', href: p.link },
    ],
  })
}
