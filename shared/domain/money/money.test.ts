import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { DomainError } from '@shared/domain/errors'
import {
  assertCents,
  formatCents,
  parseMoneyToCents,
  percentOf,
  roundHalfUp,
  roundUpToStep,
  sumCents,
} from '@shared/domain/money/money'

describe('formatCents', () => {
  it.each([
    { cents: 123456, currency: 'USD', locale: 'en-US', text: '$1,234.56', source: 'hand calculation' },
    { cents: 0, currency: 'USD', locale: 'en-US', text: '$0.00', source: 'hand calculation' },
    { cents: 5, currency: 'USD', locale: 'en-US', text: '$0.05', source: 'hand calculation' },
    { cents: -50, currency: 'USD', locale: 'en-US', text: '-$0.50', source: 'hand calculation' },
    { cents: 123456, currency: 'GBP', locale: 'en-GB', text: '£1,234.56', source: 'hand calculation' },
    // de-DE puts a no-break space before the euro sign
    { cents: 123456, currency: 'EUR', locale: 'de-DE', text: '1.234,56\u00a0€', source: 'hand calculation' },
  ])('$cents $currency $locale → $text ($source)', ({ cents, currency, locale, text }) => {
    expect(formatCents(cents, currency, locale)).toBe(text)
  })

  it('defaults to USD in en-US (hand calculation)', () => {
    expect(formatCents(99)).toBe('$0.99')
  })

  it.each([
    { call: () => formatCents(12.5), code: 'not_integer_cents', source: 'hand calculation' },
    // JPY has no minor unit: a "cent" amount would be off by 100 (ISO 4217, from memory)
    { call: () => formatCents(100, 'JPY'), code: 'unsupported_currency', source: 'from memory' },
  ])('refuses $code ($source)', ({ call, code }) => {
    expect(call).toThrow(expect.objectContaining({ name: 'DomainError', code }))
  })
})

describe('parseMoneyToCents', () => {
  it.each([
    { text: '12', cents: 1200, source: 'hand calculation' },
    { text: '12.5', cents: 1250, source: 'hand calculation' },
    { text: '12.50', cents: 1250, source: 'hand calculation' },
    { text: '$1,234.56', cents: 123456, source: 'hand calculation' },
    { text: ' 1234.56 ', cents: 123456, source: 'hand calculation' },
    { text: '$ 4', cents: 400, source: 'hand calculation' },
    { text: '.99', cents: 99, source: 'hand calculation' },
    { text: '0', cents: 0, source: 'hand calculation' },
    { text: '1,000,000', cents: 100000000, source: 'hand calculation' },
  ])('"$text" → $cents ($source)', ({ text, cents }) => {
    expect(parseMoneyToCents(text)).toBe(cents)
  })

  it.each([
    { text: '', source: 'hand calculation' },
    { text: '$', source: 'hand calculation' },
    { text: '-5', source: 'hand calculation' },
    { text: '-$5.00', source: 'hand calculation' },
    { text: '12.345', source: 'hand calculation' },
    { text: '12.', source: 'hand calculation' },
    { text: '1,23', source: 'hand calculation' },
    { text: '12,5', source: 'hand calculation' },
    { text: 'abc', source: 'hand calculation' },
    { text: '12abc', source: 'hand calculation' },
    { text: '1e3', source: 'hand calculation' },
    { text: '99999999999999999999', source: 'hand calculation' },
  ])('"$text" → null ($source)', ({ text }) => {
    expect(parseMoneyToCents(text)).toBeNull()
  })
})

describe('roundUpToStep', () => {
  it.each([
    { cents: 1654, step: 25, result: 1675, source: 'hand calculation' },
    { cents: 1675, step: 25, result: 1675, source: 'hand calculation' },
    { cents: 1, step: 100, result: 100, source: 'hand calculation' },
    { cents: 0, step: 50, result: 0, source: 'hand calculation' },
    { cents: 499, step: 1, result: 499, source: 'hand calculation' },
    // ceil(−1.5) = −1 step
    { cents: -150, step: 100, result: -100, source: 'hand calculation' },
  ])('$cents to step $step → $result ($source)', ({ cents, step, result }) => {
    expect(roundUpToStep(cents, step)).toBe(result)
  })

  it.each([
    { cents: 100, step: 0, field: 'stepCents', source: 'hand calculation' },
    { cents: 100, step: 2.5, field: 'stepCents', source: 'hand calculation' },
    { cents: 10.5, step: 5, field: 'cents', source: 'hand calculation' },
  ])('rejects cents $cents step $step on $field ($source)', ({ cents, step, field }) => {
    expect(() => roundUpToStep(cents, step)).toThrow(expect.objectContaining({ field }))
  })
})

describe('sumCents / assertCents', () => {
  it.each([
    { values: [], total: 0, source: 'hand calculation' },
    { values: [1999, 1, 250], total: 2250, source: 'hand calculation' },
    { values: [500, -125], total: 375, source: 'hand calculation' },
  ])('sum of $values = $total ($source)', ({ values, total }) => {
    expect(sumCents(values)).toBe(total)
  })

  it('names the bad value (hand calculation)', () => {
    expect(() => sumCents([100, 0.5])).toThrow(expect.objectContaining({ field: 'values.1' }))
  })

  it.each([
    { n: 0.1, source: 'hand calculation' },
    { n: Number.NaN, source: 'hand calculation' },
    { n: Number.POSITIVE_INFINITY, source: 'hand calculation' },
    { n: 2 ** 53, source: 'hand calculation' },
  ])('assertCents($n) throws ($source)', ({ n }) => {
    expect(() => assertCents(n)).toThrow(DomainError)
  })
})

describe('percentOf / roundHalfUp', () => {
  it.each([
    { cents: 1000, pct: 10, result: 100, source: 'hand calculation' },
    // 1005 × 10 % = 100.5 → 101
    { cents: 1005, pct: 10, result: 101, source: 'hand calculation' },
    // 1000 × 8.875 % = 88.75 → 89
    { cents: 1000, pct: 8.875, result: 89, source: 'hand calculation' },
    // 3000 × 1.15 % = 34.5 in decimals (34.49999999999999 in binary) → 35
    { cents: 3000, pct: 1.15, result: 35, source: 'hand calculation' },
    // 2500 × 1.14 % = 28.5 in decimals (28.499999999999996 in binary) → 29
    { cents: 2500, pct: 1.14, result: 29, source: 'hand calculation' },
    // 115 × 7 % = 8.05 → 8
    { cents: 115, pct: 7, result: 8, source: 'hand calculation' },
    { cents: 0, pct: 50, result: 0, source: 'hand calculation' },
    // −250 × 1 % = −2.5 → −3 (halves away from zero)
    { cents: -250, pct: 1, result: -3, source: 'hand calculation' },
  ])('$pct % of $cents = $result ($source)', ({ cents, pct, result }) => {
    expect(percentOf(cents, pct)).toBe(result)
  })

  it.each([
    { x: 2.5, result: 3, source: 'hand calculation' },
    { x: 2.4999, result: 2, source: 'hand calculation' },
    { x: -0.4, result: 0, source: 'hand calculation' },
    { x: 827.15, result: 827, source: 'hand calculation' },
  ])('roundHalfUp($x) = $result ($source)', ({ x, result }) => {
    expect(roundHalfUp(x)).toBe(result)
  })
})

describe('percentOf against exact integer arithmetic', () => {
  // Percentages to thousandths (8.875 % sales tax): cents × k ÷ 100 000, half up, in BigInt.
  it('matches for any amount and rate (hand calculation, generalised)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 1_000_000_000 }),
        fc.integer({ min: 0, max: 100_000 }),
        (cents, k) => {
          const n = BigInt(cents) * BigInt(k)
          const expected = Number(n / 100000n + ((n % 100000n) * 2n >= 100000n ? 1n : 0n))
          expect(percentOf(cents, k / 1000)).toBe(expected)
        },
      ),
      { numRuns: 20000 },
    )
  })
})
