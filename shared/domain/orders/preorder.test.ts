import { describe, expect, it } from 'vitest'
import { preorderPromiseDate, unpromisedCuringBars } from '@shared/domain/orders/preorder'

const today = '2026-12-01'
const batches = [
  { readyDate: '2026-12-29', freeBars: 60 },
  { readyDate: '2026-12-15', freeBars: 24 },
  { readyDate: '2026-11-20', freeBars: 100 }, // already ready: not curing stock
  { readyDate: '2026-12-15', freeBars: 12 },
  { readyDate: '2026-12-20', freeBars: 0 }, // written off to nothing: promises nothing
]

describe('preorderPromiseDate', () => {
  it.each([
    {
      promised: 0,
      bars: 24,
      expected: '2026-12-15',
      source: 'hand calculation: the first curing date covers 24',
    },
    {
      promised: 0,
      bars: 36,
      expected: '2026-12-15',
      source: 'hand calculation: both Dec 15 batches, 24 + 12',
    },
    { promised: 0, bars: 37, expected: '2026-12-29', source: 'hand calculation: 36 by Dec 15, 96 by Dec 29' },
    { promised: 30, bars: 6, expected: '2026-12-15', source: 'hand calculation: 30 promised + 6 = 36 ≤ 36' },
    {
      promised: 30,
      bars: 7,
      expected: '2026-12-29',
      source: 'hand calculation: earlier pre-orders come first',
    },
    { promised: 0, bars: 96, expected: '2026-12-29', source: 'hand calculation: all curing stock, 36 + 60' },
    {
      promised: 0,
      bars: 97,
      expected: null,
      source: 'hand calculation: more than cures; the ready batch does not count',
    },
    { promised: 90, bars: 12, expected: null, source: 'hand calculation: 90 + 12 > 96' },
  ])('$promised promised, $bars more → $expected ($source)', ({ promised, bars, expected }) => {
    expect(preorderPromiseDate(batches, promised, bars, today)).toBe(expected)
  })

  it('a batch ready today is ready, not curing (product rule: ready on its ready date)', () => {
    expect(preorderPromiseDate([{ readyDate: today, freeBars: 50 }], 0, 1, today)).toBeNull()
    expect(preorderPromiseDate([{ readyDate: '2026-12-02', freeBars: 50 }], 0, 1, today)).toBe('2026-12-02')
  })

  it.each([
    { args: [batches, -1, 1] as const, field: 'promisedBars', source: 'bad input: negative' },
    { args: [batches, 0, 0] as const, field: 'bars', source: 'bad input: a pre-order of nothing' },
    { args: [batches, 0, 1.5] as const, field: 'bars', source: 'bad input: part of a bar' },
    {
      args: [[{ readyDate: '2026-12-10', freeBars: -2 }], 0, 1] as const,
      field: 'batches.0.freeBars',
      source: 'bad input: negative balance',
    },
  ])('refuses $field ($source)', ({ args, field }) => {
    expect(() => preorderPromiseDate(args[0], args[1], args[2], today)).toThrow(
      expect.objectContaining({ field }),
    )
  })
})

describe('unpromisedCuringBars', () => {
  it.each([
    { promised: 0, expected: 96, source: 'hand calculation: 24 + 12 + 60, the ready batch left out' },
    { promised: 40, expected: 56, source: 'hand calculation: 96 − 40' },
    { promised: 120, expected: 0, source: 'product rule: never below zero' },
  ])('$promised promised → $expected free to promise ($source)', ({ promised, expected }) => {
    expect(unpromisedCuringBars(batches, promised, today)).toBe(expected)
  })
})
