import { cardReceiptEmail, cardRefundEmail } from '@templates/email/card-payments'
import type { Email } from '@templates/email/layout'
import type { InvoiceDto } from '@shared/schemas/invoices'
import { env } from '@server/config/env'
import { sendMail } from '@server/lib/mailer'
import { orderRecipients } from '@server/modules/invoices/invoice-mail'
import { requireInvoice } from '@server/modules/invoices/invoices.service'
import { getSettings } from '@server/modules/settings/settings.service'

type Common = { name: string; studioName: string; invoice: InvoiceDto; link: string }

/** Mails the shop of an invoice (as it stands when the mail goes out). */
async function mailShop(invoiceId: number, build: (common: Common) => Email): Promise<void> {
  const invoice = await requireInvoice(invoiceId, { role: 'owner', shopId: null })
  const [settings, recipients] = await Promise.all([getSettings(), orderRecipients(invoice.orderId)])
  for (const to of recipients) {
    await sendMail({
      to: to.email,
      replyTo: settings.studio.email || undefined,
      ...build({
        name: to.name,
        studioName: settings.studio.name,
        invoice,
        link: `${env.APP_URL}/shop/invoices`,
      }),
    })
  }
}

/** The buyer's receipt for a card payment the service reported. */
export function sendCardReceipt(job: {
  invoiceId: number
  amountCents: number
  reference: string
  paidOn: string
}): Promise<void> {
  return mailShop(job.invoiceId, (common) =>
    cardReceiptEmail({
      ...common,
      amountCents: job.amountCents,
      paidOn: job.paidOn,
      reference: job.reference,
    }),
  )
}

/** The buyer hears that money went back to their card. */
export function sendCardRefundMail(job: {
  invoiceId: number
  amountCents: number
  reference: string
}): Promise<void> {
  return mailShop(job.invoiceId, (common) =>
    cardRefundEmail({ ...common, amountCents: job.amountCents, reference: job.reference }),
  )
}
