import { describe, expect, it } from 'vitest'
import {
  availabilityByProduct,
  batchReadiness,
  casesFromBars,
  cureProgress,
  DEFAULT_CURE_DAYS,
  readyDate,
  type BatchStock,
  type ProductAvailability,
} from '@shared/domain/availability/availability'

describe('readyDate', () => {
  it.each([
    {
      pour: '2026-11-03',
      cure: DEFAULT_CURE_DAYS,
      expected: '2026-12-01',
      source: 'common practice: 28-day cure; hand calculation',
    },
    {
      pour: '2026-11-03',
      cure: 42,
      expected: '2026-12-15',
      source: 'common practice: 6-week cure; hand calculation',
    },
    { pour: '2026-12-20', cure: 28, expected: '2027-01-17', source: 'hand calculation: across the year end' },
    { pour: '2026-12-01', cure: 0, expected: '2026-12-01', source: 'hand calculation: no cure' },
  ])('$pour + $cure days = $expected ($source)', ({ pour, cure, expected }) => {
    expect(readyDate(pour, cure)).toBe(expected)
  })

  it.each([
    { pour: '2026-12-01', cure: -1, code: 'invalid_cure_days', source: 'bad input' },
    { pour: '2026-12-01', cure: 27.5, code: 'invalid_cure_days', source: 'bad input' },
    { pour: '2026-13-01', cure: 28, code: 'invalid_date', source: 'bad input' },
  ])('rejects $pour + $cure with $code ($source)', ({ pour, cure, code }) => {
    expect(() => readyDate(pour, cure)).toThrow(expect.objectContaining({ code }))
  })
})

describe('batchReadiness', () => {
  it.each([
    {
      ready: '2026-12-01',
      today: '2026-11-30',
      expected: 'curing',
      source: 'hand calculation: the day before',
    },
    {
      ready: '2026-12-01',
      today: '2026-12-01',
      expected: 'ready',
      source: 'product rule: ready on its ready date',
    },
    { ready: '2026-12-01', today: '2027-01-15', expected: 'ready', source: 'hand calculation' },
  ])('ready $ready, today $today → $expected ($source)', ({ ready, today, expected }) => {
    expect(batchReadiness({ readyDate: ready }, today)).toBe(expected)
  })

  it('rejects a bad date (bad input)', () => {
    expect(() => batchReadiness({ readyDate: 'soon' }, '2026-12-01')).toThrow(
      expect.objectContaining({ code: 'invalid_date' }),
    )
  })
})

describe('cureProgress', () => {
  it.each([
    {
      pour: '2026-11-03',
      ready: '2026-12-01',
      today: '2026-11-03',
      fraction: 0,
      daysLeft: 28,
      source: 'hand calculation: pour day',
    },
    {
      pour: '2026-11-03',
      ready: '2026-12-01',
      today: '2026-11-17',
      fraction: 0.5,
      daysLeft: 14,
      source: 'hand calculation: 14 of 28',
    },
    {
      pour: '2026-11-03',
      ready: '2026-12-01',
      today: '2026-11-24',
      fraction: 0.75,
      daysLeft: 7,
      source: 'hand calculation: 21 of 28',
    },
    {
      pour: '2026-11-03',
      ready: '2026-12-01',
      today: '2026-12-01',
      fraction: 1,
      daysLeft: 0,
      source: 'hand calculation: ready day',
    },
    {
      pour: '2026-11-03',
      ready: '2026-12-01',
      today: '2026-12-20',
      fraction: 1,
      daysLeft: 0,
      source: 'hand calculation: long ready',
    },
    {
      pour: '2026-11-03',
      ready: '2026-12-01',
      today: '2026-11-01',
      fraction: 0,
      daysLeft: 30,
      source: 'hand calculation: not yet poured',
    },
    {
      pour: '2026-12-01',
      ready: '2026-12-01',
      today: '2026-12-01',
      fraction: 1,
      daysLeft: 0,
      source: 'hand calculation: no cure',
    },
  ])(
    '$pour → $ready on $today: $fraction, $daysLeft left ($source)',
    ({ pour, ready, today, fraction, daysLeft }) => {
      expect(cureProgress(pour, ready, today)).toEqual({ fraction, daysLeft })
    },
  )

  it('rejects a ready date before the pour date (bad input)', () => {
    expect(() => cureProgress('2026-12-01', '2026-11-30', '2026-12-01')).toThrow(
      expect.objectContaining({ code: 'invalid_dates', field: 'readyDate' }),
    )
  })
})

describe('availabilityByProduct', () => {
  const today = '2026-12-01'
  it.each([
    { batches: [], expected: [], source: 'hand calculation: no batches' },
    {
      batches: [
        { productId: 1, readyDate: '2026-11-10', freeBars: 30 },
        { productId: 1, readyDate: '2026-12-01', freeBars: 12 },
        { productId: 1, readyDate: '2026-12-15', freeBars: 40 },
        { productId: 1, readyDate: '2026-12-08', freeBars: 20 },
        { productId: 1, readyDate: '2026-12-08', freeBars: 16 },
      ],
      expected: [[1, { readyBars: 42, nextReady: { date: '2026-12-08', bars: 36 } }]],
      source: 'hand calculation: 30 + 12 ready today; the two batches of Dec 8 add up',
    },
    {
      batches: [
        { productId: 2, readyDate: '2026-11-01', freeBars: 0 },
        { productId: 3, readyDate: '2026-12-20', freeBars: 48 },
        { productId: 3, readyDate: '2026-12-10', freeBars: 0 },
      ],
      expected: [
        [2, { readyBars: 0, nextReady: null }],
        [3, { readyBars: 0, nextReady: { date: '2026-12-20', bars: 48 } }],
      ],
      source: 'hand calculation: sold out, and curing only (an empty curing batch promises nothing)',
    },
  ] as { batches: BatchStock[]; expected: [number, ProductAvailability][]; source: string }[])(
    '$source',
    ({ batches, expected }) => {
      expect([...availabilityByProduct(batches, today)]).toEqual(expected)
    },
  )

  it.each([
    { freeBars: -1, source: 'bad input: negative balance' },
    { freeBars: 2.5, source: 'bad input: part of a bar' },
  ])('rejects free bars $freeBars ($source)', ({ freeBars }) => {
    expect(() =>
      availabilityByProduct(
        [
          { productId: 1, readyDate: today, freeBars: 5 },
          { productId: 1, readyDate: today, freeBars },
        ],
        today,
      ),
    ).toThrow(expect.objectContaining({ code: 'invalid_bars', field: 'batches.1.freeBars' }))
  })
})

describe('casesFromBars', () => {
  it.each([
    { bars: 47, casePack: 12, expected: 3, source: 'hand calculation: whole cases only' },
    { bars: 48, casePack: 12, expected: 4, source: 'hand calculation' },
    { bars: 11, casePack: 12, expected: 0, source: 'hand calculation' },
    { bars: 0, casePack: 6, expected: 0, source: 'hand calculation' },
  ])('$bars bars in cases of $casePack = $expected ($source)', ({ bars, casePack, expected }) => {
    expect(casesFromBars(bars, casePack)).toBe(expected)
  })

  it.each([
    { bars: 10, casePack: 0, code: 'invalid_case_pack', source: 'bad input' },
    { bars: 10, casePack: 2.5, code: 'invalid_case_pack', source: 'bad input' },
    { bars: -1, casePack: 12, code: 'invalid_bars', source: 'bad input' },
  ])('rejects $bars / $casePack with $code ($source)', ({ bars, casePack, code }) => {
    expect(() => casesFromBars(bars, casePack)).toThrow(expect.objectContaining({ code }))
  })
})
