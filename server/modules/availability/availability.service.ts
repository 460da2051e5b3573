import type { Transaction } from 'sequelize'
import { QueryTypes } from 'sequelize'
import { availabilityByProduct } from '@shared/domain/availability/availability'
import type { ProductAvailability } from '@shared/domain/availability/availability'
import type { AllocationBatch } from '@shared/domain/allocation/allocation'
import { isoToday } from '@shared/domain/dates/dates'
import { sequelize } from '@server/db/sequelize'
import { getSettings } from '@server/modules/settings/settings.service'

// What is ready to sell and when more will be: by the calendar alone (a batch is ready on its
// ready date, nobody flips it) and from the ledger's free balance (bars not promised to an order).

/** The studio's calendar date, in its own time zone (settings.timeZone). */
// The studio's date, worked out at most once a second (formatting an instant in a time zone is
// the costliest step of a cached catalogue answer); a clock moved by tests changes the second.
let lastToday: { second: number; timeZone: string; iso: string } | null = null

export async function studioToday(transaction?: Transaction): Promise<string> {
  const { timeZone } = await getSettings(transaction)
  const now = Date.now()
  const second = Math.floor(now / 1000)
  if (lastToday?.second === second && lastToday.timeZone === timeZone) return lastToday.iso
  const iso = isoToday(new Date(now), timeZone)
  lastToday = { second, timeZone, iso }
  return iso
}

/**
 * Ready bars and the next ready date per product, in one query. With `productIds`, every id asked
 * for gets an entry (0 and null for a product with nothing poured); without, every product does.
 */
export async function readyStockByProduct(
  productIds?: number[],
  transaction?: Transaction,
): Promise<Map<number, ProductAvailability>> {
  const today = await studioToday(transaction)
  // One bare row per product (so sold-out and never-poured products still appear), then one row
  // per product and ready date with something free.
  const rows = await sequelize.query<{ product_id: number; ready_date: string | null; free: number }>(
    `SELECT p.id AS product_id, NULL::date AS ready_date, 0 AS free
       FROM products p
      WHERE $1::int[] IS NULL OR p.id = ANY($1::int[])
     UNION ALL
     SELECT b.product_id, b.ready_date, SUM(s.free)::int
       FROM batches b JOIN batch_stock s ON s.batch_id = b.id
      WHERE s.free > 0 AND ($1::int[] IS NULL OR b.product_id = ANY($1::int[]))
      GROUP BY b.product_id, b.ready_date`,
    { bind: [productIds ?? null], type: QueryTypes.SELECT, transaction },
  )
  const stock = rows
    .filter((r) => r.ready_date !== null)
    .map((r) => ({ productId: r.product_id, readyDate: r.ready_date!, freeBars: r.free }))
  const result = availabilityByProduct(stock, today)
  const ids = productIds ?? [...new Set(rows.map((r) => r.product_id))]
  for (const id of ids) if (!result.has(id)) result.set(id, { readyBars: 0, nextReady: null })
  return result
}

export type ReadyBatch = AllocationBatch & { lotCode: string }

/**
 * Ready batches of these products with free bars, oldest ready date first (ties by id), their
 * balance rows locked FOR UPDATE until the caller's transaction ends: allocate from these and
 * write `reserved` moves (recordStockMove) in the same transaction.
 */
export async function readyBatchesForUpdate(
  productIds: number[],
  transaction: Transaction,
  studioDay?: string,
): Promise<ReadyBatch[]> {
  if (productIds.length === 0) return []
  // A caller that already knows the studio day passes it, so the lock is taken without a settings read first.
  const today = studioDay ?? (await studioToday(transaction))
  const rows = await sequelize.query<{
    batch_id: number
    product_id: number
    ready_date: string
    free: number
    lot_code: string
  }>(
    `SELECT s.batch_id, b.product_id, b.ready_date, s.free, b.lot_code
       FROM batch_stock s JOIN batches b ON b.id = s.batch_id
      WHERE b.product_id = ANY($1::int[]) AND b.ready_date <= $2::date AND s.free > 0
      ORDER BY b.ready_date, b.id
        FOR UPDATE OF s`,
    { bind: [productIds, today], type: QueryTypes.SELECT, transaction },
  )
  return rows.map((r) => ({
    batchId: r.batch_id,
    productId: r.product_id,
    readyDate: r.ready_date,
    freeBars: r.free,
    lotCode: r.lot_code,
  }))
}
