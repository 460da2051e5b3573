import { describe, expect, it } from 'vitest'
import { DEFAULT_CURE_DAYS } from '@shared/domain/availability/availability'
import { planProduct, stockOutlook } from '@shared/domain/planning/pour-plan'
import type { PlanOptions, ProductPlanInput } from '@shared/domain/planning/pour-plan'

const today = '2026-12-01'
const opts: PlanOptions = { today, leadTimeDays: 7, coverWeeks: 4, horizonWeeks: 8 }
const base: ProductPlanInput = {
  productId: 1,
  cureDays: DEFAULT_CURE_DAYS,
  sellableBarsPerMould: 12,
  readyBars: 0,
  curing: [],
  planned: [],
  weeklyDemandBars: 0,
  preorderBars: 0,
}

describe('planProduct', () => {
  it.each([
    {
      name: 'no orders in the window and no pre-orders',
      input: { readyBars: 40 },
      runOut: null,
      latest: null,
      suggestion: null,
      source: 'product rule: without demand nothing runs out',
    },
    {
      name: 'only pre-orders, nothing poured',
      input: { preorderBars: 18 },
      runOut: '2026-12-01',
      latest: '2026-10-27',
      suggestion: { pourBy: '2026-12-01', late: true, moulds: 2, bars: 24 },
      source: 'hand calculation: 18 bars short today; 18 / 12 a mould → 2; 28-day cure (common practice) + 7',
    },
    {
      name: 'pre-orders the curing batch covers',
      input: { preorderBars: 18, curing: [{ readyDate: '2026-12-20', bars: 24 }] },
      runOut: null,
      latest: null,
      suggestion: null,
      source: 'hand calculation: the batch covers the pre-orders; no other demand',
    },
    {
      name: 'steady demand, ready stock only',
      input: { readyBars: 60, weeklyDemandBars: 6 },
      runOut: '2027-02-09',
      latest: '2027-01-05',
      suggestion: { pourBy: '2027-01-05', late: false, moulds: 2, bars: 24 },
      source:
        'hand calculation: 60 bars at 6 a week last 70 days; 70 − 28 (common practice) − 7 = 35; 4 weeks × 6 = 24 → 2 moulds',
    },
    {
      name: 'stock lasting past the horizon',
      input: { readyBars: 200, weeklyDemandBars: 6 },
      runOut: '2027-07-22',
      latest: '2027-06-17',
      suggestion: null,
      source: 'hand calculation: 200 × 7 / 6 = 233⅓ days; the latest pour is beyond 8 weeks',
    },
    {
      name: 'pre-orders take the curing bars first',
      input: {
        readyBars: 12,
        weeklyDemandBars: 7,
        preorderBars: 20,
        curing: [{ readyDate: '2026-12-08', bars: 20 }],
      },
      runOut: '2026-12-13',
      latest: '2026-11-08',
      suggestion: { pourBy: '2026-12-01', late: true, moulds: 3, bars: 36 },
      source:
        'hand calculation: the batch is all promised; 12 bars at 1 a day last 12 days; 28 × 1 → 3 moulds',
    },
    {
      name: 'a planned pour extends the shelf',
      input: { readyBars: 60, weeklyDemandBars: 6, planned: [{ pourDate: '2026-12-01', bars: 24 }] },
      runOut: '2027-03-09',
      latest: '2027-02-02',
      suggestion: null,
      source:
        'hand calculation: 36 left on day 28 when 24 more are ready → 60 bars, 70 more days: day 98; latest pour beyond 8 weeks',
    },
    {
      name: 'a late planned pour still counts against the suggestion',
      input: { readyBars: 30, weeklyDemandBars: 10.5, planned: [{ pourDate: '2026-12-01', bars: 10 }] },
      runOut: '2026-12-21',
      latest: '2026-11-16',
      suggestion: { pourBy: '2026-12-01', late: true, moulds: 3, bars: 36 },
      source:
        'hand calculation: 30 bars at 1.5 a day last 20 days; the planned 10 are ready on day 28; 42 − 10 = 32 → 3 moulds',
    },
    {
      name: 'a curing batch after the run-out covers the weeks after it',
      input: { readyBars: 7, weeklyDemandBars: 7, curing: [{ readyDate: '2026-12-20', bars: 40 }] },
      runOut: '2026-12-08',
      latest: '2026-11-03',
      suggestion: null,
      source: 'hand calculation: empty on day 7, the 40 bars (more than 4 weeks × 7) arrive on day 19',
    },
  ] as {
    name: string
    input: Partial<ProductPlanInput>
    runOut: string | null
    latest: string | null
    suggestion: { pourBy: string; late: boolean; moulds: number; bars: number } | null
    source: string
  }[])('$name ($source)', ({ input, runOut, latest, suggestion }) => {
    const plan = planProduct({ ...base, ...input }, opts)
    expect(plan.runOutDate).toBe(runOut)
    expect(plan.latestPourDate).toBe(latest)
    expect(plan.suggestion).toEqual(suggestion)
  })

  it('counts pre-orders no supply covers (hand calculation: 30 owed, 12 ready, 10 curing)', () => {
    const plan = planProduct(
      { ...base, readyBars: 12, curing: [{ readyDate: '2026-12-10', bars: 10 }], preorderBars: 30 },
      opts,
    )
    expect(plan.uncoveredPreorderBars).toBe(8)
    expect(plan.runOutDate).toBe(today)
    expect(plan.suggestion?.moulds).toBe(1)
  })

  it.each([
    { input: { preorderBars: -1 }, code: 'invalid_bars', source: 'bad input' },
    { input: { sellableBarsPerMould: 0 }, code: 'invalid_bars', source: 'bad input' },
    {
      input: { cureDays: -2, planned: [{ pourDate: today, bars: 10 }] },
      code: 'invalid_cure_days',
      source: 'bad input',
    },
    { input: { weeklyDemandBars: Number.NaN }, code: 'invalid_demand', source: 'bad input' },
  ] as { input: Partial<ProductPlanInput>; code: string; source: string }[])(
    'rejects with $code ($source)',
    ({ input, code }) => {
      expect(() => planProduct({ ...base, ...input }, opts)).toThrow(expect.objectContaining({ code }))
    },
  )

  it('rejects a cover of 0 weeks (bad input)', () => {
    expect(() => planProduct(base, { ...opts, coverWeeks: 0 })).toThrow(
      expect.objectContaining({ code: 'invalid_weeks' }),
    )
  })
})

describe('stockOutlook', () => {
  it.each([
    {
      input: { readyBars: 21, curing: [], weeklyDemandBars: 7 },
      expected: [
        { weekStart: '2026-12-01', readyBars: 21, curingBars: 0 },
        { weekStart: '2026-12-08', readyBars: 14, curingBars: 0 },
        { weekStart: '2026-12-15', readyBars: 7, curingBars: 0 },
        { weekStart: '2026-12-22', readyBars: 0, curingBars: 0 },
      ],
      source: 'hand calculation: a bar a day',
    },
    {
      input: { readyBars: 7, curing: [{ readyDate: '2026-12-10', bars: 30 }], weeklyDemandBars: 7 },
      expected: [
        { weekStart: '2026-12-01', readyBars: 7, curingBars: 30 },
        { weekStart: '2026-12-08', readyBars: 0, curingBars: 30 },
        { weekStart: '2026-12-15', readyBars: 25, curingBars: 0 },
        { weekStart: '2026-12-22', readyBars: 18, curingBars: 0 },
      ],
      source: 'hand calculation: empty on day 7, 30 arrive on day 9, 5 days of demand by day 14',
    },
  ])('$source', ({ input, expected }) => {
    expect(stockOutlook(input, today, 4)).toEqual(expected)
  })
})
