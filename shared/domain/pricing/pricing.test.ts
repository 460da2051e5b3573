import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { DomainError } from '@shared/domain/errors'
import {
  keystoneMsrpCents,
  marginPct,
  priceCheck,
  selectPriceBreak,
  suggestedUnitPriceCents,
  validatePriceBreaks,
  type PriceBreak,
} from '@shared/domain/pricing/pricing'

describe('suggestedUnitPriceCents', () => {
  it.each([
    // 827 ÷ (1 − 0.5) = 1654 → next multiple of 25 = 1675
    { cost: 827, margin: 50, step: 25, price: 1675, source: 'hand calculation' },
    // 300 ÷ 0.6 = 500 exactly: stays 500
    { cost: 300, margin: 40, step: 1, price: 500, source: 'hand calculation' },
    // 300 ÷ 0.6 = 500 → already a multiple of 50
    { cost: 300, margin: 40, step: 50, price: 500, source: 'hand calculation' },
    // 458 ÷ 0.65 = 704.615… → 705 → step 5 = 705
    { cost: 458, margin: 35, step: 5, price: 705, source: 'hand calculation' },
    // 458 ÷ 0.55 = 832.72… → 833 → step 10 = 840
    { cost: 458, margin: 45, step: 10, price: 840, source: 'hand calculation' },
    { cost: 1000, margin: 0, step: 100, price: 1000, source: 'hand calculation' },
    // 100 ÷ (1 − 0.999) = 100 000
    { cost: 100, margin: 99.9, step: 1, price: 100000, source: 'hand calculation' },
    // fractional cost: 412.3 ÷ 0.5 = 824.6 → 825
    { cost: 412.3, margin: 50, step: 1, price: 825, source: 'hand calculation' },
    { cost: 0, margin: 50, step: 25, price: 0, source: 'hand calculation' },
  ])('cost $cost at $margin % margin, step $step → $price ($source)', ({ cost, margin, step, price }) => {
    const suggested = suggestedUnitPriceCents(cost, margin, step)
    expect(suggested).toBe(price)
    if (suggested > 0) {
      // it earns the margin, and one step lower would not
      expect(priceCheck({ priceCents: suggested, costCents: cost, targetMarginPct: margin }).level).toBe('ok')
      if (suggested - step > 0 && margin > 0) {
        expect(
          priceCheck({ priceCents: suggested - step, costCents: cost, targetMarginPct: margin }).level,
        ).not.toBe('ok')
      }
    }
  })

  it.each([
    { call: () => suggestedUnitPriceCents(500, 100, 25), field: 'marginPct', source: 'hand calculation' },
    { call: () => suggestedUnitPriceCents(500, 120, 25), field: 'marginPct', source: 'hand calculation' },
    { call: () => suggestedUnitPriceCents(500, -5, 25), field: 'marginPct', source: 'hand calculation' },
    { call: () => suggestedUnitPriceCents(-500, 40, 25), field: 'costCents', source: 'hand calculation' },
    { call: () => suggestedUnitPriceCents(500, 40, 0), field: 'stepCents', source: 'hand calculation' },
  ])('rejects $field ($source)', ({ call, field }) => {
    expect(call).toThrow(DomainError)
    expect(call).toThrow(expect.objectContaining({ field }))
  })
})

describe('keystoneMsrpCents', () => {
  it.each([
    { wholesale: 1675, msrp: 3350, source: 'Monash Business School Marketing Dictionary (keystone pricing)' },
    { wholesale: 599, msrp: 1198, source: 'Monash Business School Marketing Dictionary (keystone pricing)' },
    { wholesale: 0, msrp: 0, source: 'hand calculation' },
  ])('$wholesale → $msrp ($source)', ({ wholesale, msrp }) => {
    expect(keystoneMsrpCents(wholesale)).toBe(msrp)
    // keystone is a 50 % margin on retail
    if (wholesale > 0) expect(marginPct(msrp, wholesale)).toBe(50)
  })

  it.each([
    { wholesale: 12.5, source: 'hand calculation' },
    { wholesale: -100, source: 'hand calculation' },
  ])('rejects $wholesale ($source)', ({ wholesale }) => {
    expect(() => keystoneMsrpCents(wholesale)).toThrow(expect.objectContaining({ field: 'wholesaleCents' }))
  })
})

describe('marginPct / priceCheck', () => {
  it.each([
    // (500 − 300) ÷ 500 = 40 %
    { price: 500, cost: 300, target: 40, margin: 40, level: 'ok', source: 'hand calculation' },
    { price: 500, cost: 300, target: 45, margin: 40, level: 'under_margin', source: 'hand calculation' },
    // (290 − 300) ÷ 290 = −3.448… %
    {
      price: 290,
      cost: 300,
      target: 40,
      margin: -3.448275862,
      level: 'under_cost',
      source: 'hand calculation',
    },
    { price: 300, cost: 300, target: 40, margin: 0, level: 'under_margin', source: 'hand calculation' },
    { price: 300, cost: 300, target: 0, margin: 0, level: 'ok', source: 'hand calculation' },
    // (1675 − 827) ÷ 1675 = 50.626… %
    { price: 1675, cost: 827, target: 50, margin: 50.626865672, level: 'ok', source: 'hand calculation' },
  ] as const)(
    '$price over cost $cost, target $target % → $level ($source)',
    ({ price, cost, target, margin, level }) => {
      expect(marginPct(price, cost)).toBeCloseTo(margin, 8)
      const check = priceCheck({ priceCents: price, costCents: cost, targetMarginPct: target })
      expect(check.level).toBe(level)
      expect(check.marginPct).toBeCloseTo(margin, 8)
    },
  )

  it.each([
    { call: () => marginPct(0, 100), field: 'priceCents', source: 'hand calculation' },
    { call: () => marginPct(100, -1), field: 'costCents', source: 'hand calculation' },
    {
      call: () => priceCheck({ priceCents: 500, costCents: 300, targetMarginPct: 100 }),
      field: 'targetMarginPct',
      source: 'hand calculation',
    },
  ])('rejects $field ($source)', ({ call, field }) => {
    expect(call).toThrow(expect.objectContaining({ field }))
  })
})

describe('selectPriceBreak', () => {
  const breaks: PriceBreak[] = [
    { minCases: 10, unitPriceCents: 450 },
    { minCases: 1, unitPriceCents: 525 },
    { minCases: 4, unitPriceCents: 495 },
  ]

  it.each([
    { cases: 1, minCases: 1, source: 'hand calculation' },
    { cases: 3, minCases: 1, source: 'hand calculation' },
    { cases: 4, minCases: 4, source: 'hand calculation' },
    { cases: 9, minCases: 4, source: 'hand calculation' },
    { cases: 10, minCases: 10, source: 'hand calculation' },
    { cases: 250, minCases: 10, source: 'hand calculation' },
    { cases: 0, minCases: null, source: 'hand calculation' },
  ])('$cases cases → break at $minCases ($source)', ({ cases, minCases }) => {
    expect(selectPriceBreak(breaks, cases)?.minCases ?? null).toBe(minCases)
  })

  it('returns null without breaks, and when none starts low enough (hand calculation)', () => {
    expect(selectPriceBreak([], 5)).toBeNull()
    expect(selectPriceBreak([{ minCases: 6, unitPriceCents: 400 }], 5)).toBeNull()
  })
})

describe('validatePriceBreaks', () => {
  it.each<{ name: string; breaks: PriceBreak[]; codes: string[]; source: string }>([
    {
      name: 'a good ladder',
      breaks: [
        { minCases: 1, unitPriceCents: 525 },
        { minCases: 4, unitPriceCents: 495 },
        { minCases: 10, unitPriceCents: 450 },
      ],
      codes: [],
      source: 'hand calculation',
    },
    { name: 'no breaks', breaks: [], codes: [], source: 'hand calculation' },
    {
      name: 'a flat price is allowed',
      breaks: [
        { minCases: 1, unitPriceCents: 500 },
        { minCases: 6, unitPriceCents: 500 },
      ],
      codes: [],
      source: 'hand calculation',
    },
    {
      name: 'listed out of order',
      breaks: [
        { minCases: 10, unitPriceCents: 450 },
        { minCases: 1, unitPriceCents: 525 },
      ],
      codes: [],
      source: 'hand calculation',
    },
    {
      name: 'duplicate minCases',
      breaks: [
        { minCases: 1, unitPriceCents: 525 },
        { minCases: 1, unitPriceCents: 520 },
      ],
      codes: ['duplicate_min_cases'],
      source: 'hand calculation',
    },
    {
      name: 'minCases below one',
      breaks: [
        { minCases: 0, unitPriceCents: 525 },
        { minCases: 1, unitPriceCents: 500 },
      ],
      codes: ['min_cases_invalid'],
      source: 'hand calculation',
    },
    {
      name: 'first break not at 1',
      breaks: [{ minCases: 2, unitPriceCents: 500 }],
      codes: ['no_single_case_break'],
      source: 'hand calculation',
    },
    {
      name: 'price rises with more cases',
      breaks: [
        { minCases: 1, unitPriceCents: 500 },
        { minCases: 5, unitPriceCents: 480 },
        { minCases: 10, unitPriceCents: 490 },
      ],
      codes: ['price_rises'],
      source: 'hand calculation',
    },
    {
      name: 'everything wrong at once',
      breaks: [
        { minCases: 3, unitPriceCents: 0 },
        { minCases: 3, unitPriceCents: 500 },
        { minCases: 2.5, unitPriceCents: 400 },
        { minCases: 6, unitPriceCents: 600 },
      ],
      codes: [
        'price_invalid',
        'duplicate_min_cases',
        'min_cases_invalid',
        'no_single_case_break',
        'price_rises',
      ],
      source: 'hand calculation',
    },
  ])('$name → $codes ($source)', ({ breaks, codes }) => {
    expect(validatePriceBreaks(breaks).map((p) => p.code)).toEqual(codes)
  })

  it('points at the offending row (hand calculation)', () => {
    const problems = validatePriceBreaks([
      { minCases: 1, unitPriceCents: 500 },
      { minCases: 5, unitPriceCents: 520 },
    ])
    expect(problems).toEqual([expect.objectContaining({ code: 'price_rises', index: 1 })])
  })
})

describe('suggestedUnitPriceCents against exact integer arithmetic', () => {
  // Margins set to hundredths of a percent: price = ceil(cost × 10000 ÷ (10000 − k)) to the step,
  // done in BigInt so no float is involved (hand calculation, generalised).
  it('matches for any cost, margin and step (hand calculation)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 10_000_000 }),
        fc.integer({ min: 0, max: 9999 }),
        fc.integer({ min: 1, max: 500 }),
        (cost, k, step) => {
          const num = BigInt(cost) * 10000n
          const den = BigInt(10000 - k)
          const cents = (num + den - 1n) / den
          const s = BigInt(step)
          const expected = Number(((cents + s - 1n) / s) * s)
          expect(suggestedUnitPriceCents(cost, k / 100, step)).toBe(expected)
        },
      ),
      { numRuns: 20000 },
    )
  })
})
