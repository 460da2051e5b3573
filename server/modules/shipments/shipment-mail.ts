import { shippedEmail } from '@templates/email/invoices'
import { env } from '@server/config/env'
import { sendMail } from '@server/lib/mailer'
import { orderRecipients } from '@server/modules/invoices/invoice-mail'
import { packingSlipFilename, renderPackingSlipPdf } from '@server/modules/packing/packing-documents'
import { packingOrder } from '@server/modules/packing/packing-queries'
import { getSettings } from '@server/modules/settings/settings.service'

/** After the commit: the buyer hears that the order left, with the tracking number and the packing slip. */
export async function sendShipmentMail(orderId: number): Promise<string[]> {
  const order = await packingOrder(orderId)
  if (!order?.shipment) return []
  const [settings, recipients, pdf] = await Promise.all([
    getSettings(),
    orderRecipients(orderId),
    renderPackingSlipPdf(order),
  ])
  const sent: string[] = []
  for (const to of recipients) {
    const ok = await sendMail({
      to: to.email,
      replyTo: settings.studio.email || undefined,
      ...shippedEmail({
        name: to.name,
        studioName: settings.studio.name,
        link: `${env.APP_URL}/shop/orders/${order.id}`,
        orderNumber: order.number,
        poNumber: order.poNumber,
        carrier: order.shipment.carrier,
        trackingNumber: order.shipment.trackingNumber,
        shipDate: order.shipment.shipDate,
        cartons: order.shipment.cartons,
      }),
      attachments: [{ filename: packingSlipFilename(order), content: pdf, contentType: 'application/pdf' }],
    })
    if (ok) sent.push(to.email)
  }
  return sent
}
