/**
 * Orders in every state for the packing, shipping, invoicing and payment tests, made through the
 * real services: a product poured through the batches API (a ready batch), priced for every tier,
 * placed by the shop's buyer (placeOrder), confirmed by the owner, claimed, packed and shipped.
 * Names carry a random suffix; nothing global is assumed.
 */
import { randomUUID } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import { addDays } from '@shared/domain/dates/dates'
import type { OrderStatus } from '@shared/domain/orders/order-status'
import { PlaceOrderSchema } from '@shared/schemas/orders'
import { sequelize } from '@server/db/sequelize'
import { invalidateCatalogue } from '@server/modules/catalogue/catalogue-cache'
import { studioToday } from '@server/modules/availability/availability.service'
import { confirmOrder } from '@server/modules/orders/order-changes.service'
import { placeOrder } from '@server/modules/orders/orders.service'
import { claimOrder, markPacked } from '@server/modules/packing/packing.service'
import { packingLines } from '@server/modules/packing/packing-queries'
import { shipOrder } from '@server/modules/shipments/shipments.service'
import { DEMO_SHOPS } from '../../seeders/demo/scenario'
import type { ApiClient } from '@tests/factories/api-client'
import { makePourable } from '@tests/factories/production'

export type ShopKey = 'A' | 'B' | 'C'
const SHOP_INDEX: Record<ShopKey, number> = { A: 0, B: 1, C: 2 }

async function one<T extends object>(sql: string, bind: unknown[] = []): Promise<T> {
  const rows = await sequelize.query<T>(sql, { bind, type: QueryTypes.SELECT })
  if (!rows[0]) throw new Error(`no row for ${sql}`)
  return rows[0]
}

export async function staff(role: 'owner' | 'packer') {
  return one<{ id: number; name: string }>(
    `SELECT id, name FROM users WHERE role = $1 AND active ORDER BY id LIMIT 1`,
    [role],
  )
}

/** The demo shop (A: Juniper & Vine, net 30; B: Harbor Lane, prepay; C: The Quiet Kettle, net 15) and its buyer. */
export async function demoShop(key: ShopKey) {
  const s = DEMO_SHOPS[SHOP_INDEX[key]]!
  return one<{ shopId: number; buyerId: number; email: string; tradingName: string; terms: string }>(
    `SELECT s.id AS "shopId", u.id AS "buyerId", u.email, s.trading_name AS "tradingName", s.payment_terms AS terms
       FROM shops s JOIN users u ON u.shop_id = s.id AND u.email = $1`,
    [s.buyer.email],
  )
}

export type Sellable = {
  productId: number
  sku: string
  batchId: number
  lotCode: string
  unitPriceCents: number
}

/**
 * A product with one ready batch (poured 40 days ago, cured 28) of `bars` bars on shelf
 * `location`, priced at `unitPriceCents` a bar for every tier. Case pack 6.
 */
export async function makeSellable(
  owner: ApiClient,
  opts: { bars?: number; unitPriceCents?: number; location?: string } = {},
): Promise<Sellable> {
  const p = await makePourable()
  const today = await studioToday()
  const r = await owner.post('/api/batches', {
    productId: p.productId,
    pourDate: addDays(today, -40),
    barsCut: opts.bars ?? 120,
    barsKeptBack: 0,
    location: opts.location ?? 'Rack B, shelf 2',
  })
  if (r.status !== 201) throw new Error(`pour failed: ${r.status} ${JSON.stringify(r.body)}`)
  const unitPriceCents = opts.unitPriceCents ?? 3000
  await sequelize.query(
    `INSERT INTO price_breaks (tier_id, product_id, min_cases, unit_price_cents) SELECT id, $1, 1, $2 FROM price_tiers`,
    { bind: [p.productId, unitPriceCents] },
  )
  // Written past the services: the in-process catalogue cache must hear of it.
  invalidateCatalogue()
  return {
    productId: p.productId,
    sku: p.sku,
    batchId: r.body.batch.id,
    lotCode: r.body.batch.lotCode,
    unitPriceCents,
  }
}

/** Pours a second, later batch of the product (so an order can draw from two lots). */
export async function pourMore(
  owner: ApiClient,
  productId: number,
  bars: number,
  daysAgo = 35,
  location = 'Rack C, shelf 1',
) {
  const today = await studioToday()
  const r = await owner.post('/api/batches', {
    productId,
    pourDate: addDays(today, -daysAgo),
    barsCut: bars,
    barsKeptBack: 0,
    location,
  })
  if (r.status !== 201) throw new Error(`pour failed: ${r.status} ${JSON.stringify(r.body)}`)
  return { batchId: r.body.batch.id as number, lotCode: r.body.batch.lotCode as string }
}

export type MadeOrder = {
  orderId: number
  number: string
  shopId: number
  buyerEmail: string
  poNumber: string
}

const STEPS: OrderStatus[] = ['placed', 'confirmed', 'packing', 'packed', 'shipped']

/**
 * An order of the shop for these lines, taken through the real services to `status`.
 * Shipping uses `shipDate` (today by default); e-mails go out unless `notify` is false.
 */
export async function makeOrder(opts: {
  shop: ShopKey
  lines: { productId: number; cases: number }[]
  status: Exclude<OrderStatus, 'cancelled'>
  poNumber?: string
  /** Placed this many days ago (the row's date is moved back) and, when shipped, shipped that day. */
  daysAgo?: number
  shipDate?: string
  notify?: boolean
}): Promise<MadeOrder> {
  const shop = await demoShop(opts.shop)
  const poNumber = opts.poNumber ?? `PO-${randomUUID().slice(0, 8).toUpperCase()}`
  const { order } = await placeOrder({
    shopId: shop.shopId,
    userId: shop.buyerId,
    idempotencyKey: randomUUID(),
    input: PlaceOrderSchema.parse({ lines: opts.lines, poNumber }),
    // The order e-mails are the orders module's to test; these tests catch the shipping ones.
    notify: false,
  })
  const made = {
    orderId: order.id,
    number: order.number,
    shopId: shop.shopId,
    buyerEmail: shop.email,
    poNumber,
  }
  const today = await studioToday()
  if (opts.daysAgo) {
    await sequelize.query(
      `UPDATE orders SET created_at = created_at - make_interval(days => $2) WHERE id = $1`,
      {
        bind: [order.id, opts.daysAgo],
      },
    )
  }
  const reach = STEPS.indexOf(opts.status)
  const owner = await staff('owner')
  const packer = await staff('packer')
  const packerUser = { id: packer.id, role: 'packer' as const, name: packer.name }
  if (reach >= 1 && order.status === 'placed') {
    await confirmOrder(order.id, { role: 'owner', shopId: null, userId: owner.id }, { notify: false })
  }
  if (reach >= 2) await claimOrder(order.id, { takeOver: false }, packerUser)
  if (reach >= 3) {
    const lines = await packingLines(order.id)
    await markPacked(
      order.id,
      {
        cartons: 1,
        weightG: 2500,
        lines: lines.map((l) => ({ orderLineId: l.orderLineId, bars: l.allocatedBars })),
      },
      packerUser,
    )
  }
  if (reach >= 4) {
    await shipOrder(
      order.id,
      {
        carrier: 'UPS',
        trackingNumber: `1Z${randomUUID().slice(0, 10).toUpperCase()}`,
        shipDate: opts.shipDate ?? addDays(today, -(opts.daysAgo ?? 0)),
      },
      packerUser,
      { notify: opts.notify },
    )
  }
  return made
}

/** Row counts of the tables a refused request must leave alone, and the stock of some batches. */
export async function snapshot(batchIds: number[] = []) {
  const counts = await one<{
    invoices: number
    invoice_lines: number
    payments: number
    shipments: number
    stock_moves: number
    reminders: number
    last_seq: number
    paid: number
  }>(
    `SELECT (SELECT count(*) FROM invoices)::int AS invoices, (SELECT count(*) FROM invoice_lines)::int AS invoice_lines,
            (SELECT count(*) FROM payments)::int AS payments, (SELECT count(*) FROM shipments)::int AS shipments,
            (SELECT count(*) FROM stock_moves)::int AS stock_moves, (SELECT count(*) FROM invoice_reminders)::int AS reminders,
            (SELECT COALESCE(max(last), 0) FROM invoice_sequences)::int AS last_seq,
            (SELECT COALESCE(sum(paid_cents), 0) FROM invoices)::int AS paid`,
  )
  const stock = await sequelize.query<{ batch_id: number; free: number; reserved: number }>(
    'SELECT batch_id, free, reserved FROM batch_stock WHERE batch_id = ANY($1::int[]) ORDER BY batch_id',
    { bind: [batchIds], type: QueryTypes.SELECT },
  )
  return { counts, stock }
}

export async function orderStatus(orderId: number) {
  return (await one<{ status: OrderStatus }>('SELECT status FROM orders WHERE id = $1', [orderId])).status
}

/** Every key anywhere in a JSON value (to prove that no price or cost field reached a packer). */
export function allKeys(value: unknown, out = new Set<string>()): Set<string> {
  if (Array.isArray(value)) value.forEach((v) => allKeys(v, out))
  else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      out.add(k)
      allKeys(v, out)
    }
  }
  return out
}
