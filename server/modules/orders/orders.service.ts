import { createHash } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { planAllocation } from '@shared/domain/allocation/allocation'
import type { Allocation } from '@shared/domain/allocation/allocation'
import { compareIso, isoToday, yearOf } from '@shared/domain/dates/dates'
import { formatOrderNumber } from '@shared/domain/orders/order-number'
import { applyAction } from '@shared/domain/orders/order-status'
import type { OrderDto, PlaceOrder, StockShortfallDto } from '@shared/schemas/orders'
import { selectRows, sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { readyBatchesForUpdate } from '@server/modules/availability/availability.service'
import type { ReadyBatch } from '@server/modules/availability/availability.service'
import { recordStockMoves } from '@server/modules/batches/stock-moves.service'
import { invalidateCatalogue } from '@server/modules/catalogue/catalogue-cache'
import { sellableProducts } from '@server/modules/catalogue/catalogue.service'
import type { SellableProduct } from '@server/modules/catalogue/catalogue.service'
import type { OrderPricing } from '@shared/domain/orders/order-pricing'
import { sendOrderMail } from '@server/modules/orders/order-mail'
import { keptMail, LEASE_SECONDS, sendKept } from '@server/modules/mail/outbox'
import type { KeptMail, MailJob } from '@server/modules/mail/outbox'
import {
  hasOverdueInvoices,
  price,
  pricingSettings,
  requireMinimum,
  requireSellable,
} from '@server/modules/orders/order-pricing'
import { findOrder } from '@server/modules/orders/order-queries'
import { orderingShop, taxExemptOn } from '@server/modules/orders/order-shop'
import { promisePreorders } from '@server/modules/orders/preorders.service'
import { isUniqueViolation, retryingTransaction } from '@server/modules/orders/transactions'
import { raiseInvoiceForOrder } from '@server/modules/invoices/invoices.service'
import { getSettings } from '@server/modules/settings/settings.service'

/** The canonical form of a placing request: the same body always hashes the same. */
export function requestHash(input: PlaceOrder): string {
  const canonical = {
    lines: input.lines.map((l) => ({ productId: l.productId, cases: l.cases, preorder: l.preorder })),
    poNumber: input.poNumber ?? null,
    note: input.note ?? null,
    requestedShipDate: input.requestedShipDate ?? null,
  }
  return createHash('sha256').update(JSON.stringify(canonical)).digest('hex')
}

async function orderByKey(shopId: number, key: string, transaction?: Transaction) {
  const [row] = await selectRows<{ id: number; request_hash: string | null }>(
    'SELECT id, request_hash FROM orders WHERE shop_id = $1 AND idempotency_key = $2',
    [shopId, key],
    transaction,
  )
  return row ?? null
}

/** The order a key already made: the same body gets it again; a different body is refused. */
async function replay(found: { id: number; request_hash: string | null }, hash: string, shopId: number) {
  if (found.request_hash?.trim() !== hash) {
    throw AppError.unprocessable(
      'idempotency_key_reused',
      'This Idempotency-Key was already used for a different order. Send a new key for a new order.',
    )
  }
  const order = await findOrder(found.id, { role: 'buyer', shopId })
  if (!order) throw AppError.notFound('That order')
  return { order, created: false }
}

/** Bars ready per product in the locked batches (for the shortfall's readyBars). */
function readyBarsOf(batches: readonly ReadyBatch[]): Map<number, number> {
  const ready = new Map<number, number>()
  for (const b of batches) ready.set(b.productId, (ready.get(b.productId) ?? 0) + b.freeBars)
  return ready
}

export type PlanLine = { index: number; productId: number; bars: number; preorder: boolean }

/**
 * Ready lines get bars from the locked ready batches (oldest ready first), pre-order lines a
 * promise from curing stock after earlier pre-orders. All or nothing: any line that cannot be
 * covered makes a 409 insufficient_stock naming every product short.
 */
export async function planStock(
  lines: readonly PlanLine[],
  today: string,
  t: Transaction,
  exceptOrderId: number | null = null,
): Promise<{ allocations: Allocation[]; promises: Map<number, string> }> {
  const productIds = [...new Set(lines.map((l) => l.productId))]
  const batches = await readyBatchesForUpdate(productIds, t, today)
  const ready = lines.filter((l) => !l.preorder)
  const plan = planAllocation(
    ready.map((l) => ({ lineKey: l.index, productId: l.productId, bars: l.bars })),
    batches,
    today,
  )
  const readyBars = readyBarsOf(batches)
  const promised = await promisePreorders(
    lines.filter((l) => l.preorder).map((l) => ({ key: l.index, productId: l.productId, bars: l.bars })),
    today,
    { readyBars, transaction: t, lock: true, exceptOrderId },
  )
  const shortfall: StockShortfallDto[] = [...(plan.ok ? [] : plan.shortfall), ...promised.shortfall]
  if (shortfall.length > 0) {
    throw AppError.conflict(
      'insufficient_stock',
      shortfall.length === 1
        ? 'Ready stock cannot cover one of the lines. Lower its cases or pre-order it from curing stock.'
        : 'Ready stock cannot cover some of the lines. Lower their cases or pre-order them from curing stock.',
      shortfall,
    )
  }
  return { allocations: plan.ok ? plan.allocations : [], promises: promised.dates }
}

/**
 * One allocation row and one `reserved` move per planned allocation: the allocations in one
 * multi-row insert, the moves through recordStockMoves (their balance rows locked in batch id order).
 */
export async function reserve(
  allocations: readonly Allocation[],
  lineIdOf: (lineKey: number) => number,
  orderId: number,
  userId: number | null,
  t: Transaction,
): Promise<void> {
  if (allocations.length === 0) return
  const rows = allocations.map((a) => ({
    lineId: lineIdOf(Number(a.lineKey)),
    batchId: a.batchId,
    bars: a.bars,
  }))
  await sequelize.query(
    `INSERT INTO allocations (order_line_id, batch_id, bars)
     SELECT * FROM unnest($1::int[], $2::int[], $3::int[])`,
    {
      bind: [rows.map((r) => r.lineId), rows.map((r) => r.batchId), rows.map((r) => r.bars)],
      transaction: t,
    },
  )
  await recordStockMoves(
    rows.map((r) => ({
      batchId: r.batchId,
      kind: 'reserved',
      bars: r.bars,
      orderId,
      orderLineId: r.lineId,
      userId,
    })),
    t,
  )
}

export type NewLine = {
  productId: number
  sku: string
  name: string
  cases: number
  casePack: number
  bars: number
  unitPriceCents: number
  lineTotalCents: number
  preorder: boolean
  promisedDate: string | null
  sortOrder: number
}

/**
 * The row of the `i`th line sent: the product's SKU, name and case pack as sold today, the cases
 * and bars and the price break from the pricing, and a pre-order's promised date. Placing an order
 * and changing its lines build their rows here alike.
 */
export function newLine(
  l: { productId: number; preorder: boolean },
  i: number,
  products: ReadonlyMap<number, SellableProduct>,
  pricing: OrderPricing,
  promises: ReadonlyMap<number, string>,
): NewLine {
  const p = products.get(l.productId)!
  const priced = pricing.lines[i]!
  return {
    productId: l.productId,
    sku: p.sku,
    name: p.name,
    cases: priced.cases,
    casePack: p.casePack,
    bars: priced.bars,
    unitPriceCents: priced.unitPriceCents,
    lineTotalCents: priced.lineTotalCents,
    preorder: l.preorder,
    promisedDate: l.preorder ? promises.get(i)! : null,
    sortOrder: i,
  }
}

/** Inserts lines in one statement; returns their ids in the same order. */
export async function insertLines(
  orderId: number,
  lines: readonly NewLine[],
  t: Transaction,
): Promise<number[]> {
  if (lines.length === 0) return []
  const bind: unknown[] = [orderId]
  const values = lines.map((l) => {
    const start = bind.length
    bind.push(
      l.productId,
      l.sku,
      l.name,
      l.cases,
      l.casePack,
      l.bars,
      l.unitPriceCents,
      l.lineTotalCents,
      l.preorder,
      l.promisedDate,
      l.sortOrder,
    )
    return `($1, ${Array.from({ length: 11 }, (_, k) => `$${start + k + 1}`).join(', ')})`
  })
  const rows = await sequelize.query<{ id: number; sort_order: number }>(
    `INSERT INTO order_lines (order_id, product_id, sku, name, cases, case_pack, bars, unit_price_cents,
                              line_total_cents, preorder, promised_date, sort_order)
     VALUES ${values.join(', ')} RETURNING id, sort_order`,
    { bind, type: QueryTypes.SELECT, transaction: t },
  )
  const bySort = new Map(rows.map((r) => [r.sort_order, r.id]))
  return lines.map((l) => bySort.get(l.sortOrder)!)
}

type PlacedOrderRow = {
  year: number
  shopId: number
  userId: number
  poNumber: string | null
  note: string | null
  status: string
  requestedShipDate: string | null
  isOpeningOrder: boolean
  pricing: ReturnType<typeof price>
  taxExempt: boolean
  taxRatePct: number
  key: string
  hash: string
  autoConfirm: boolean
}

/**
 * The placed order in one statement, so the year's order counter (one row every order waits on)
 * is held for this statement and the commit alone: the next number, the order, its audit row (as
 * audit() writes it), its lines, their allocations, and one `reserved` ledger move per allocation
 * (the batch_stock trigger applies them). The allocations were planned from the balance rows this
 * transaction holds locked, so no move can overdraw; the CHECK on batch_stock stays the last guard.
 */
async function insertPlacedOrder(
  o: PlacedOrderRow,
  lines: readonly NewLine[],
  allocations: readonly Allocation[],
  t: Transaction,
  notify: boolean,
): Promise<{ orderId: number; mails: KeptMail[] }> {
  const col = <K extends keyof NewLine>(k: K) => lines.map((l) => l[k])
  const bind = [
    o.year,
    o.shopId,
    o.userId,
    o.poNumber,
    o.note,
    o.status,
    o.requestedShipDate,
    o.isOpeningOrder,
    o.pricing.subtotalCents,
    o.pricing.shippingCents,
    o.pricing.taxCents,
    o.pricing.totalCents,
    o.pricing.weightG,
    o.taxExempt,
    o.taxRatePct,
    o.key,
    o.hash,
    o.autoConfirm,
    // $19–$29: the lines, column by column
    col('productId'),
    col('sku'),
    col('name'),
    col('cases'),
    col('casePack'),
    col('bars'),
    col('unitPriceCents'),
    col('lineTotalCents'),
    col('preorder'),
    col('promisedDate'),
    col('sortOrder'),
    // $30–$32: the allocations, by the sort order of their line
    allocations.map((a) => lines[Number(a.lineKey)]!.sortOrder),
    allocations.map((a) => a.batchId),
    allocations.map((a) => a.bars),
    // $33–$34: the placed e-mail's outbox row (as keepMail writes it), none when not notifying
    notify ? JSON.stringify(PLACED_TEMPLATE) : null,
    LEASE_SECONDS,
  ]
  type Row = { id: number; number: string; seq: number; mail_id: string | null }
  let rows: Row[]
  try {
    rows = await sequelize.query<Row>(
      `WITH s AS (
         INSERT INTO order_sequences (year, last) VALUES ($1, 1)
         ON CONFLICT (year) DO UPDATE SET last = order_sequences.last + 1 RETURNING last
       ), o AS (
         INSERT INTO orders (number, year, seq, shop_id, placed_by, po_number, note, status, requested_ship_date,
                             is_opening_order, subtotal_cents, shipping_cents, tax_cents, total_cents, weight_g,
                             tax_exempt, tax_rate_pct, idempotency_key, request_hash, confirmed_at,
                             created_at, updated_at)
         SELECT 'O' || lpad(($1::int % 100)::text, 2, '0') || '-'
                    || lpad(s.last::text, greatest(5, length(s.last::text)), '0'),
                $1, s.last, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15, $16, $17,
                CASE WHEN $18::boolean THEN clock_timestamp() END, clock_timestamp(), clock_timestamp()
           FROM s
         RETURNING id, number, seq
       ), a AS (
         INSERT INTO audit_events (user_id, action, entity, entity_id, data)
         SELECT $3, 'order.placed', 'order', o.id,
                jsonb_build_object('number', o.number, 'totalCents', $12::int, 'autoConfirmed', $18::boolean)
           FROM o
       ), l AS (
         INSERT INTO order_lines (order_id, product_id, sku, name, cases, case_pack, bars, unit_price_cents,
                                  line_total_cents, preorder, promised_date, sort_order)
         SELECT o.id, v.*
           FROM o, unnest($19::int[], $20::text[], $21::text[], $22::int[], $23::int[], $24::int[], $25::int[],
                          $26::int[], $27::boolean[], $28::date[], $29::int[]) AS v
         RETURNING id, sort_order
       ), al AS (
         INSERT INTO allocations (order_line_id, batch_id, bars)
         SELECT l.id, x.batch_id, x.bars
           FROM unnest($30::int[], $31::int[], $32::int[]) WITH ORDINALITY AS x(sort_order, batch_id, bars, n)
           JOIN l ON l.sort_order = x.sort_order
          ORDER BY x.n
         RETURNING order_line_id, batch_id, bars
       ), m AS (
         INSERT INTO stock_moves (batch_id, kind, bars, free_delta, reserved_delta, order_id, order_line_id, user_id)
         SELECT al.batch_id, 'reserved', al.bars, -al.bars, al.bars, o.id, al.order_line_id, $3 FROM al, o
       ), mo AS (
         INSERT INTO mail_outbox (job, label, next_attempt_at)
         SELECT jsonb_set($33::jsonb, '{mail,orderId}', to_jsonb(o.id)), 'order ' || o.id || ' placed',
                now() + make_interval(secs => $34)
           FROM o WHERE $33::jsonb IS NOT NULL
         RETURNING id
       )
       SELECT id, number, seq, (SELECT id FROM mo) AS mail_id FROM o`,
      { bind, type: QueryTypes.SELECT, transaction: t },
    )
  } catch (err) {
    // 23514: the CHECK on batch_stock (free >= 0, reserved >= 0) refused what the locks should have.
    if ((err as { parent?: { code?: string } }).parent?.code === '23514') {
      const message = 'That would take a batch below zero bars.'
      throw AppError.conflict('stock_negative', message, [{ field: 'bars', message }])
    }
    throw err
  }
  if (allocations.length > 0) invalidateCatalogue(t)
  const row = rows[0]!
  // The number as the domain formats it; a difference would be a bug here, and writes nothing.
  if (row.number !== formatOrderNumber(o.year, row.seq)) {
    throw new Error(`order number ${row.number} does not read as sequence ${row.seq} of ${o.year}`)
  }
  const job: MailJob = { kind: 'order', mail: { kind: 'placed', orderId: row.id } }
  return { orderId: row.id, mails: row.mail_id ? [keptMail(Number(row.mail_id), job)] : [] }
}

// The placed e-mail's job with its order id still to fill (insertPlacedOrder sets it in SQL).
const PLACED_TEMPLATE: MailJob = { kind: 'order', mail: { kind: 'placed', orderId: 0 } }

/** Pricing lines for priceOrder from the products a shop may order. */
export function pricingLines(
  lines: readonly { productId: number; cases: number }[],
  products: ReadonlyMap<number, SellableProduct>,
) {
  return lines.map((l) => {
    const p = products.get(l.productId)!
    return {
      productId: l.productId,
      cases: l.cases,
      casePack: p.casePack,
      netWeightG: p.netWeightG,
      breaks: p.priceBreaks,
    }
  })
}

/**
 * Places a shop's case order against cured stock, in one transaction: the shop's row is locked and
 * everything that needs no stock lock is read and checked first (the key, the shop's standing, the
 * products and their price breaks, the pricing and minimum, overdue invoices; the opening order is
 * marked done and the ordered cart lines cleared), so that the ordered products' ready batches
 * (oldest ready first) and curing batches are locked as late as possible. Under those locks: the
 * plan, the order numbered and written with its audit row, its lines with frozen prices, its
 * allocations and `reserved` ledger moves in one insert each, and at auto-confirm a prepay
 * account's invoice. The same Idempotency-Key with the same body answers the same order
 * (created: false), even when both requests arrive at once: the unique index lets one in and the
 * other reads what it made. The e-mails are sent after the commit, without holding up the answer.
 */
export async function placeOrder(args: {
  shopId: number
  userId: number
  idempotencyKey: string
  input: PlaceOrder
  /** false: no e-mails (demo data, imports); the default tells the buyer and the studio. */
  notify?: boolean
}): Promise<{ order: OrderDto; created: boolean }> {
  const { shopId, userId, idempotencyKey: key, input } = args
  const hash = requestHash(input)
  const earlier = await orderByKey(shopId, key)
  if (earlier) return replay(earlier, hash, shopId)
  const settings = await getSettings()
  const productIds = input.lines.map((l) => l.productId)

  let outcome:
    { orderId: number; mails: KeptMail[] } | { replayOf: { id: number; request_hash: string | null } }
  try {
    outcome = await retryingTransaction(async (t) => {
      const shop = await orderingShop(shopId, t, true)
      // Under the shop's lock: a request with this key that committed meanwhile is answered, not repeated.
      const again = await orderByKey(shopId, key, t)
      if (again) return { replayOf: again }
      if (shop.status !== 'active') {
        throw AppError.unprocessable(
          'account_on_hold',
          'Your account cannot place orders at the moment. Please contact the studio.',
        )
      }
      const today = isoToday(new Date(), settings.timeZone)
      if (input.requestedShipDate && compareIso(input.requestedShipDate, today) < 0) {
        throw AppError.field('requestedShipDate', 'Choose today or a later date.')
      }
      const products = shop.tierId
        ? await sellableProducts({ tierId: shop.tierId }, productIds, t)
        : new Map<number, SellableProduct>()
      requireSellable(input.lines, products)

      const isOpeningOrder = !shop.openingOrderDone
      const taxExempt = taxExemptOn(shop, today)
      const pricing = price({
        lines: pricingLines(input.lines, products),
        isOpeningOrder,
        ...pricingSettings(settings),
        taxExempt,
      })
      requireMinimum(pricing, isOpeningOrder, settings.currency)
      const autoConfirm = settings.autoConfirmGoodStanding && !(await hasOverdueInvoices(shopId, today, t))

      // Writes that take no stock lock (the shop's row is ours already); a 409 below rolls them back.
      if (isOpeningOrder) {
        await sequelize.query(
          'UPDATE shops SET opening_order_done = true, updated_at = now() WHERE id = $1',
          {
            bind: [shopId],
            transaction: t,
          },
        )
      }
      await sequelize.query('DELETE FROM cart_lines WHERE shop_id = $1 AND product_id = ANY($2::int[])', {
        bind: [shopId, productIds],
        transaction: t,
      })

      // From here the stock rows are locked until the commit: only the plan and the inserts.
      const { allocations, promises } = await planStock(
        input.lines.map((l, i) => ({
          index: i,
          productId: l.productId,
          bars: pricing.lines[i]!.bars,
          preorder: l.preorder,
        })),
        today,
        t,
      )

      const year = yearOf(today)
      formatOrderNumber(year, 1) // refuses a year outside the numbering before anything is written
      const lines = input.lines.map((l, i) => newLine(l, i, products, pricing, promises))
      const { orderId, mails } = await insertPlacedOrder(
        {
          year,
          shopId,
          userId,
          poNumber: input.poNumber ?? null,
          note: input.note ?? null,
          status: autoConfirm ? applyAction('placed', 'confirm', 'owner') : 'placed',
          requestedShipDate: input.requestedShipDate ?? null,
          isOpeningOrder,
          pricing,
          taxExempt,
          taxRatePct: settings.taxRatePct,
          key,
          hash,
          autoConfirm,
        },
        lines,
        allocations,
        t,
        args.notify !== false,
      )
      // Confirmed at once: a prepay account's invoice is raised with it (other terms invoice at shipping).
      if (autoConfirm && shop.paymentTerms === 'prepay') {
        await raiseInvoiceForOrder(orderId, t, { userId, notify: args.notify })
      }
      // One e-mail to the buyer either way: an order confirmed as it is placed says so in its
      // placed e-mail (templates/email/orders.ts), rather than a second message the same second.
      return { orderId, mails }
    })
  } catch (err) {
    if (isUniqueViolation(err, 'orders_idempotency_key')) {
      const made = await orderByKey(shopId, key)
      if (made) return replay(made, hash, shopId)
    }
    throw err
  }
  if ('replayOf' in outcome) return replay(outcome.replayOf, hash, shopId)
  const order = await findOrder(outcome.orderId, { role: 'buyer', shopId })
  // Kept in the outbox by the transaction; sent after the commit and after the answer is read, so
  // the buyer never waits for them. The placed e-mail shows the order just read (the buyer's view
  // carries every price the studio's does).
  sendKept(outcome.mails, (k) =>
    k.job.kind === 'order' && k.job.mail.kind === 'placed' && order
      ? () => sendOrderMail({ kind: 'placed', orderId: order.id, order })
      : undefined,
  )
  return { order: order!, created: true }
}
