import type { Transaction } from 'sequelize'
import { QueryTypes } from 'sequelize'
import { EMPTY_BALANCE, applyMove, moveDeltas } from '@shared/domain/stock/ledger'
import type { MoveKind, StockBalance } from '@shared/domain/stock/ledger'
import { DomainError } from '@shared/domain/errors'
import type { StockMoveRow } from '@shared/schemas/batches'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { invalidateCatalogue } from '@server/modules/catalogue/catalogue-cache'

// The one writer of stock_moves. Every move takes the batch's balance row FOR UPDATE first, so two
// moves on one batch queue up and the second sees the first; applyMove turns an overdraw into a
// clean 409 before the CHECK on batch_stock would refuse it (which stays as the last guard).

export type NewStockMove = {
  batchId: number
  kind: MoveKind
  bars: number
  reason?: string | null
  note?: string | null
  orderId?: number | null
  orderLineId?: number | null
  userId: number | null
}

type MoveRowDb = {
  id: string
  batch_id: number
  kind: MoveKind
  bars: number
  free_delta: number
  reserved_delta: number
  reason: string | null
  note: string | null
  order_id: number | null
  user_id: number | null
  user_name: string | null
  created_at: Date
}

export function toMoveRow(r: MoveRowDb): StockMoveRow {
  return {
    id: Number(r.id),
    batchId: r.batch_id,
    kind: r.kind,
    bars: r.bars,
    freeDelta: r.free_delta,
    reservedDelta: r.reserved_delta,
    reason: r.reason,
    note: r.note,
    orderId: r.order_id,
    userId: r.user_id,
    userName: r.user_name,
    createdAt: r.created_at.toISOString(),
  }
}

/** The batch's balance, its row locked until the transaction ends (zero before its first move). */
export async function lockedBalance(batchId: number, t: Transaction): Promise<StockBalance> {
  const [row] = await sequelize.query<{ free: number; reserved: number }>(
    'SELECT free, reserved FROM batch_stock WHERE batch_id = $1 FOR UPDATE',
    { bind: [batchId], type: QueryTypes.SELECT, transaction: t },
  )
  return row ? { free: row.free, reserved: row.reserved, onHand: row.free + row.reserved } : EMPTY_BALANCE
}

const VERB: Record<MoveKind, string> = {
  made: 'making',
  reserved: 'reserving',
  released: 'releasing',
  shipped: 'shipping',
  written_off: 'writing off',
  adjusted: 'removing',
}

function overdrawMessage(move: NewStockMove, before: StockBalance): string {
  const size = Math.abs(move.bars)
  const fromReserved = move.kind === 'released' || move.kind === 'shipped'
  const have = fromReserved ? before.reserved : before.free
  const what = fromReserved ? 'reserved' : 'free'
  return `Only ${have} ${what} ${have === 1 ? 'bar is' : 'bars are'} in this batch; ${VERB[move.kind]} ${size} would leave ${have - size}.`
}

function stockNegative(message: string, balance: StockBalance): AppError {
  return AppError.conflict('stock_negative', message, [
    { field: 'bars', message, free: balance.free, reserved: balance.reserved },
  ])
}

/**
 * Appends one move inside the caller's transaction and returns it with the balance after it.
 * Orders use it too: `reserved` / `released` / `shipped` with their order and line ids.
 */
export async function recordStockMove(
  move: NewStockMove,
  t: Transaction,
): Promise<{ move: StockMoveRow; stock: StockBalance }> {
  const [out] = await recordStockMoves([move], t)
  return out!
}

const MOVE_COLUMNS = 10

/**
 * Appends several moves in the caller's transaction with two statements: the balance rows of all
 * their batches locked in one go, in batch id order (so two writers never lock them crosswise),
 * then one multi-row insert. The moves apply in the order given (two on one batch: the second sees
 * the first); any overdraw is the same clean 409 before anything is written. Returns each move with
 * its batch's balance after it, in the order given.
 */
export async function recordStockMoves(
  moves: readonly NewStockMove[],
  t: Transaction,
): Promise<{ move: StockMoveRow; stock: StockBalance }[]> {
  if (moves.length === 0) return []
  const batchIds = [...new Set(moves.map((m) => m.batchId))].sort((a, b) => a - b)
  const locked = await sequelize.query<{ batch_id: number; free: number; reserved: number }>(
    'SELECT batch_id, free, reserved FROM batch_stock WHERE batch_id = ANY($1::int[]) ORDER BY batch_id FOR UPDATE',
    { bind: [batchIds], type: QueryTypes.SELECT, transaction: t },
  )
  const balances = new Map<number, StockBalance>(
    locked.map((r) => [r.batch_id, { free: r.free, reserved: r.reserved, onHand: r.free + r.reserved }]),
  )
  const afters: StockBalance[] = []
  let firstBefore: StockBalance = EMPTY_BALANCE
  const bind: unknown[] = []
  const values: string[] = []
  moves.forEach((move, i) => {
    const before = balances.get(move.batchId) ?? EMPTY_BALANCE
    if (i === 0) firstBefore = before
    let after: StockBalance
    try {
      after = applyMove(before, move.kind, move.bars)
    } catch (err) {
      if (err instanceof DomainError && err.code === 'stock_negative')
        throw stockNegative(overdrawMessage(move, before), before)
      throw err
    }
    balances.set(move.batchId, after)
    afters.push(after)
    const d = moveDeltas(move.kind, move.bars)
    const start = bind.length
    bind.push(
      move.batchId,
      move.kind,
      move.bars,
      d.freeDelta,
      d.reservedDelta,
      move.reason ?? null,
      move.note ?? null,
      move.orderId ?? null,
      move.orderLineId ?? null,
      move.userId,
    )
    values.push(`(${Array.from({ length: MOVE_COLUMNS }, (_, k) => `$${start + k + 1}`).join(', ')})`)
  })
  invalidateCatalogue(t)
  let rows: MoveRowDb[]
  try {
    rows = await sequelize.query<MoveRowDb>(
      `WITH m AS (
         INSERT INTO stock_moves (batch_id, kind, bars, free_delta, reserved_delta, reason, note, order_id, order_line_id, user_id)
         VALUES ${values.join(', ')}
         RETURNING *
       )
       SELECT m.*, u.name AS user_name FROM m LEFT JOIN users u ON u.id = m.user_id ORDER BY m.id`,
      { bind, type: QueryTypes.SELECT, transaction: t },
    )
  } catch (err) {
    // 23514: the CHECK on batch_stock (free >= 0, reserved >= 0) refused what the lock should have.
    if ((err as { parent?: { code?: string } }).parent?.code === '23514') {
      throw stockNegative('That would take the batch below zero bars.', firstBefore)
    }
    throw err
  }
  // A multi-row VALUES inserts in the order written, so the ids ascend in the order given.
  return rows.map((r, i) => ({ move: toMoveRow(r), stock: afters[i]! }))
}
