import { formatDate } from '@shared/domain/dates/dates'
import { formatCents } from '@shared/domain/money/money'
import type { InvoiceDto } from '@shared/schemas/invoices'
import { PAYMENT_TERMS_LABELS } from '@shared/schemas/shops'
import { renderEmail } from './layout'
import type { Email, EmailBlock } from './layout'

type Common = { studioName: string; name: string; link: string }

const money = (cents: number, invoice: Pick<InvoiceDto, 'currency'>) => formatCents(cents, invoice.currency)
const po = (poNumber: string | null) => (poNumber ? ` (your PO ${poNumber})` : '')

function amounts(invoice: InvoiceDto): EmailBlock {
  return {
    kind: 'list',
    items: [
      `Merchandise: ${money(invoice.subtotalCents, invoice)}`,
      `Shipping: ${money(invoice.shippingCents, invoice)}`,
      invoice.taxExempt
        ? 'Tax: exempt (resale certificate on file)'
        : `Tax: ${money(invoice.taxCents, invoice)}`,
      `Total: ${money(invoice.totalCents, invoice)}`,
      ...(invoice.paidCents > 0 ? [`Received so far: ${money(invoice.paidCents, invoice)}`] : []),
    ],
  }
}

function dueLine(invoice: InvoiceDto): string {
  if (invoice.outstandingCents === 0) return 'Nothing is owed on it: thank you.'
  return invoice.terms === 'prepay'
    ? `Your account pays before shipping: ${money(invoice.outstandingCents, invoice)} is due now (by ${formatDate(invoice.dueDate)}).`
    : `Terms ${PAYMENT_TERMS_LABELS[invoice.terms]}: ${money(invoice.outstandingCents, invoice)} is due by ${formatDate(invoice.dueDate)}.`
}

/** The order has left the studio: carrier, tracking number, and the packing slip attached. */
export function shippedEmail(
  p: Common & {
    orderNumber: string
    poNumber: string | null
    carrier: string
    trackingNumber: string
    shipDate: string
    cartons: number
  },
): Email {
  return renderEmail({
    subject: `Order ${p.orderNumber} has shipped: ${p.carrier} ${p.trackingNumber}`,
    studioName: p.studioName,
    greeting: `Hello ${p.name},`,
    blocks: [
      {
        kind: 'p',
        text: `Order ${p.orderNumber}${po(p.poNumber)} left the studio on ${formatDate(p.shipDate)} in ${p.cartons} ${p.cartons === 1 ? 'carton' : 'cartons'}.`,
      },
      { kind: 'list', items: [`Carrier: ${p.carrier}`, `Tracking number: ${p.trackingNumber}`] },
      {
        kind: 'p',
        text: 'The packing slip is attached: it names the batch lot of every bar, should you ever need to trace one.',
      },
      { kind: 'button', text: 'See the order', href: p.link },
    ],
  })
}

export function invoiceEmail(p: Common & { invoice: InvoiceDto; again: boolean }): Email {
  const { invoice } = p
  return renderEmail({
    subject: `Invoice ${invoice.number} from ${p.studioName}${p.again ? ' (copy)' : ''}`,
    studioName: p.studioName,
    greeting: `Hello ${p.name},`,
    blocks: [
      {
        kind: 'p',
        text: `${p.again ? 'As asked, here is a copy of' : 'Attached is'} invoice ${invoice.number}, dated ${formatDate(invoice.issueDate)}, for order ${invoice.orderNumber}${po(invoice.poNumber)}.`,
      },
      amounts(invoice),
      { kind: 'p', text: dueLine(invoice) },
      { kind: 'button', text: 'Your invoices', href: p.link },
      { kind: 'small', text: 'Please quote the invoice number with your payment.' },
    ],
  })
}

export function creditNoteEmail(p: Common & { invoice: InvoiceDto }): Email {
  const { invoice } = p
  const credited = invoice.creditsInvoice?.number ?? 'the invoice'
  return renderEmail({
    subject: `Credit note ${invoice.number} for invoice ${credited}`,
    studioName: p.studioName,
    greeting: `Hello ${p.name},`,
    blocks: [
      {
        kind: 'p',
        text: `Invoice ${credited} for order ${invoice.orderNumber} is cancelled. Attached is credit note ${invoice.number} for its full amount, ${money(invoice.totalCents, invoice)}: nothing is owed on that invoice any more.`,
      },
      { kind: 'button', text: 'Your invoices', href: p.link },
    ],
  })
}

export function reminderEmail(p: Common & { invoice: InvoiceDto; daysLate: number }): Email {
  const { invoice } = p
  const late = p.daysLate > 0
  return renderEmail({
    subject: late
      ? `Reminder: invoice ${invoice.number} is ${p.daysLate} ${p.daysLate === 1 ? 'day' : 'days'} overdue`
      : `Reminder: invoice ${invoice.number} is due ${formatDate(invoice.dueDate)}`,
    studioName: p.studioName,
    greeting: `Hello ${p.name},`,
    blocks: [
      {
        kind: 'p',
        text: late
          ? `Our records show ${money(invoice.outstandingCents, invoice)} still open on invoice ${invoice.number} (order ${invoice.orderNumber}${po(invoice.poNumber)}), which was due on ${formatDate(invoice.dueDate)}.`
          : `A friendly note that ${money(invoice.outstandingCents, invoice)} on invoice ${invoice.number} (order ${invoice.orderNumber}${po(invoice.poNumber)}) is due on ${formatDate(invoice.dueDate)}.`,
      },
      amounts(invoice),
      {
        kind: 'p',
        text: 'The invoice is attached. If the payment is already on its way, thank you, and please ignore this note.',
      },
      { kind: 'button', text: 'Your invoices', href: p.link },
    ],
  })
}
