import { DomainError } from '@shared/domain/errors'

/**
 * The stock ledger of bars per batch. Every stored move carries two signed columns, `freeDelta`
 * (bars anyone may still order) and `reservedDelta` (bars promised to an order, not yet shipped),
 * so one SUM over a batch's moves gives both balances and nothing is ever updated in place:
 *
 * | kind        | bars given          | freeDelta | reservedDelta |
 * |-------------|---------------------|-----------|---------------|
 * | made        | n > 0 bars cut      | +n        | 0             |
 * | reserved    | n > 0 for an order  | −n        | +n            |
 * | released    | n > 0 back to free  | +n        | −n            |
 * | shipped     | n > 0 left the door | 0         | −n            |
 * | written_off | n > 0 lost          | −n        | 0             |
 * | adjusted    | ±n ≠ 0 recount      | ±n        | 0             |
 *
 * A single signed column against free stock cannot work: a shipment does not touch free stock,
 * so its row would carry 0 and the reserved balance could not be derived. `bars` is therefore
 * the size of the move (always positive, signed only for `adjusted`), and the two deltas are
 * derived from it by `moveDeltas` when the row is written.
 */
export const MOVE_KINDS = ['made', 'reserved', 'released', 'shipped', 'written_off', 'adjusted'] as const
export type MoveKind = (typeof MOVE_KINDS)[number]

export const WRITE_OFF_REASONS = ['damaged', 'sweating', 'spots', 'sample', 'recount'] as const
export type WriteOffReason = (typeof WRITE_OFF_REASONS)[number]

export interface StockMove {
  kind: MoveKind
  bars: number
}

export interface MoveDeltas {
  freeDelta: number
  reservedDelta: number
}

export interface StockBalance {
  free: number
  reserved: number
  /** free + reserved: the bars physically on the shelf. */
  onHand: number
}

export const EMPTY_BALANCE: StockBalance = Object.freeze({ free: 0, reserved: 0, onHand: 0 })

export function isMoveKind(value: unknown): value is MoveKind {
  return (MOVE_KINDS as readonly unknown[]).includes(value)
}

export function isWriteOffReason(value: unknown): value is WriteOffReason {
  return (WRITE_OFF_REASONS as readonly unknown[]).includes(value)
}

export function moveDeltas(kind: MoveKind, bars: number): MoveDeltas {
  if (!isMoveKind(kind))
    throw new DomainError('invalid_move_kind', `Unknown stock move: ${String(kind)}`, 'kind')
  if (!Number.isSafeInteger(bars) || bars === 0 || (kind !== 'adjusted' && bars < 0)) {
    const rule = kind === 'adjusted' ? 'a whole number other than 0' : 'a whole number above 0'
    throw new DomainError('invalid_bars', `Bars of a ${kind} move must be ${rule} (got ${bars})`, 'bars')
  }
  switch (kind) {
    case 'made':
      return { freeDelta: bars, reservedDelta: 0 }
    case 'reserved':
      return { freeDelta: -bars, reservedDelta: bars }
    case 'released':
      return { freeDelta: bars, reservedDelta: -bars }
    case 'shipped':
      return { freeDelta: 0, reservedDelta: -bars }
    case 'written_off':
      return { freeDelta: -bars, reservedDelta: 0 }
    case 'adjusted':
      return { freeDelta: bars, reservedDelta: 0 }
  }
}

/**
 * The balance of stored moves: a plain sum, exactly what `SUM(free_delta), SUM(reserved_delta)`
 * gives in SQL. It does not replay the order of moves; `applyMove` is the guard at write time.
 */
export function balanceOf(moves: readonly StockMove[]): StockBalance {
  let free = 0
  let reserved = 0
  for (const move of moves) {
    const d = moveDeltas(move.kind, move.bars)
    free += d.freeDelta
    reserved += d.reservedDelta
  }
  return { free, reserved, onHand: free + reserved }
}

/** The balance after one more move; refuses a move that would take either balance below zero. */
export function applyMove(balance: StockBalance, kind: MoveKind, bars: number): StockBalance {
  for (const key of ['free', 'reserved'] as const) {
    if (!Number.isSafeInteger(balance[key]) || balance[key] < 0) {
      throw new DomainError(
        'invalid_balance',
        `The ${key} balance must be a whole number ≥ 0`,
        `balance.${key}`,
      )
    }
  }
  const d = moveDeltas(kind, bars)
  const free = balance.free + d.freeDelta
  const reserved = balance.reserved + d.reservedDelta
  if (free < 0) {
    throw new DomainError(
      'stock_negative',
      `Only ${balance.free} free bars in this batch; a ${kind} move of ${Math.abs(bars)} would leave ${free}`,
      'bars',
    )
  }
  if (reserved < 0) {
    throw new DomainError(
      'stock_negative',
      `Only ${balance.reserved} reserved bars in this batch; a ${kind} move of ${bars} would leave ${reserved}`,
      'bars',
    )
  }
  return { free, reserved, onHand: free + reserved }
}
