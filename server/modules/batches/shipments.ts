import type { Transaction } from 'sequelize'
import { QueryTypes } from 'sequelize'
import type { BatchShipment } from '@shared/schemas/batches'
import { sequelize } from '@server/db/sequelize'

type Row = {
  batch_id: number
  shop_id: number
  shop_name: string
  order_id: number
  order_number: string
  bars: number
  shipped_on: string
}

/**
 * Which shops received bars of these batches: the `shipped` moves of the ledger, joined to their
 * orders. This is the recall hook: the ledger names the order on every shipped move, so nothing
 * else has to be kept in step. A database without the orders tables (an older schema) answers
 * with no shipments rather than failing.
 */
export async function shipmentsForBatches(
  batchIds: readonly number[],
  timeZone: string,
  transaction?: Transaction,
): Promise<Map<number, BatchShipment[]>> {
  const out = new Map<number, BatchShipment[]>(batchIds.map((id) => [id, []]))
  if (batchIds.length === 0) return out
  const [probe] = await sequelize.query<{ orders: string | null }>(
    `SELECT to_regclass('orders')::text AS orders`,
    {
      type: QueryTypes.SELECT,
      transaction,
    },
  )
  if (!probe?.orders) return out
  const rows = await sequelize.query<Row>(
    `SELECT m.batch_id, o.shop_id, s.trading_name AS shop_name, o.id AS order_id, o.number AS order_number,
            SUM(m.bars)::int AS bars, MIN((m.created_at AT TIME ZONE $2)::date)::text AS shipped_on
       FROM stock_moves m
       JOIN orders o ON o.id = m.order_id
       JOIN shops s ON s.id = o.shop_id
      WHERE m.kind = 'shipped' AND m.batch_id = ANY($1::int[])
      GROUP BY m.batch_id, o.shop_id, s.trading_name, o.id, o.number
      ORDER BY shipped_on, o.number`,
    { bind: [batchIds, timeZone], type: QueryTypes.SELECT, transaction },
  )
  for (const r of rows) {
    out.get(r.batch_id)?.push({
      shopId: r.shop_id,
      shopName: r.shop_name,
      orderId: r.order_id,
      orderNumber: r.order_number,
      bars: r.bars,
      shippedOn: r.shipped_on,
    })
  }
  return out
}

/** The shops one batch's bars went to, one entry per order. */
export async function shopsForBatch(
  batchId: number,
  timeZone = 'UTC',
  transaction?: Transaction,
): Promise<BatchShipment[]> {
  return (await shipmentsForBatches([batchId], timeZone, transaction)).get(batchId) ?? []
}
