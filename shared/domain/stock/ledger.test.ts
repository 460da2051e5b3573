import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { DomainError } from '@shared/domain/errors'
import {
  applyMove,
  balanceOf,
  EMPTY_BALANCE,
  isWriteOffReason,
  MOVE_KINDS,
  moveDeltas,
  type MoveKind,
  type StockBalance,
  type StockMove,
} from '@shared/domain/stock/ledger'

describe('moveDeltas', () => {
  it.each([
    { kind: 'made', bars: 40, free: 40, reserved: 0, source: 'product rule: ledger convention' },
    { kind: 'reserved', bars: 12, free: -12, reserved: 12, source: 'product rule: ledger convention' },
    { kind: 'released', bars: 12, free: 12, reserved: -12, source: 'product rule: ledger convention' },
    { kind: 'shipped', bars: 12, free: 0, reserved: -12, source: 'product rule: ledger convention' },
    { kind: 'written_off', bars: 2, free: -2, reserved: 0, source: 'product rule: ledger convention' },
    { kind: 'adjusted', bars: 3, free: 3, reserved: 0, source: 'product rule: a recount found bars' },
    { kind: 'adjusted', bars: -3, free: -3, reserved: 0, source: 'product rule: a recount missed bars' },
  ] as const)('$kind $bars → free $free, reserved $reserved ($source)', ({ kind, bars, free, reserved }) => {
    expect(moveDeltas(kind, bars)).toEqual({ freeDelta: free, reservedDelta: reserved })
  })

  it.each([
    { kind: 'made', bars: 0, code: 'invalid_bars', source: 'bad input: an empty move' },
    { kind: 'made', bars: -5, code: 'invalid_bars', source: 'bad input: only adjusted is signed' },
    { kind: 'shipped', bars: -5, code: 'invalid_bars', source: 'bad input: only adjusted is signed' },
    { kind: 'reserved', bars: 1.5, code: 'invalid_bars', source: 'bad input: whole bars' },
    { kind: 'adjusted', bars: 0, code: 'invalid_bars', source: 'bad input: an empty correction' },
    { kind: 'made', bars: Number.NaN, code: 'invalid_bars', source: 'bad input' },
    { kind: 'sold', bars: 5, code: 'invalid_move_kind', source: 'bad input: unknown kind' },
  ])('rejects $kind $bars with $code ($source)', ({ kind, bars, code }) => {
    expect(() => moveDeltas(kind as MoveKind, bars)).toThrow(expect.objectContaining({ code }))
  })
})

describe('balanceOf', () => {
  it.each([
    { moves: [], expected: { free: 0, reserved: 0, onHand: 0 }, source: 'hand calculation: no moves' },
    {
      moves: [
        { kind: 'made', bars: 48 },
        { kind: 'reserved', bars: 24 },
        { kind: 'shipped', bars: 12 },
      ],
      expected: { free: 24, reserved: 12, onHand: 36 },
      source: 'hand calculation: 48 made, 24 promised, 12 of them shipped',
    },
    {
      moves: [
        { kind: 'made', bars: 48 },
        { kind: 'reserved', bars: 24 },
        { kind: 'released', bars: 24 },
        { kind: 'written_off', bars: 2 },
        { kind: 'adjusted', bars: -1 },
      ],
      expected: { free: 45, reserved: 0, onHand: 45 },
      source: 'hand calculation: a cancelled order, two damaged bars, one missing at recount',
    },
  ] as { moves: StockMove[]; expected: StockBalance; source: string }[])('$source', ({ moves, expected }) => {
    expect(balanceOf(moves)).toEqual(expected)
  })

  it('rejects a stored move with bad bars (bad input)', () => {
    expect(() => balanceOf([{ kind: 'made', bars: -4 }])).toThrow(
      expect.objectContaining({ code: 'invalid_bars' }),
    )
  })
})

describe('applyMove', () => {
  const start: StockBalance = { free: 10, reserved: 4, onHand: 14 }

  it.each([
    { kind: 'made', bars: 5, expected: { free: 15, reserved: 4, onHand: 19 }, source: 'hand calculation' },
    {
      kind: 'reserved',
      bars: 10,
      expected: { free: 0, reserved: 14, onHand: 14 },
      source: 'hand calculation: all free stock',
    },
    {
      kind: 'released',
      bars: 4,
      expected: { free: 14, reserved: 0, onHand: 14 },
      source: 'hand calculation',
    },
    { kind: 'shipped', bars: 4, expected: { free: 10, reserved: 0, onHand: 10 }, source: 'hand calculation' },
    {
      kind: 'written_off',
      bars: 10,
      expected: { free: 0, reserved: 4, onHand: 4 },
      source: 'hand calculation',
    },
    {
      kind: 'adjusted',
      bars: -10,
      expected: { free: 0, reserved: 4, onHand: 4 },
      source: 'hand calculation',
    },
  ] as const)('$kind $bars from 10 free / 4 reserved ($source)', ({ kind, bars, expected }) => {
    expect(applyMove(start, kind, bars)).toEqual(expected)
    expect(start).toEqual({ free: 10, reserved: 4, onHand: 14 })
  })

  it.each([
    { kind: 'reserved', bars: 11, source: 'hand calculation: one more than free' },
    { kind: 'written_off', bars: 11, source: 'hand calculation: reserved bars cannot be written off' },
    { kind: 'adjusted', bars: -11, source: 'hand calculation' },
    { kind: 'released', bars: 5, source: 'hand calculation: one more than reserved' },
    { kind: 'shipped', bars: 5, source: 'hand calculation: one more than reserved' },
  ] as const)('refuses $kind $bars with stock_negative ($source)', ({ kind, bars }) => {
    expect(() => applyMove(start, kind, bars)).toThrow(
      expect.objectContaining({ code: 'stock_negative', field: 'bars' }),
    )
  })

  it.each([
    { balance: { free: -1, reserved: 0, onHand: -1 }, source: 'bad input: negative balance' },
    { balance: { free: 0, reserved: 0.5, onHand: 0.5 }, source: 'bad input: part of a bar' },
  ])('rejects a bad starting balance ($source)', ({ balance }) => {
    expect(() => applyMove(balance, 'made', 1)).toThrow(expect.objectContaining({ code: 'invalid_balance' }))
  })
})

describe('WRITE_OFF_REASONS', () => {
  it.each([
    { value: 'sweating', expected: true, source: 'product rule' },
    { value: 'recount', expected: true, source: 'product rule' },
    { value: 'lost', expected: false, source: 'bad input' },
  ])('$value → $expected ($source)', ({ value, expected }) => {
    expect(isWriteOffReason(value)).toBe(expected)
  })
})

describe('ledger properties', () => {
  const move = fc.record({
    kind: fc.constantFrom(...MOVE_KINDS),
    bars: fc.integer({ min: -30, max: 30 }),
  })

  it('never leaves a negative balance, and equals the sum of the accepted moves (property)', () => {
    fc.assert(
      fc.property(fc.array(move, { maxLength: 60 }), (moves) => {
        let balance: StockBalance = EMPTY_BALANCE
        const accepted: StockMove[] = []
        for (const m of moves) {
          try {
            balance = applyMove(balance, m.kind, m.bars)
            accepted.push(m)
          } catch (error) {
            if (!(error instanceof DomainError)) throw error
            // A refusal must have a reason: bad bars, or a balance that would go below zero.
            if (error.code === 'stock_negative') {
              const d = moveDeltas(m.kind, m.bars)
              expect(balance.free + d.freeDelta < 0 || balance.reserved + d.reservedDelta < 0).toBe(true)
            } else {
              expect(error.code).toBe('invalid_bars')
              expect(m.bars === 0 || (m.kind !== 'adjusted' && m.bars < 0)).toBe(true)
            }
          }
          expect(balance.free).toBeGreaterThanOrEqual(0)
          expect(balance.reserved).toBeGreaterThanOrEqual(0)
          expect(balance.onHand).toBe(balance.free + balance.reserved)
        }
        expect(balanceOf(accepted)).toEqual(balance)
      }),
      { numRuns: 500 },
    )
  })

  it('bars leave the shelf only by shipping or writing off (property)', () => {
    fc.assert(
      fc.property(fc.array(move, { maxLength: 60 }), (moves) => {
        let balance: StockBalance = EMPTY_BALANCE
        let made = 0
        let gone = 0
        for (const m of moves) {
          try {
            balance = applyMove(balance, m.kind, m.bars)
          } catch {
            continue
          }
          if (m.kind === 'made' || m.kind === 'adjusted') made += m.bars
          if (m.kind === 'shipped' || m.kind === 'written_off') gone += m.bars
        }
        expect(balance.onHand).toBe(made - gone)
      }),
      { numRuns: 300 },
    )
  })
})
