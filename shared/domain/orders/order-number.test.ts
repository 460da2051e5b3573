import { describe, expect, it } from 'vitest'
import { formatOrderNumber, parseOrderNumber } from '@shared/domain/orders/order-number'

describe('formatOrderNumber', () => {
  it.each([
    { year: 2026, seq: 42, expected: 'O26-00042', source: 'product format' },
    { year: 2026, seq: 1, expected: 'O26-00001', source: 'product format: the first order of a year' },
    { year: 2030, seq: 99999, expected: 'O30-99999', source: 'product format' },
    { year: 2030, seq: 100000, expected: 'O30-100000', source: 'product format: grows past five digits' },
    { year: 2005, seq: 7, expected: 'O05-00007', source: 'product format: year zero-padded' },
  ])('$year / $seq → $expected ($source)', ({ year, seq, expected }) => {
    expect(formatOrderNumber(year, seq)).toBe(expected)
  })

  it.each([
    { year: 1999, seq: 1, code: 'invalid_year', source: 'bad input' },
    { year: 2100, seq: 1, code: 'invalid_year', source: 'bad input: would repeat 2000' },
    { year: 2026.5, seq: 1, code: 'invalid_year', source: 'bad input' },
    { year: 2026, seq: 0, code: 'invalid_sequence', source: 'bad input: sequences start at 1' },
    { year: 2026, seq: 3.2, code: 'invalid_sequence', source: 'bad input' },
  ])('rejects $year / $seq with $code ($source)', ({ year, seq, code }) => {
    expect(() => formatOrderNumber(year, seq)).toThrow(expect.objectContaining({ code }))
  })
})

describe('parseOrderNumber', () => {
  it.each([
    { text: 'O26-00042', expected: { year: 2026, seq: 42 }, source: 'product format' },
    { text: ' o26-00042 ', expected: { year: 2026, seq: 42 }, source: 'product rule: typed in any case' },
    { text: 'O30-100000', expected: { year: 2030, seq: 100000 }, source: 'product format' },
    { text: 'O26-000042', expected: null, source: 'product rule: one spelling per order' },
    { text: 'O26-0042', expected: null, source: 'bad input: too few digits' },
    { text: 'O26-00000', expected: null, source: 'bad input: sequence 0' },
    { text: '026-00042', expected: null, source: 'bad input: a zero instead of the letter' },
    {
      text: '2026-000042',
      expected: null,
      source: 'product format: an invoice number is not an order number',
    },
    { text: 'O2026-00042', expected: null, source: 'bad input' },
    { text: '', expected: null, source: 'bad input' },
  ])('$text → $expected ($source)', ({ text, expected }) => {
    expect(parseOrderNumber(text)).toEqual(expected)
  })

  it.each([
    { year: 2026, seq: 42, source: 'product format: round trip' },
    { year: 2099, seq: 123456, source: 'product format: round trip' },
  ])('parses what it formats: $year / $seq ($source)', ({ year, seq }) => {
    expect(parseOrderNumber(formatOrderNumber(year, seq))).toEqual({ year, seq })
  })
})
