/**
 * What "nothing was written" and "the ledger balances" mean, measured on the whole database:
 * the row count of every table, the sums of the stock ledger and of batch_stock, and the
 * invariants every order, allocation and shipment must keep.
 */
import { QueryTypes } from 'sequelize'
import type { Sequelize } from 'sequelize'

type Db = Pick<Sequelize, 'query'>

async function rows<T>(db: Db, sql: string, bind: unknown[] = []): Promise<T[]> {
  return db.query<T & object>(sql, { bind, type: QueryTypes.SELECT }) as Promise<T[]>
}

let tableNames: string[] | null = null

/** Every table of the schema, row counts (sessions too: a refused request must not open one). */
export async function dbSnapshot(db: Db) {
  tableNames ??= (
    await rows<{ t: string }>(
      db,
      `SELECT tablename AS t FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename`,
    )
  ).map((r) => r.t)
  const counts = await rows<{ t: string; n: number }>(
    db,
    tableNames.map((t) => `SELECT '${t}' AS t, count(*)::int AS n FROM "${t}"`).join(' UNION ALL '),
  )
  const [sums] = await rows<Record<string, number>>(
    db,
    `SELECT (SELECT COALESCE(SUM(free_delta), 0)::int FROM stock_moves) AS "movesFree",
            (SELECT COALESCE(SUM(reserved_delta), 0)::int FROM stock_moves) AS "movesReserved",
            (SELECT COALESCE(SUM(free), 0)::int FROM batch_stock) AS "stockFree",
            (SELECT COALESCE(SUM(reserved), 0)::int FROM batch_stock) AS "stockReserved",
            (SELECT COALESCE(SUM(paid_cents), 0)::bigint::text FROM invoices) AS "paidCents",
            (SELECT COALESCE(SUM(remaining), 0)::text FROM ingredient_lots) AS "lotsRemaining"`,
  )
  return { counts: Object.fromEntries(counts.map((c) => [c.t, c.n])), sums: sums! }
}

/**
 * The ledger's promises, over every batch and order. Each entry names what broke; an empty list
 * means: batch_stock equals the sums of the moves, no balance is negative, every live
 * allocation is backed by reserved bars of its batch, no batch shipped or reserved more than it
 * made, and every order line's allocated bars are no more than its bars.
 */
export async function ledgerProblems(db: Db): Promise<string[]> {
  const problems: string[] = []
  const drift = await rows<{ batchId: number; free: number; reserved: number; mf: number; mr: number }>(
    db,
    `SELECT b.id AS "batchId", COALESCE(s.free, 0) AS free, COALESCE(s.reserved, 0) AS reserved,
            COALESCE(SUM(m.free_delta), 0)::int AS mf, COALESCE(SUM(m.reserved_delta), 0)::int AS mr
       FROM batches b LEFT JOIN batch_stock s ON s.batch_id = b.id LEFT JOIN stock_moves m ON m.batch_id = b.id
      GROUP BY b.id, s.free, s.reserved
     HAVING COALESCE(s.free, 0) <> COALESCE(SUM(m.free_delta), 0) OR COALESCE(s.reserved, 0) <> COALESCE(SUM(m.reserved_delta), 0)
         OR COALESCE(s.free, 0) < 0 OR COALESCE(s.reserved, 0) < 0`,
  )
  for (const d of drift)
    problems.push(`batch ${d.batchId}: stock ${d.free}/${d.reserved}, moves ${d.mf}/${d.mr}`)
  const alloc = await rows<{ batchId: number; allocated: number; reserved: number }>(
    db,
    // Every reserved bar is held by a live allocation and the other way round. A shipped order
    // keeps its allocations (they name the lots that left), without reserved bars.
    `SELECT s.batch_id AS "batchId", COALESCE(x.allocated, 0)::int AS allocated, s.reserved
       FROM batch_stock s
       LEFT JOIN (SELECT a.batch_id, SUM(a.bars) AS allocated
                    FROM allocations a JOIN order_lines l ON l.id = a.order_line_id JOIN orders o ON o.id = l.order_id
                   WHERE o.status NOT IN ('shipped', 'cancelled') GROUP BY a.batch_id) x ON x.batch_id = s.batch_id
      WHERE s.reserved <> COALESCE(x.allocated, 0)`,
  )
  for (const a of alloc)
    problems.push(`batch ${a.batchId}: ${a.allocated} bars allocated, ${a.reserved} reserved`)
  const oversold = await rows<{ batchId: number; made: number; out: number }>(
    db,
    `SELECT batch_id AS "batchId",
            SUM(CASE WHEN kind IN ('made', 'adjusted') THEN free_delta ELSE 0 END)::int AS made,
            SUM(CASE WHEN kind = 'shipped' THEN bars ELSE 0 END)::int AS out
       FROM stock_moves GROUP BY batch_id
     HAVING SUM(CASE WHEN kind = 'shipped' THEN bars ELSE 0 END) > SUM(CASE WHEN kind IN ('made', 'adjusted') THEN free_delta ELSE 0 END)`,
  )
  for (const o of oversold) problems.push(`batch ${o.batchId}: shipped ${o.out} of ${o.made} made`)
  const overLine = await rows<{ lineId: number; bars: number; allocated: number }>(
    db,
    `SELECT l.id AS "lineId", l.bars, SUM(a.bars)::int AS allocated
       FROM order_lines l JOIN allocations a ON a.order_line_id = l.id
      GROUP BY l.id, l.bars HAVING SUM(a.bars) > l.bars`,
  )
  for (const o of overLine)
    problems.push(`order line ${o.lineId}: ${o.allocated} bars allocated for ${o.bars}`)
  const cancelledHolding = await rows<{ orderId: number; n: number }>(
    db,
    `SELECT o.id AS "orderId", count(a.*)::int AS n FROM orders o JOIN order_lines l ON l.order_id = o.id JOIN allocations a ON a.order_line_id = l.id
      WHERE o.status = 'cancelled' GROUP BY o.id`,
  )
  for (const c of cancelledHolding)
    problems.push(`cancelled order ${c.orderId} still holds ${c.n} allocations`)
  return problems
}
