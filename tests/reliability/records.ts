/**
 * Real records of shop A (and the studio) to fill every path parameter of the route table, so
 * that each route is asked about something that exists and belongs to shop A.
 */
import { QueryTypes } from 'sequelize'
import { sequelize } from '@server/db/sequelize'
import { issueToken } from '@server/modules/auth/auth.service'
import type { ApiClient } from '@tests/factories/api-client'
import { apply, certificatePdf } from '@tests/factories/applications'
import { demoShop, makeOrder, makeSellable } from '@tests/factories/fulfilment'

/** A 1 × 1 PNG. */
export const PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8DwHwAFBQIAX8jx0gAAAABJRU5ErkJggg==',
  'base64',
)

async function first(sql: string, bind: unknown[] = []): Promise<number> {
  const [row] = await sequelize.query<{ id: number }>(sql, { bind, type: QueryTypes.SELECT })
  if (!row) throw new Error(`no record for ${sql}`)
  return row.id
}

export type Records = Record<string, string | number>

/** Text that only shop A's people (and the studio) may ever read: names, numbers, e-mails. */
export const markers: string[] = []

export async function shopARecords(owner: ApiClient): Promise<Records> {
  const a = await demoShop('A')
  const sellable = await makeSellable(owner, { bars: 240 })
  const confirmed = await makeOrder({
    shop: 'A',
    lines: [{ productId: sellable.productId, cases: 1 }],
    status: 'confirmed',
  })
  const shipped = await makeOrder({
    shop: 'A',
    lines: [{ productId: sellable.productId, cases: 1 }],
    status: 'shipped',
    notify: false,
  })
  const photo = await owner.agent
    .post(`/api/products/${sellable.productId}/photo`)
    .set('X-CSRF-Token', await owner.token())
    .attach('photo', PNG, { filename: 'bar.png', contentType: 'image/png' })
  if (photo.status !== 200) throw new Error(`photo upload: ${photo.status} ${JSON.stringify(photo.body)}`)
  // Shop B gets a certificate of its own, so its buyer's "mine" is a real file.
  const b = await demoShop('B')
  const cert = await apply(
    owner,
    { certificateExpiresOn: '2030-06-30' },
    { data: certificatePdf(), filename: 'harbor-lane.pdf' },
    { method: 'put', url: `/api/shops/${b.shopId}/certificate` },
  )
  if (cert.status !== 200) throw new Error(`certificate upload: ${cert.status} ${JSON.stringify(cert.body)}`)
  const buyerC = await demoShop('C')
  const text = async (sql: string, bind: unknown[]) =>
    (await sequelize.query<{ t: string }>(sql, { bind, type: QueryTypes.SELECT })).map((r) => r.t)
  markers.splice(
    0,
    markers.length,
    a.tradingName,
    confirmed.number,
    shipped.number,
    ...(await text(`SELECT number AS t FROM invoices WHERE shop_id = $1`, [a.shopId])),
    ...(await text(`SELECT email AS t FROM users WHERE shop_id = $1`, [a.shopId])),
  )
  const invoiceId = await first(`SELECT id FROM invoices WHERE order_id = $1 AND kind = 'invoice'`, [
    shipped.orderId,
  ])
  // A card checkout of that invoice and a card payment problem about it, as the card service's
  // webhook would have left them; a cheque against it, so a payment exists to ask a refund of.
  const sessionId = `cs_test_matrix_${Date.now()}`
  const checkoutId = await first(
    `INSERT INTO card_checkouts (invoice_id, session_id, amount_cents, currency) VALUES ($1, $2, 100, 'usd') RETURNING id`,
    [invoiceId, sessionId],
  )
  await sequelize.query(
    `INSERT INTO card_events (event_id, type, outcome) VALUES ($1, 'checkout.session.completed', 'problem')`,
    {
      bind: [`evt_matrix_${sessionId}`],
    },
  )
  const problemId = await first(
    `INSERT INTO card_payment_problems (invoice_id, checkout_id, event_id, session_id, expected_cents, expected_currency,
                                        received_cents, received_currency, message)
     VALUES ($1, $2, $3, $4, 100, 'usd', 90, 'usd', 'The amount paid is not the amount asked.') RETURNING id`,
    [invoiceId, checkoutId, `evt_matrix_${sessionId}`, sessionId],
  )
  const paid = await owner.post(`/api/invoices/${invoiceId}/payments`, {
    method: 'cheque',
    amountCents: 100,
    receivedOn: new Date().toISOString().slice(0, 10),
    reference: 'Cheque 1001',
  })
  if (paid.status !== 201) throw new Error(`payment: ${paid.status} ${JSON.stringify(paid.body)}`)
  const pour = await owner.post('/api/planning/pours', {
    productId: sellable.productId,
    pourDate: new Date(Date.now() + 7 * 86_400_000).toISOString().slice(0, 10),
    moulds: 1,
  })
  if (pour.status !== 201) throw new Error(`planned pour: ${pour.status} ${JSON.stringify(pour.body)}`)
  // Two e-mails about that invoice that the relay refused once: one to send again, one to dismiss.
  const unsentMail = (label: string) =>
    first(
      `INSERT INTO mail_outbox (job, label, attempts, last_error, next_attempt_at)
       VALUES (jsonb_build_object('kind', 'invoice', 'invoiceId', $1::int, 'reason', 'issued'), $2, 1,
               '421 relay busy', now() + interval '1 hour') RETURNING id`,
      [invoiceId, label],
    )
  const unsentToSend = await unsentMail('matrix: to send')
  const unsentToDismiss = await unsentMail('matrix: to dismiss')
  return {
    unsentToSend,
    unsentToDismiss,
    shopId: a.shopId,
    userId: a.buyerId,
    orderId: confirmed.orderId,
    invoiceId,
    sessionId,
    problemId,
    paymentId: await first(`SELECT id FROM payments WHERE invoice_id = $1 ORDER BY id DESC LIMIT 1`, [
      invoiceId,
    ]),
    pourId: pour.body.plannedPour.id as number,
    productId: sellable.productId,
    tierId: await first(`SELECT tier_id AS id FROM shops WHERE id = $1`, [a.shopId]),
    recipeId: await first(`SELECT recipe_id AS id FROM products WHERE id = $1`, [sellable.productId]),
    batchId: sellable.batchId,
    ingredientId: await first(`SELECT id FROM ingredients ORDER BY id LIMIT 1`),
    lotId: await first(`SELECT id FROM ingredient_lots ORDER BY id LIMIT 1`),
    token: await issueToken(buyerC.buyerId, 'reset'),
  }
}

/** Which record an `:id` means, by the path it sits in. */
export function fillPath(path: string, rec: Records): string {
  const idFor = (p: string) => {
    if (/^\/api\/(orders|packing\/orders)\//.test(p)) return rec.orderId
    if (p.startsWith('/api/invoices/')) return rec.invoiceId
    if (p.startsWith('/api/shops/')) return rec.shopId
    if (p.startsWith('/api/users/')) return rec.userId
    if (p.startsWith('/api/products/')) return rec.productId
    if (p.startsWith('/api/price-tiers/')) return rec.tierId
    if (p.startsWith('/api/recipes/')) return rec.recipeId
    if (p.startsWith('/api/batches/')) return rec.batchId
    if (p.startsWith('/api/ingredients/')) return rec.ingredientId
    if (p.startsWith('/api/purchases/')) return rec.lotId
    if (p.startsWith('/api/payments/')) return rec.paymentId
    if (p.startsWith('/api/planning/pours/')) return rec.pourId
    if (p.startsWith('/api/card-payments/problems/')) return rec.problemId
    if (p.startsWith('/api/unsent-mail/')) return p.endsWith('/send') ? rec.unsentToSend : rec.unsentToDismiss
    throw new Error(`no record for :id in ${p}`)
  }
  return path
    .replace(':id', () => String(idFor(path)))
    .replace(':orderId', String(rec.orderId))
    .replace(':productId', String(rec.productId))
    .replace(':tierId', String(rec.tierId))
    .replace(':lotId', String(rec.lotId))
    .replace(':token', String(rec.token))
    .replace(':ingredientId', String(rec.ingredientId))
    .replace(':sessionId', String(rec.sessionId))
}
