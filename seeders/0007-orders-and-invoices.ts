import type { Migration } from '@server/db/migrator'
import { addDays } from '@shared/domain/dates/dates'
import { DEMO_SHOPS, DEMO_STAFF } from './demo/scenario'

/**
 * The demo studio's autumn of wholesale orders, in every state, dated back from the day the seed
 * runs: shipped and invoiced ones (paid, part paid, one overdue on net 30, a prepay one paid
 * before it left), one packed and waiting for the carrier, one on the bench (claimed by the demo
 * packer), one confirmed, one just placed, and one cancelled.
 *
 * The bars come from five earlier pours of this seeder (on racks D and E, 70–73 days back), sized
 * to exactly what these orders take, so the ready stock of the batches seeder (0005) is left as it
 * was for the other demo stories. A supply those pours would mostly use up (shea butter, the
 * essential oils…) is bought again a week before the pour, so the studio keeps enough for its
 * next pours. Everything goes through the real services: pours through the batches service,
 * orders through placement, confirmation and cancellation, then claiming, packing, shipping (which
 * raises the invoices with their gapless numbers) and payments. The services stamp their rows with
 * the time they run; the dates of the story are then moved back with plain SQL.
 */

type Line = { sku: string; cases: number }
type Step = 'placed' | 'confirmed' | 'packing' | 'packed' | 'shipped'
type DemoOrder = {
  shop: 0 | 1 | 2
  po: string
  lines: Line[]
  /** Days before the seed runs that each step happened. */
  placed: number
  confirmed?: number
  packing?: number
  packed?: number
  shipped?: number
  carrier?: { name: string; tracking: string; cartons: number; weightG: number }
  cancelled?: { daysAgo: number; reason: string }
  payments?: {
    daysAgo: number
    cents: number | 'all'
    method: 'bank_transfer' | 'cheque' | 'card'
    reference?: string
  }[]
  note?: string
}

// In the order they happened, so order and invoice numbers follow the calendar.
// Shops: 0 Juniper & Vine (Preferred, net 30), 1 Harbor Lane General (Standard, prepay),
// 2 The Quiet Kettle (Distributor, net 15).
const ORDERS: DemoOrder[] = [
  {
    // Net 30, issued 44 days ago and still unpaid: overdue.
    shop: 0,
    po: 'JV-24117',
    lines: [
      { sku: 'CHR', cases: 2 },
      { sku: 'LAV', cases: 1 },
    ],
    placed: 45,
    confirmed: 45,
    packing: 44,
    packed: 44,
    shipped: 44,
    carrier: { name: 'UPS', tracking: '1Z4F83E20355129748', cartons: 2, weightG: 5200 },
  },
  {
    shop: 0,
    po: 'JV-24188',
    lines: [
      { sku: 'LAV', cases: 2 },
      { sku: 'CDR', cases: 1 },
    ],
    placed: 43,
    confirmed: 42,
    packing: 42,
    packed: 41,
    shipped: 41,
    carrier: { name: 'UPS', tracking: '1Z4F83E20355188302', cartons: 2, weightG: 5300 },
    payments: [{ daysAgo: 12, cents: 'all', method: 'bank_transfer', reference: 'ACH JV 1021' }],
  },
  {
    shop: 2,
    po: 'QK-PO-5521',
    lines: [
      { sku: 'HNY', cases: 2 },
      { sku: 'ORP', cases: 2 },
    ],
    placed: 36,
    confirmed: 35,
    packing: 35,
    packed: 34,
    shipped: 34,
    carrier: { name: 'FedEx', tracking: '7712 4409 8831', cartons: 3, weightG: 7050 },
    payments: [{ daysAgo: 21, cents: 'all', method: 'cheque', reference: 'Cheque 20417' }],
  },
  {
    // Prepay: invoiced at confirmation, paid by card before it shipped.
    shop: 1,
    po: 'HL-1107',
    lines: [
      { sku: 'ORP', cases: 1 },
      { sku: 'CHR', cases: 2 },
    ],
    placed: 20,
    confirmed: 19,
    payments: [{ daysAgo: 18, cents: 'all', method: 'card', reference: 'Card ending 4412' }],
    packing: 17,
    packed: 17,
    shipped: 16,
    carrier: { name: 'USPS', tracking: '9400 1118 9922 3344 5566 77', cartons: 2, weightG: 5150 },
  },
  {
    // Net 15, shipped 10 days ago, part paid.
    shop: 2,
    po: 'QK-PO-5604',
    lines: [
      { sku: 'LAV', cases: 2 },
      { sku: 'CDR', cases: 2 },
    ],
    placed: 14,
    confirmed: 13,
    packing: 11,
    packed: 11,
    shipped: 10,
    carrier: { name: 'FedEx', tracking: '7712 4410 2267', cartons: 3, weightG: 6900 },
    payments: [{ daysAgo: 3, cents: 10000, method: 'bank_transfer', reference: 'Wire QK 1188' }],
  },
  {
    shop: 2,
    po: 'QK-PO-5630',
    lines: [
      { sku: 'LAV', cases: 2 },
      { sku: 'ORP', cases: 2 },
    ],
    placed: 9,
    cancelled: { daysAgo: 8, reason: 'The shop asked to wait until their renovation is done.' },
  },
  {
    shop: 0,
    po: 'JV-24260',
    lines: [
      { sku: 'HNY', cases: 1 },
      { sku: 'CHR', cases: 1 },
      { sku: 'LAV', cases: 1 },
    ],
    placed: 4,
    confirmed: 3,
    packing: 2,
    packed: 1,
    note: 'Please pack the honey bars on top.',
  },
  {
    shop: 2,
    po: 'QK-PO-5642',
    lines: [
      { sku: 'CDR', cases: 2 },
      { sku: 'ORP', cases: 2 },
    ],
    placed: 3,
    confirmed: 2,
    packing: 0,
  },
  {
    // Prepay, confirmed today: its invoice waits for the payment.
    shop: 1,
    po: 'HL-1125',
    lines: [
      { sku: 'LAV', cases: 1 },
      { sku: 'CDR', cases: 1 },
      { sku: 'HNY', cases: 1 },
    ],
    placed: 1,
    confirmed: 0,
  },
  {
    shop: 0,
    po: 'JV-24301',
    lines: [
      { sku: 'ORP', cases: 1 },
      { sku: 'CHR', cases: 1 },
      { sku: 'CDR', cases: 1 },
    ],
    placed: 0,
  },
]

// The earlier pours these orders draw from, each ready by the first order that needs it and
// before the batches seeder's pour of the same product (allocation takes the oldest ready batch
// first). Honey oat cures 35 days, the others 28.
const POURS: { sku: string; daysAgo: number; location: string }[] = [
  { sku: 'LAV', daysAgo: 73, location: 'Rack D, shelf 1' },
  { sku: 'CHR', daysAgo: 73, location: 'Rack D, shelf 2' },
  { sku: 'CDR', daysAgo: 72, location: 'Rack D, shelf 3' },
  { sku: 'HNY', daysAgo: 72, location: 'Rack E, shelf 1' },
  { sku: 'ORP', daysAgo: 70, location: 'Rack E, shelf 2' },
]

const ago = (today: string, days: number) => addDays(today, -days)

export const up: Migration = async ({ context: { sequelize } }) => {
  // The services read the app's database settings at import (see 0005): hand them this
  // connection's address when the process has none.
  const cfg = sequelize.config
  const hadUrl = process.env.DATABASE_URL !== undefined
  if (!hadUrl) {
    process.env.DATABASE_URL = `postgres://${encodeURIComponent(cfg.username)}:${encodeURIComponent(String(cfg.password ?? ''))}@${cfg.host}:${cfg.port}/${cfg.database}`
  }
  const { sequelize: app } = await import('@server/db/sequelize')
  const { studioToday } = await import('@server/modules/availability/availability.service')
  const { recordBatch, suggestLots } = await import('@server/modules/batches/batches.service')
  const { placeOrder } = await import('@server/modules/orders/orders.service')
  const { confirmOrder, cancelOrder } = await import('@server/modules/orders/order-changes.service')
  const { claimOrder, markPacked } = await import('@server/modules/packing/packing.service')
  const { packingLines } = await import('@server/modules/packing/packing-queries')
  const { shipOrder } = await import('@server/modules/shipments/shipments.service')
  const { raiseInvoiceForOrder } = await import('@server/modules/invoices/invoices.service')
  const { recordPayment } = await import('@server/modules/payments/payments.service')
  const { PlaceOrderSchema } = await import('@shared/schemas/orders')
  const { RecordBatchSchema } = await import('@shared/schemas/batches')
  if (!hadUrl) delete process.env.DATABASE_URL

  const q = async <T>(sql: string, bind: unknown[] = []) => (await app.query(sql, { bind }))[0] as T[]
  const today = await studioToday()
  const [owner] = await q<{ id: number; name: string }>('SELECT id, name FROM users WHERE email = $1', [
    DEMO_STAFF[0]!.email,
  ])
  const [packer] = await q<{ id: number; name: string }>('SELECT id, name FROM users WHERE email = $1', [
    DEMO_STAFF[1]!.email,
  ])
  if (!owner || !packer) throw new Error('Seeding orders: the demo owner and packer (0001) are missing.')
  const shops = await Promise.all(
    DEMO_SHOPS.map(async (s) => {
      const [row] = await q<{ shop_id: number; buyer_id: number }>(
        `SELECT s.id AS shop_id, u.id AS buyer_id FROM shops s JOIN users u ON u.shop_id = s.id
          WHERE s.trading_name = $1 AND u.email = $2`,
        [s.tradingName, s.buyer.email],
      )
      if (!row) throw new Error(`Seeding orders: no shop ${s.tradingName} with buyer ${s.buyer.email}.`)
      return row
    }),
  )
  const products = new Map(
    (await q<{ id: number; sku: string; case_pack: number }>('SELECT id, sku, case_pack FROM products')).map(
      (p) => [p.sku, p],
    ),
  )
  const product = (sku: string) => {
    const p = products.get(sku)
    if (!p) throw new Error(`Seeding orders: no product with SKU ${sku} (seeded by 0004).`)
    return p
  }

  const stamp = (daysAgo: number) => `now() - make_interval(days => ${Math.max(0, Math.round(daysAgo))})`

  // ---- the pours, with the supplies they need -------------------------------------------------
  const barsOf = new Map<string, number>()
  for (const o of ORDERS) {
    if (o.cancelled) continue
    for (const l of o.lines) barsOf.set(l.sku, (barsOf.get(l.sku) ?? 0) + l.cases * product(l.sku).case_pack)
  }
  for (const pour of POURS) {
    const p = product(pour.sku)
    const sellable = barsOf.get(pour.sku) ?? 0
    const [recipe] = await q<{ mould_oil_weight_g: string; bars_per_mould: number }>(
      'SELECT r.mould_oil_weight_g, r.bars_per_mould FROM recipes r JOIN products p ON p.recipe_id = r.id WHERE p.id = $1',
      [p.id],
    )
    const pourDate = ago(today, pour.daysAgo)
    // Whole moulds; the end slices of each loaf and any seconds beyond the orders are kept back.
    const moulds = Math.ceil(sellable / (recipe!.bars_per_mould - 2))
    const barsCut = moulds * recipe!.bars_per_mould
    const plan = {
      productId: p.id,
      pourDate,
      oilWeightG: moulds * Number(recipe!.mould_oil_weight_g),
      barsCut,
      barsKeptBack: barsCut - sellable,
    }
    const suggestion = await suggestLots(plan)
    for (const line of suggestion.lines) {
      // A supply that had not arrived by the pour date, or that the pour would take more than half
      // of, is bought a week before the pour, as much as the pour takes, from the supplier of the
      // studio's first lot at its unit price: the studio keeps enough of everything for its next
      // pours.
      if (line.needed <= 0 || (line.shortBy <= 0 && line.needed <= line.available / 2)) continue
      const [first] = await q<{ supplier: string | null; cost_cents: number; quantity: string }>(
        'SELECT supplier, cost_cents, quantity FROM ingredient_lots WHERE ingredient_id = $1 ORDER BY received_on, id LIMIT 1',
        [line.ingredientId],
      )
      const quantity = line.unit === 'each' ? Math.ceil(line.needed) : Math.ceil(line.needed / 10) * 10
      const unitCost = first ? first.cost_cents / Number(first.quantity) : 0
      await q(
        `INSERT INTO ingredient_lots (ingredient_id, supplier, supplier_lot_code, received_on, entered_quantity, entered_unit,
                                      quantity, remaining, cost_cents, freight_cents, created_by)
         VALUES ($1, $2, $3, $4, $5, $6, $5, $5, $7, 0, $8)`,
        [
          line.ingredientId,
          first?.supplier ?? 'Studio supplies',
          `RE-${pour.sku}-${pourDate.replaceAll('-', '')}`,
          addDays(pourDate, -7),
          quantity,
          line.unit,
          Math.round(unitCost * quantity),
          owner.id,
        ],
      )
    }
    const batch = await recordBatch(
      RecordBatchSchema.parse({
        ...plan,
        keptBackReason: 'End slices of each loaf, and seconds for the studio shop',
        location: pour.location,
      }),
      owner.id,
    )
    await q(
      `UPDATE batches SET created_at = ${stamp(pour.daysAgo)}, updated_at = ${stamp(pour.daysAgo)} WHERE id = $1`,
      [batch.id],
    )
    await app.transaction(async (t) => {
      await app.query('ALTER TABLE stock_moves DISABLE TRIGGER stock_moves_no_update', { transaction: t })
      await app.query(
        `UPDATE stock_moves SET created_at = ${stamp(pour.daysAgo)} WHERE batch_id = $1 AND kind = 'made'`,
        {
          bind: [batch.id],
          transaction: t,
        },
      )
      await app.query('ALTER TABLE stock_moves ENABLE TRIGGER stock_moves_no_update', { transaction: t })
    })
  }

  // ---- the orders -------------------------------------------------------------------------
  const ownerActor = { role: 'owner' as const, shopId: null, userId: owner.id }
  const packerUser = { id: packer.id, role: 'packer' as const, name: packer.name }

  for (const [i, o] of ORDERS.entries()) {
    const shop = shops[o.shop]!
    const reach: Step =
      o.shipped !== undefined
        ? 'shipped'
        : o.packed !== undefined
          ? 'packed'
          : o.packing !== undefined
            ? 'packing'
            : o.confirmed !== undefined
              ? 'confirmed'
              : 'placed'
    const { order } = await placeOrder({
      shopId: shop.shop_id,
      userId: shop.buyer_id,
      idempotencyKey: `demo-order-${i + 1}`,
      notify: false,
      input: PlaceOrderSchema.parse({
        lines: o.lines.map((l) => ({ productId: product(l.sku).id, cases: l.cases })),
        poNumber: o.po,
        note: o.note,
      }),
    })
    await q(
      `UPDATE orders SET created_at = ${stamp(o.placed)}, updated_at = ${stamp(o.placed)} WHERE id = $1`,
      [order.id],
    )

    if (o.cancelled) {
      await cancelOrder(order.id, ownerActor, o.cancelled.reason, { notify: false })
      await q(
        `UPDATE orders SET cancelled_at = ${stamp(o.cancelled.daysAgo)}, updated_at = ${stamp(o.cancelled.daysAgo)} WHERE id = $1`,
        [order.id],
      )
      await backdateLedger(order.id, { reserved: o.placed, released: o.cancelled.daysAgo })
      continue
    }
    if (o.confirmed !== undefined && order.status === 'placed')
      await confirmOrder(order.id, ownerActor, { notify: false })
    if (o.confirmed !== undefined) {
      await q(`UPDATE orders SET confirmed_at = ${stamp(o.confirmed)} WHERE id = $1`, [order.id])
      // A prepay account is invoiced at confirmation (unless the confirmation already did it).
      if (DEMO_SHOPS[o.shop]!.paymentTerms === 'prepay') {
        const [existing] = await q<{ id: number }>(
          `SELECT id FROM invoices WHERE order_id = $1 AND kind = 'invoice'`,
          [order.id],
        )
        if (!existing) {
          const raised = await app.transaction((t) =>
            raiseInvoiceForOrder(order.id, t, {
              issueDate: ago(today, o.confirmed!),
              userId: owner.id,
              notify: false,
            }),
          )
          if (raised)
            await q(`UPDATE invoices SET created_at = ${stamp(o.confirmed)} WHERE id = $1`, [raised.id])
        }
      }
    }
    const recorded = new Set<number>()
    /** Records the order's payments that arrived at least `before` days ago (and not yet recorded). */
    const payments = async (before: number) => {
      for (const [k, p] of (o.payments ?? []).entries()) {
        if (p.daysAgo < before || recorded.has(k)) continue
        recorded.add(k)
        const [inv] = await q<{ id: number; total_cents: number; paid_cents: number }>(
          `SELECT id, total_cents, paid_cents FROM invoices WHERE order_id = $1 AND kind = 'invoice' AND voided_at IS NULL`,
          [order.id],
        )
        if (!inv) continue
        const { payment } = await recordPayment(
          inv.id,
          {
            method: p.method,
            amountCents: p.cents === 'all' ? inv.total_cents - inv.paid_cents : p.cents,
            receivedOn: ago(today, p.daysAgo),
            reference: p.reference ?? null,
          },
          owner.id,
        )
        await app.transaction(async (t) => {
          await app.query('ALTER TABLE payments DISABLE TRIGGER payments_no_update', { transaction: t })
          await app.query(`UPDATE payments SET created_at = ${stamp(p.daysAgo)} WHERE id = $1`, {
            bind: [payment.id],
            transaction: t,
          })
          await app.query('ALTER TABLE payments ENABLE TRIGGER payments_no_update', { transaction: t })
        })
      }
    }
    // A prepay payment arrives before packing starts.
    if (o.packing !== undefined) await payments(o.packing + 0.5)
    if (reach === 'packing' || reach === 'packed' || reach === 'shipped') {
      await claimOrder(order.id, { takeOver: false }, packerUser)
      await q(`UPDATE orders SET packing_started_at = ${stamp(o.packing!)} WHERE id = $1`, [order.id])
    }
    if (reach === 'packed' || reach === 'shipped') {
      const lines = await packingLines(order.id)
      await markPacked(
        order.id,
        {
          cartons: o.carrier?.cartons ?? 2,
          weightG: o.carrier?.weightG ?? 5000,
          lines: lines.map((l) => ({ orderLineId: l.orderLineId, bars: l.allocatedBars })),
        },
        packerUser,
      )
      await q(`UPDATE orders SET packed_at = ${stamp(o.packed!)} WHERE id = $1`, [order.id])
    }
    if (reach === 'shipped') {
      await shipOrder(
        order.id,
        { carrier: o.carrier!.name, trackingNumber: o.carrier!.tracking, shipDate: ago(today, o.shipped!) },
        packerUser,
        { notify: false },
      )
      await q(
        `UPDATE orders SET shipped_at = ${stamp(o.shipped!)}, updated_at = ${stamp(o.shipped!)} WHERE id = $1`,
        [order.id],
      )
      await q(`UPDATE shipments SET created_at = ${stamp(o.shipped!)} WHERE order_id = $1`, [order.id])
      await q(
        `UPDATE invoices SET created_at = ${stamp(o.shipped!)} WHERE order_id = $1 AND created_at > ${stamp(o.shipped!)}`,
        [order.id],
      )
      await payments(-1)
    }
    await backdateLedger(order.id, { reserved: o.placed, shipped: o.shipped })
  }

  // The ledger and the payments are append-only (triggers refuse UPDATE); for the demo's own
  // history their rows are moved back to the days the story says they happened, and the guard is
  // put back in the same transaction.
  async function backdateLedger(
    orderId: number,
    when: { reserved: number; released?: number; shipped?: number },
  ) {
    await app.transaction(async (t) => {
      const run = (sql: string) =>
        app.query(sql, { bind: sql.includes('$1') ? [orderId] : undefined, transaction: t })
      await run('ALTER TABLE stock_moves DISABLE TRIGGER stock_moves_no_update')
      await run(
        `UPDATE stock_moves SET created_at = ${stamp(when.reserved)} WHERE order_id = $1 AND kind = 'reserved'`,
      )
      if (when.released !== undefined) {
        await run(
          `UPDATE stock_moves SET created_at = ${stamp(when.released)} WHERE order_id = $1 AND kind = 'released'`,
        )
      }
      if (when.shipped !== undefined) {
        await run(
          `UPDATE stock_moves SET created_at = ${stamp(when.shipped)} WHERE order_id = $1 AND kind = 'shipped'`,
        )
      }
      await run(
        `UPDATE allocations SET created_at = ${stamp(when.reserved)} WHERE order_line_id IN (SELECT id FROM order_lines WHERE order_id = $1)`,
      )
      await run('ALTER TABLE stock_moves ENABLE TRIGGER stock_moves_no_update')
    })
  }
}

export const down: Migration = async () => {
  // Demo orders, invoices and payments are history: invoices are never deleted.
}
