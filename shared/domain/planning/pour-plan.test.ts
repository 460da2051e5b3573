import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { addDays } from '@shared/domain/dates/dates'
import { DEFAULT_CURE_DAYS } from '@shared/domain/availability/availability'
import {
  latestPourDate,
  runOutDate,
  suggestedBatchCount,
  weeklyDemand,
  type RunOutInput,
} from '@shared/domain/planning/pour-plan'

const today = '2026-12-01'

describe('runOutDate', () => {
  it.each([
    {
      readyBars: 100,
      curing: [],
      weekly: 70,
      expected: '2026-12-11',
      source: 'hand calculation: 100 bars at 10 a day last 10 days',
    },
    {
      readyBars: 105,
      curing: [],
      weekly: 70,
      expected: '2026-12-11',
      source: 'hand calculation: empties halfway through day 10',
    },
    {
      readyBars: 95,
      curing: [],
      weekly: 70,
      expected: '2026-12-10',
      source: 'hand calculation: empties halfway through day 9',
    },
    {
      readyBars: 48,
      curing: [],
      weekly: 12,
      expected: '2026-12-29',
      source: 'hand calculation: one case of 12 a week, 4 weeks',
    },
    {
      readyBars: 21,
      curing: [],
      weekly: 10.5,
      expected: '2026-12-15',
      source: 'hand calculation: two weeks at 10.5 a week',
    },
    {
      readyBars: 0,
      curing: [],
      weekly: 70,
      expected: '2026-12-01',
      source: 'hand calculation: already empty',
    },
    {
      readyBars: 100,
      curing: [{ readyDate: '2026-12-06', bars: 50 }],
      weekly: 70,
      expected: '2026-12-16',
      source: 'hand calculation: 50 left on day 5, +50 arrive, 10 more days',
    },
    {
      readyBars: 100,
      curing: [{ readyDate: '2026-12-13', bars: 200 }],
      weekly: 70,
      expected: '2026-12-11',
      source: 'hand calculation: the shelf empties two days before the batch is ready',
    },
    {
      readyBars: 100,
      curing: [{ readyDate: '2026-12-11', bars: 70 }],
      weekly: 70,
      expected: '2026-12-18',
      source: 'hand calculation: ready on the very day the shelf empties, in time',
    },
    {
      readyBars: 70,
      curing: [
        { readyDate: '2026-12-15', bars: 70 },
        { readyDate: '2026-12-08', bars: 70 },
      ],
      weekly: 70,
      expected: '2026-12-22',
      source: 'hand calculation: each batch arrives as the shelf empties; 21 days in all',
    },
    {
      readyBars: 0,
      curing: [{ readyDate: '2026-11-28', bars: 70 }],
      weekly: 70,
      expected: '2026-12-08',
      source: 'product rule: a batch already past its ready date counts from today',
    },
    {
      readyBars: 0,
      curing: [{ readyDate: '2026-12-29', bars: 48 }],
      weekly: 12,
      expected: '2026-12-01',
      source: 'hand calculation: empty now; a later batch does not undo the gap',
    },
  ] as {
    readyBars: number
    curing: RunOutInput['curing']
    weekly: number
    expected: string
    source: string
  }[])(
    '$readyBars ready at $weekly a week → $expected ($source)',
    ({ readyBars, curing, weekly, expected }) => {
      expect(runOutDate({ today, readyBars, curing, weeklyDemandBars: weekly })).toBe(expected)
    },
  )

  it('never runs out without demand (hand calculation)', () => {
    expect(runOutDate({ today, readyBars: 10, curing: [], weeklyDemandBars: 0 })).toBeNull()
  })

  it.each([
    {
      input: { today, readyBars: -1, curing: [], weeklyDemandBars: 7 },
      code: 'invalid_bars',
      source: 'bad input',
    },
    {
      input: { today, readyBars: 10, curing: [], weeklyDemandBars: -7 },
      code: 'invalid_demand',
      source: 'bad input',
    },
    {
      input: { today, readyBars: 10, curing: [], weeklyDemandBars: Number.POSITIVE_INFINITY },
      code: 'invalid_demand',
      source: 'bad input',
    },
    {
      input: { today, readyBars: 10, curing: [{ readyDate: '2026-12-08', bars: 1.5 }], weeklyDemandBars: 7 },
      code: 'invalid_bars',
      source: 'bad input',
    },
    {
      input: { today: '2026-12-32', readyBars: 10, curing: [], weeklyDemandBars: 7 },
      code: 'invalid_date',
      source: 'bad input',
    },
  ] as { input: RunOutInput; code: string; source: string }[])(
    'rejects with $code ($source)',
    ({ input, code }) => {
      expect(() => runOutDate(input)).toThrow(expect.objectContaining({ code }))
    },
  )
})

describe('runOutDate against a day-by-day count', () => {
  // The shelf counted a day at a time in sevenths of a bar: arrivals at the start of a day, then
  // that day's demand. The first day that starts empty, or cannot cover its demand, is the answer.
  function countDays(input: RunOutInput): string {
    let shelf7 = 7 * input.readyBars
    for (let day = 0; ; day++) {
      for (const c of input.curing) {
        const arrives = Math.max(
          0,
          Math.round((Date.parse(c.readyDate) - Date.parse(input.today)) / 86_400_000),
        )
        if (arrives === day) shelf7 += 7 * c.bars
      }
      if (shelf7 <= 0 || shelf7 < input.weeklyDemandBars) return addDays(input.today, day)
      shelf7 -= input.weeklyDemandBars
    }
  }

  it('agrees on random shelves, batches and whole weekly demands (property)', () => {
    const curing = fc.array(
      fc.record({
        readyDate: fc.integer({ min: -3, max: 60 }).map((d) => addDays(today, d)),
        bars: fc.integer({ min: 0, max: 120 }),
      }),
      { maxLength: 5 },
    )
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 300 }),
        curing,
        fc.integer({ min: 1, max: 200 }),
        (readyBars, c, weekly) => {
          const input = { today, readyBars, curing: c, weeklyDemandBars: weekly }
          expect(runOutDate(input)).toBe(countDays(input))
        },
      ),
      { numRuns: 500 },
    )
  })
})

describe('latestPourDate', () => {
  it.each([
    {
      runOut: '2026-12-29',
      cure: DEFAULT_CURE_DAYS,
      lead: 7,
      expected: '2026-11-24',
      source: 'common practice: 28-day cure; hand calculation',
    },
    {
      runOut: '2026-12-11',
      cure: DEFAULT_CURE_DAYS,
      lead: 0,
      expected: '2026-11-13',
      source: 'common practice: 28-day cure; hand calculation',
    },
    {
      runOut: '2027-01-10',
      cure: 42,
      lead: 0,
      expected: '2026-11-29',
      source: 'common practice: 6-week cure; hand calculation',
    },
  ])('$runOut − $cure − $lead → $expected ($source)', ({ runOut, cure, lead, expected }) => {
    expect(latestPourDate(runOut, cure, lead)).toBe(expected)
  })

  it.each([
    { cure: -1, lead: 0, code: 'invalid_cure_days', source: 'bad input' },
    { cure: 28, lead: 1.5, code: 'invalid_days', source: 'bad input' },
  ])('rejects $cure / $lead with $code ($source)', ({ cure, lead, code }) => {
    expect(() => latestPourDate('2026-12-29', cure, lead)).toThrow(expect.objectContaining({ code }))
  })
})

describe('suggestedBatchCount', () => {
  it.each([
    { short: 50, perMould: 22, expected: 3, source: 'hand calculation: 50 / 22 = 2.3, round up' },
    { short: 44, perMould: 22, expected: 2, source: 'hand calculation: exact' },
    { short: 1, perMould: 22, expected: 1, source: 'hand calculation' },
    { short: 0, perMould: 22, expected: 0, source: 'hand calculation: nothing short' },
    { short: -12, perMould: 22, expected: 0, source: 'hand calculation: a surplus' },
  ])('$short short, $perMould a mould → $expected ($source)', ({ short, perMould, expected }) => {
    expect(suggestedBatchCount(short, perMould)).toBe(expected)
  })

  it.each([
    { short: 10, perMould: 0, source: 'bad input' },
    { short: 10, perMould: 10.5, source: 'bad input' },
    { short: Number.NaN, perMould: 10, source: 'bad input' },
  ])('rejects $short / $perMould ($source)', ({ short, perMould }) => {
    expect(() => suggestedBatchCount(short, perMould)).toThrow(
      expect.objectContaining({ code: 'invalid_bars' }),
    )
  })
})

describe('weeklyDemand', () => {
  const orders = [
    { date: '2026-11-01', bars: 500 },
    { date: '2026-11-02', bars: 36 },
    { date: '2026-11-14', bars: 24 },
    { date: '2026-11-29', bars: 36 },
    { date: '2026-11-30', bars: 500 },
  ]
  it.each([
    {
      start: '2026-11-02',
      end: '2026-11-29',
      expected: 24,
      source: 'hand calculation: 96 bars over 28 days, ends included',
    },
    {
      start: '2026-11-02',
      end: '2026-11-15',
      expected: 30,
      source: 'hand calculation: 60 bars over 14 days',
    },
    { start: '2026-11-14', end: '2026-11-14', expected: 168, source: 'hand calculation: 24 bars in one day' },
    { start: '2026-12-01', end: '2026-12-28', expected: 0, source: 'hand calculation: no orders' },
  ])('$start … $end → $expected a week ($source)', ({ start, end, expected }) => {
    expect(weeklyDemand(orders, start, end)).toBe(expected)
  })

  it.each([
    {
      orders: [],
      start: '2026-11-29',
      end: '2026-11-02',
      code: 'invalid_window',
      source: 'bad input: reversed',
    },
    {
      orders: [{ date: '2026-11-05', bars: -3 }],
      start: '2026-11-02',
      end: '2026-11-29',
      code: 'invalid_bars',
      source: 'bad input',
    },
    {
      orders: [{ date: '5 Nov', bars: 3 }],
      start: '2026-11-02',
      end: '2026-11-29',
      code: 'invalid_date',
      source: 'bad input',
    },
  ])('rejects with $code ($source)', ({ orders: o, start, end, code }) => {
    expect(() => weeklyDemand(o, start, end)).toThrow(expect.objectContaining({ code }))
  })

  it('feeds runOutDate: 48 bars at the November rate last 14 days (hand calculation)', () => {
    const weekly = weeklyDemand(orders, '2026-11-02', '2026-11-29')
    expect(runOutDate({ today, readyBars: 48, curing: [], weeklyDemandBars: weekly })).toBe('2026-12-15')
  })
})
