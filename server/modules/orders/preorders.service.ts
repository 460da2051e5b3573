import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { planAllocation } from '@shared/domain/allocation/allocation'
import { compareIso } from '@shared/domain/dates/dates'
import { preorderPromiseDate, unpromisedCuringBars } from '@shared/domain/orders/preorder'
import type { CuringBatch } from '@shared/domain/orders/preorder'
import type { PreorderRunDto, StockShortfallDto } from '@shared/schemas/orders'
import { sequelize } from '@server/db/sequelize'
import { logger } from '@server/lib/logger'
import { audit } from '@server/modules/audit/audit.service'
import { readyBatchesForUpdate, studioToday } from '@server/modules/availability/availability.service'
import { recordStockMove } from '@server/modules/batches/stock-moves.service'
import { keepMail } from '@server/modules/mail/outbox'
import { retryingTransaction } from '@server/modules/orders/transactions'

// Pre-orders ask for bars that are still curing. They reserve nothing until the batch is ready
// (a curing bar cannot be packed), so they queue: each is promised the ready date by which the
// curing stock covers it after every earlier pre-order, and on that date the daily run sets their
// bars aside in the order they were placed.

/** Orders whose lines still count: not cancelled, not gone. */
const OPEN_STATUSES = `('placed', 'confirmed', 'packing', 'packed')`

const WAITING_LINE = `l.preorder AND l.removed_at IS NULL
  AND NOT EXISTS (SELECT 1 FROM allocations a WHERE a.order_line_id = l.id)`

/**
 * Free bars of the products' curing batches (ready after today) by product, oldest first. With
 * `lock` (inside the caller's transaction) their balance rows are locked, so two pre-orders for one
 * product are promised one after the other and never the same bars.
 */
async function curingStock(
  productIds: number[],
  today: string,
  transaction?: Transaction,
  lock = false,
): Promise<Map<number, CuringBatch[]>> {
  const rows = await sequelize.query<{ product_id: number; ready_date: string; free: number }>(
    `SELECT b.product_id, b.ready_date, s.free
       FROM batch_stock s JOIN batches b ON b.id = s.batch_id
      WHERE b.product_id = ANY($1::int[]) AND b.ready_date > $2::date
      ORDER BY b.ready_date, b.id
      ${lock ? 'FOR UPDATE OF s' : ''}`,
    { bind: [productIds, today], type: QueryTypes.SELECT, transaction },
  )
  const byProduct = new Map<number, CuringBatch[]>()
  for (const r of rows) {
    const list = byProduct.get(r.product_id) ?? []
    list.push({ readyDate: r.ready_date, freeBars: r.free })
    byProduct.set(r.product_id, list)
  }
  return byProduct
}

/** Bars promised to pre-orders that still wait for their batch, per product (one order left out). */
async function waitingPreorderBars(
  productIds: number[],
  transaction?: Transaction,
  exceptOrderId: number | null = null,
): Promise<Map<number, number>> {
  const rows = await sequelize.query<{ product_id: number; bars: number }>(
    `SELECT l.product_id, SUM(l.bars)::int AS bars
       FROM order_lines l JOIN orders o ON o.id = l.order_id
      WHERE l.product_id = ANY($1::int[]) AND o.status IN ${OPEN_STATUSES} AND ${WAITING_LINE}
        AND ($2::int IS NULL OR o.id <> $2::int)
      GROUP BY l.product_id`,
    { bind: [productIds, exceptOrderId], type: QueryTypes.SELECT, transaction },
  )
  return new Map(rows.map((r) => [r.product_id, r.bars]))
}

export type PreorderRequest = { key: number; productId: number; bars: number }

/**
 * The promised date of each pre-order line, or the shortfall of those curing stock cannot cover
 * (after the pre-orders placed before them). With `lock`, inside `transaction`, this is the
 * binding promise of an order being placed; without, an estimate for the cart.
 */
export async function promisePreorders(
  lines: readonly PreorderRequest[],
  today: string,
  opts: {
    readyBars: ReadonlyMap<number, number>
    transaction?: Transaction
    lock?: boolean
    exceptOrderId?: number | null
  },
): Promise<{ dates: Map<number, string>; shortfall: StockShortfallDto[] }> {
  const dates = new Map<number, string>()
  const shortfall: StockShortfallDto[] = []
  if (lines.length === 0) return { dates, shortfall }
  const ids = [...new Set(lines.map((l) => l.productId))]
  const curing = await curingStock(ids, today, opts.transaction, opts.lock ?? false)
  const promised = await waitingPreorderBars(ids, opts.transaction, opts.exceptOrderId ?? null)
  for (const line of lines) {
    const batches = curing.get(line.productId) ?? []
    const before = promised.get(line.productId) ?? 0
    const date = preorderPromiseDate(batches, before, line.bars, today)
    if (date) {
      dates.set(line.key, date)
      promised.set(line.productId, before + line.bars)
    } else {
      shortfall.push({
        productId: line.productId,
        requestedBars: line.bars,
        readyBars: opts.readyBars.get(line.productId) ?? 0,
        preorder: true,
        curingBars: unpromisedCuringBars(batches, before, today),
      })
    }
  }
  return { dates, shortfall }
}

type WaitingLine = {
  id: number
  order_id: number
  product_id: number
  bars: number
  promised_date: string
}

/**
 * Sets aside the bars of waiting pre-orders from batches that are ready by `today`, in the order
 * the pre-orders were placed (a product's queue stops at the first line its ready stock cannot
 * cover, so a later, smaller pre-order never jumps it). A waiting line whose promised date has come
 * is promised the next date curing stock covers. Each buyer whose bars were set aside is e-mailed.
 * Runs when the server starts and daily (server/index.ts), and when the owner asks.
 */
export async function allocateDuePreorders(
  today: string,
  byUserId: number | null = null,
): Promise<PreorderRunDto> {
  const run = await retryingTransaction(async (t) => {
    const locked = await sequelize.query<{ id: number }>(
      `SELECT o.id FROM orders o
        WHERE o.status IN ${OPEN_STATUSES}
          AND EXISTS (SELECT 1 FROM order_lines l WHERE l.order_id = o.id AND ${WAITING_LINE})
        ORDER BY o.id
          FOR UPDATE`,
      { type: QueryTypes.SELECT, transaction: t },
    )
    if (locked.length === 0) return { allocated: [], waiting: 0 }
    // Read again under the locks: a cancel or an earlier run may have changed them meanwhile.
    const lines = await sequelize.query<WaitingLine & { number: string }>(
      `SELECT l.id, l.order_id, l.product_id, l.bars, l.promised_date, o.number
         FROM order_lines l JOIN orders o ON o.id = l.order_id
        WHERE o.id = ANY($1::int[]) AND o.status IN ${OPEN_STATUSES} AND ${WAITING_LINE}
        ORDER BY o.created_at, o.id, l.sort_order, l.id`,
      { bind: [locked.map((o) => o.id)], type: QueryTypes.SELECT, transaction: t },
    )
    const productIds = [...new Set(lines.map((l) => l.product_id))]
    const batches = await readyBatchesForUpdate(productIds, t)
    const blocked = new Set<number>()
    const stillWaiting: typeof lines = []
    const allocated: PreorderRunDto['allocated'] = []
    for (const line of lines) {
      if (blocked.has(line.product_id)) {
        stillWaiting.push(line)
        continue
      }
      const plan = planAllocation(
        [{ lineKey: line.id, productId: line.product_id, bars: line.bars }],
        batches,
        today,
      )
      if (!plan.ok) {
        blocked.add(line.product_id)
        stillWaiting.push(line)
        continue
      }
      for (const a of plan.allocations) {
        await sequelize.query('INSERT INTO allocations (order_line_id, batch_id, bars) VALUES ($1, $2, $3)', {
          bind: [line.id, a.batchId, a.bars],
          transaction: t,
        })
        await recordStockMove(
          {
            batchId: a.batchId,
            kind: 'reserved',
            bars: a.bars,
            orderId: line.order_id,
            orderLineId: line.id,
            userId: byUserId,
          },
          t,
        )
        const batch = batches.find((b) => b.batchId === a.batchId)!
        batch.freeBars -= a.bars
      }
      allocated.push({
        orderId: line.order_id,
        number: line.number,
        lineId: line.id,
        productId: line.product_id,
        bars: line.bars,
      })
    }

    // Promises whose day has come without their bars move to the next date curing stock covers.
    const curing = await curingStock([...blocked], today, t, true)
    const ahead = new Map<number, number>()
    for (const line of stillWaiting) {
      const before = ahead.get(line.product_id) ?? 0
      ahead.set(line.product_id, before + line.bars)
      if (compareIso(line.promised_date, today) > 0) continue
      const next = preorderPromiseDate(curing.get(line.product_id) ?? [], before, line.bars, today)
      if (next && next !== line.promised_date) {
        await sequelize.query('UPDATE order_lines SET promised_date = $2 WHERE id = $1', {
          bind: [line.id, next],
          transaction: t,
        })
      }
    }

    const byOrder = new Map<number, number[]>()
    for (const a of allocated) byOrder.set(a.orderId, [...(byOrder.get(a.orderId) ?? []), a.lineId])
    for (const [orderId, lineIds] of byOrder) {
      await audit(
        {
          userId: byUserId,
          action: 'order.preorder_allocated',
          entity: 'order',
          entityId: orderId,
          data: { lineIds, today },
        },
        t,
      )
    }
    await keepMail(
      [...byOrder].map(([orderId, lineIds]) => ({
        kind: 'order' as const,
        mail: { kind: 'preorder_allocated' as const, orderId, lineIds },
      })),
      t,
    )
    return { allocated, waiting: stillWaiting.length }
  })
  return { allocated: run.allocated, waiting: run.waiting }
}

/**
 * Runs `allocateDuePreorders` now and then once each new studio day (checked every 15 minutes, so
 * a time-zone or clock change cannot skip a day). Returns the function that stops it.
 */
export function schedulePreorderAllocation(everyMs = 15 * 60_000): () => void {
  let lastDay: string | null = null
  let running = false
  const tick = async () => {
    if (running) return
    running = true
    try {
      const today = await studioToday()
      if (today === lastDay) return
      const result = await allocateDuePreorders(today)
      lastDay = today
      if (result.allocated.length > 0 || result.waiting > 0) {
        logger.info('pre-orders allocated', {
          today,
          allocated: result.allocated.length,
          waiting: result.waiting,
        })
      }
    } catch (err) {
      logger.error('pre-order allocation failed', { error: err instanceof Error ? err.message : String(err) })
    } finally {
      running = false
    }
  }
  void tick()
  const timer = setInterval(() => void tick(), everyMs)
  timer.unref()
  return () => clearInterval(timer)
}
