import { createHash } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { planAllocation } from '@shared/domain/allocation/allocation'
import type { Allocation } from '@shared/domain/allocation/allocation'
import { compareIso, yearOf } from '@shared/domain/dates/dates'
import { formatOrderNumber } from '@shared/domain/orders/order-number'
import { applyAction } from '@shared/domain/orders/order-status'
import type { OrderDto, PlaceOrder, StockShortfallDto } from '@shared/schemas/orders'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { readyBatchesForUpdate, studioToday } from '@server/modules/availability/availability.service'
import type { ReadyBatch } from '@server/modules/availability/availability.service'
import { recordStockMove } from '@server/modules/batches/stock-moves.service'
import { sellableProducts } from '@server/modules/catalogue/catalogue.service'
import type { SellableProduct } from '@server/modules/catalogue/catalogue.service'
import type { OrderPricing } from '@shared/domain/orders/order-pricing'
import { Order } from '@server/modules/orders/order.model'
import { sendOrderMailsLater } from '@server/modules/orders/order-mail'
import type { OrderMail } from '@server/modules/orders/order-mail'
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
import { isShopOrderable } from '@server/modules/shops/shops.service'

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
  const [row] = await sequelize.query<{ id: number; request_hash: string | null }>(
    'SELECT id, request_hash FROM orders WHERE shop_id = $1 AND idempotency_key = $2',
    { bind: [shopId, key], type: QueryTypes.SELECT, transaction },
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
  const batches = await readyBatchesForUpdate(productIds, t)
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

/** One `reserved` move and one allocation row per planned allocation. */
export async function reserve(
  allocations: readonly Allocation[],
  lineIdOf: (lineKey: number) => number,
  orderId: number,
  userId: number | null,
  t: Transaction,
): Promise<void> {
  for (const a of allocations) {
    const lineId = lineIdOf(Number(a.lineKey))
    await sequelize.query('INSERT INTO allocations (order_line_id, batch_id, bars) VALUES ($1, $2, $3)', {
      bind: [lineId, a.batchId, a.bars],
      transaction: t,
    })
    await recordStockMove(
      { batchId: a.batchId, kind: 'reserved', bars: a.bars, orderId, orderLineId: lineId, userId },
      t,
    )
  }
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
 * Places a shop's case order against cured stock, in one transaction: the shop's row, then the
 * ordered products' ready batches (oldest ready first) and curing batches are locked, the plan
 * made, the order numbered, its lines written with frozen prices, its bars reserved with one
 * ledger move per allocation, the opening order marked done and the ordered cart lines cleared.
 * The same Idempotency-Key with the same body answers the same order (created: false), even when
 * both requests arrive at once: the unique index lets one in and the other reads what it made.
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

  let outcome:
    { orderId: number; mails: OrderMail[] } | { replayOf: { id: number; request_hash: string | null } }
  try {
    outcome = await retryingTransaction(async (t) => {
      const shop = await orderingShop(shopId, t, true)
      // Under the shop's lock: a request with this key that committed meanwhile is answered, not repeated.
      const again = await orderByKey(shopId, key, t)
      if (again) return { replayOf: again }
      if (!(await isShopOrderable(shopId, t))) {
        throw AppError.unprocessable(
          'account_on_hold',
          'Your account cannot place orders at the moment. Please contact the studio.',
        )
      }
      const today = await studioToday(t)
      if (input.requestedShipDate && compareIso(input.requestedShipDate, today) < 0) {
        throw AppError.field('requestedShipDate', 'Choose today or a later date.')
      }
      const products = shop.tierId
        ? await sellableProducts(
            { tierId: shop.tierId },
            input.lines.map((l) => l.productId),
            t,
          )
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
      const [seq] = await sequelize.query<{ last: number }>(
        `INSERT INTO order_sequences (year, last) VALUES ($1, 1)
         ON CONFLICT (year) DO UPDATE SET last = order_sequences.last + 1 RETURNING last`,
        { bind: [year], type: QueryTypes.SELECT, transaction: t },
      )
      const autoConfirm = settings.autoConfirmGoodStanding && !(await hasOverdueInvoices(shopId, today, t))
      const order = await Order.create(
        {
          number: formatOrderNumber(year, seq!.last),
          year,
          seq: seq!.last,
          shopId,
          placedBy: userId,
          poNumber: input.poNumber ?? null,
          note: input.note ?? null,
          status: autoConfirm ? applyAction('placed', 'confirm', 'owner') : 'placed',
          requestedShipDate: input.requestedShipDate ?? null,
          isOpeningOrder,
          subtotalCents: pricing.subtotalCents,
          shippingCents: pricing.shippingCents,
          taxCents: pricing.taxCents,
          totalCents: pricing.totalCents,
          weightG: pricing.weightG,
          taxExempt,
          taxRatePct: settings.taxRatePct,
          idempotencyKey: key,
          requestHash: hash,
          confirmedAt: autoConfirm ? new Date() : null,
        },
        { transaction: t },
      )
      const lineIds = await insertLines(
        order.id,
        input.lines.map((l, i) => newLine(l, i, products, pricing, promises)),
        t,
      )
      await reserve(allocations, (i) => lineIds[i]!, order.id, userId, t)
      // Confirmed at once: a prepay account's invoice is raised with it (nothing for other terms).
      if (autoConfirm) await raiseInvoiceForOrder(order.id, t, { userId, notify: args.notify })

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
        bind: [shopId, input.lines.map((l) => l.productId)],
        transaction: t,
      })
      await audit(
        {
          userId,
          action: 'order.placed',
          entity: 'order',
          entityId: order.id,
          data: { number: order.number, totalCents: pricing.totalCents, autoConfirmed: autoConfirm },
        },
        t,
      )
      const mails: OrderMail[] = [{ kind: 'placed', orderId: order.id }]
      if (autoConfirm) mails.push({ kind: 'confirmed', orderId: order.id })
      return { orderId: order.id, mails }
    })
  } catch (err) {
    if (isUniqueViolation(err, 'orders_idempotency_key')) {
      const made = await orderByKey(shopId, key)
      if (made) return replay(made, hash, shopId)
    }
    throw err
  }
  if ('replayOf' in outcome) return replay(outcome.replayOf, hash, shopId)
  if (args.notify !== false) sendOrderMailsLater(outcome.mails)
  const order = await findOrder(outcome.orderId, { role: 'buyer', shopId })
  return { order: order!, created: true }
}
