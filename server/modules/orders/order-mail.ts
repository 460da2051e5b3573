import {
  orderCancelledEmail,
  orderConfirmedEmail,
  orderPlacedEmail,
  orderPlacedStudioEmail,
  preorderAllocatedEmail,
} from '@templates/email/orders'
import type { Email } from '@templates/email/layout'
import { env } from '@server/config/env'
import { selectRows } from '@server/db/sequelize'
import { sendMail } from '@server/lib/mailer'
import type { OrderDto } from '@shared/schemas/orders'
import { findOrder } from '@server/modules/orders/order-queries'
import { getSettings } from '@server/modules/settings/settings.service'

// Order e-mails go out after the transaction that changed the order has committed, so nobody is
// told about an order that was rolled back. A mail that fails is logged by the mailer, never thrown.

type Recipient = { email: string; name: string }

const buyerLink = (id: number) => `${env.APP_URL}/shop/orders/${id}`
const studioLink = (id: number) => `${env.APP_URL}/studio/orders/${id}`

/**
 * In one query: the buyer who placed the order (while active), else the shop's contact; and, when
 * asked, the studio's active owners.
 */
async function recipientsOf(
  orderId: number,
  withOwners: boolean,
): Promise<{ buyer: Recipient | null; owners: Recipient[] }> {
  const rows = await selectRows<Recipient & { who: 'buyer' | 'owner' }>(
    `SELECT 'buyer' AS who,
            CASE WHEN u.id IS NULL THEN s.contact_email ELSE u.email END AS email,
            CASE WHEN u.id IS NULL THEN s.contact_name ELSE u.name END AS name, 0 AS sort
       FROM orders o JOIN shops s ON s.id = o.shop_id
       LEFT JOIN users u ON u.id = o.placed_by AND u.active
      WHERE o.id = $1
     UNION ALL
     SELECT 'owner', email, name, id FROM users WHERE $2 AND role = 'owner' AND active
     ORDER BY sort`,
    [orderId, withOwners],
  )
  const one = (r: Recipient) => ({ email: r.email, name: r.name })
  const buyer = rows.find((r) => r.who === 'buyer')
  return { buyer: buyer ? one(buyer) : null, owners: rows.filter((r) => r.who === 'owner').map(one) }
}

async function context(orderId: number, known?: OrderDto) {
  const order = known ?? (await findOrder(orderId, { role: 'owner', shopId: null }))
  const settings = await getSettings()
  return order ? { order, studioName: settings.studio.name, currency: settings.currency } : null
}

async function send(to: Recipient | null, mail: Email) {
  if (to) await sendMail({ to: to.email, ...mail })
}

export type OrderMail =
  // `order`: the order as read after its commit, when the caller has it already (placing does).
  | { kind: 'placed'; orderId: number; order?: OrderDto }
  | { kind: 'confirmed'; orderId: number }
  | { kind: 'cancelled'; orderId: number; byStudio: boolean }
  | { kind: 'preorder_allocated'; orderId: number; lineIds: number[] }

/** Sends one order e-mail (with the order as it now stands) to the people it concerns. */
export async function sendOrderMail(mail: OrderMail): Promise<void> {
  const ctx = await context(mail.orderId, mail.kind === 'placed' ? mail.order : undefined)
  if (!ctx) return
  const { order, studioName, currency } = ctx
  const people = await recipientsOf(order.id, mail.kind === 'placed' || mail.kind === 'cancelled')
  const buyer = people.buyer
  const forBuyer = (to: Recipient | null) =>
    to ? { studioName, currency, order, name: to.name, link: buyerLink(order.id) } : null
  const forStudio = (to: Recipient) => ({
    studioName,
    currency,
    order,
    name: to.name,
    link: studioLink(order.id),
  })
  const b = forBuyer(buyer)
  switch (mail.kind) {
    case 'placed': {
      const jobs: Promise<void>[] = b ? [send(buyer, orderPlacedEmail(b))] : []
      for (const owner of people.owners) jobs.push(send(owner, orderPlacedStudioEmail(forStudio(owner))))
      await Promise.all(jobs)
      return
    }
    case 'confirmed':
      if (b) await send(buyer, orderConfirmedEmail(b))
      return
    case 'cancelled': {
      const jobs: Promise<void>[] = b
        ? [send(buyer, orderCancelledEmail({ ...b, byStudio: mail.byStudio }))]
        : []
      // When the shop cancels, the studio hears of it too.
      if (!mail.byStudio) {
        for (const owner of people.owners) {
          jobs.push(send(owner, orderCancelledEmail({ ...forStudio(owner), byStudio: false })))
        }
      }
      await Promise.all(jobs)
      return
    }
    case 'preorder_allocated':
      if (b) await send(buyer, preorderAllocatedEmail({ ...b, lineIds: new Set(mail.lineIds) }))
      return
  }
}
