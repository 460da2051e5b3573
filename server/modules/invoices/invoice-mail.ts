import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { daysBetween } from '@shared/domain/dates/dates'
import type { InvoiceDto } from '@shared/schemas/invoices'
import { creditNoteEmail, invoiceEmail, reminderEmail } from '@templates/email/invoices'
import type { Email } from '@templates/email/layout'
import { env } from '@server/config/env'
import { sequelize } from '@server/db/sequelize'
import { renderPdf } from '@server/lib/pdf'
import { sendMail } from '@server/lib/mailer'
import { studioToday } from '@server/modules/availability/availability.service'
import { getSettings } from '@server/modules/settings/settings.service'
import { findInvoice } from '@server/modules/invoices/invoice-queries'
import { invoiceDocument } from '@templates/pdf/invoice'

export type Recipient = { email: string; name: string }

/** The buyer who placed the order (while active) and the shop's contact, each once. */
export async function orderRecipients(orderId: number, transaction?: Transaction): Promise<Recipient[]> {
  const [r] = await sequelize.query<{
    email: string | null
    name: string | null
    contact_email: string
    contact_name: string
  }>(
    `SELECT u.email, u.name, s.contact_email, s.contact_name
       FROM orders o JOIN shops s ON s.id = o.shop_id
       LEFT JOIN users u ON u.id = o.placed_by AND u.active AND u.role = 'buyer'
      WHERE o.id = $1`,
    { bind: [orderId], type: QueryTypes.SELECT, transaction },
  )
  if (!r) return []
  const out: Recipient[] = []
  if (r.email) out.push({ email: r.email, name: r.name ?? r.contact_name })
  if (!out.some((x) => x.email.toLowerCase() === r.contact_email.toLowerCase())) {
    out.push({ email: r.contact_email, name: r.contact_name })
  }
  return out
}

/** The invoice (or credit note) as a PDF, made through the one renderer. */
export async function renderInvoicePdf(invoice: InvoiceDto): Promise<Buffer> {
  const settings = await getSettings()
  return renderPdf(invoiceDocument({ studio: settings.studio, invoice }))
}

export const invoiceFilename = (invoice: Pick<InvoiceDto, 'number' | 'kind'>) =>
  `${invoice.kind === 'credit_note' ? 'credit-note' : 'invoice'}-${invoice.number}.pdf`

const buyerLink = () => `${env.APP_URL}/shop/invoices`

async function sendWithPdf(
  invoice: InvoiceDto,
  build: (to: Recipient, studioName: string) => Email,
): Promise<string[]> {
  const [pdf, settings, recipients] = await Promise.all([
    renderInvoicePdf(invoice),
    getSettings(),
    orderRecipients(invoice.orderId),
  ])
  const sent: string[] = []
  for (const to of recipients) {
    const ok = await sendMail({
      to: to.email,
      replyTo: settings.studio.email || undefined,
      ...build(to, settings.studio.name),
      attachments: [{ filename: invoiceFilename(invoice), content: pdf, contentType: 'application/pdf' }],
    })
    if (ok) sent.push(to.email)
  }
  return sent
}

async function load(invoiceId: number): Promise<InvoiceDto | null> {
  const [today, settings] = await Promise.all([studioToday(), getSettings()])
  return findInvoice(invoiceId, { role: 'owner', shopId: null }, today, settings.currency)
}

/** E-mails the invoice or credit note with its PDF; answers the addresses it went to. */
export async function sendInvoiceMail(
  invoiceId: number,
  reason: 'issued' | 'resent' | 'credit_note',
): Promise<string[]> {
  const invoice = await load(invoiceId)
  if (!invoice) return []
  return sendWithPdf(invoice, (to, studioName) =>
    invoice.kind === 'credit_note'
      ? creditNoteEmail({ name: to.name, studioName, invoice, link: buyerLink() })
      : invoiceEmail({ name: to.name, studioName, invoice, link: buyerLink(), again: reason === 'resent' }),
  )
}

/** An overdue (or still open) invoice's reminder, with the invoice PDF attached. */
export async function sendReminderMail(invoice: InvoiceDto, today: string): Promise<string[]> {
  const daysLate = daysBetween(invoice.dueDate, today)
  return sendWithPdf(invoice, (to, studioName) =>
    reminderEmail({ name: to.name, studioName, invoice, daysLate, link: buyerLink() }),
  )
}
