import { describe, expect, it } from 'vitest'
import { formatLotCode, parseLotCode, type LotCodeParts } from '@shared/domain/batches/lot-code'

describe('formatLotCode', () => {
  it.each([
    {
      parts: { pourDate: '2026-12-01', sku: 'LAV', seq: 1 },
      expected: '261201-LAV-01',
      source: 'product format',
    },
    {
      parts: { pourDate: '2027-01-09', sku: 'oat-hny', seq: 12 },
      expected: '270109-OAT-HNY-12',
      source: 'product format: capitals, inner hyphen',
    },
    {
      parts: { pourDate: '2026-03-05', sku: 'ABCDEFGHIJKL', seq: 99 },
      expected: '260305-ABCDEFGHIJKL-99',
      source: 'product format: longest, 22 characters',
    },
  ] as { parts: LotCodeParts; expected: string; source: string }[])(
    '$parts → $expected ($source)',
    ({ parts, expected }) => {
      const code = formatLotCode(parts)
      expect(code).toBe(expected)
      expect(code.length).toBeLessThanOrEqual(22)
    },
  )

  it.each([
    {
      parts: { pourDate: '2026-12-01', sku: 'LAV', seq: 0 },
      code: 'invalid_sequence',
      source: 'bad input: 1-based',
    },
    {
      parts: { pourDate: '2026-12-01', sku: 'LAV', seq: 100 },
      code: 'invalid_sequence',
      source: 'bad input: two digits',
    },
    { parts: { pourDate: '2026-02-30', sku: 'LAV', seq: 1 }, code: 'invalid_date', source: 'bad input' },
    {
      parts: { pourDate: '1999-12-31', sku: 'LAV', seq: 1 },
      code: 'invalid_date',
      source: 'bad input: YY means 20YY',
    },
    { parts: { pourDate: '2026-12-01', sku: '', seq: 1 }, code: 'invalid_sku', source: 'bad input' },
    {
      parts: { pourDate: '2026-12-01', sku: 'LAV ROSE', seq: 1 },
      code: 'invalid_sku',
      source: 'bad input: a space',
    },
    {
      parts: { pourDate: '2026-12-01', sku: '-LAV', seq: 1 },
      code: 'invalid_sku',
      source: 'bad input: leading hyphen',
    },
    {
      parts: { pourDate: '2026-12-01', sku: 'LAV--2', seq: 1 },
      code: 'invalid_sku',
      source: 'bad input: double hyphen',
    },
    {
      parts: { pourDate: '2026-12-01', sku: 'ABCDEFGHIJKLM', seq: 1 },
      code: 'invalid_sku',
      source: 'bad input: too long for a label',
    },
  ] as { parts: LotCodeParts; code: string; source: string }[])(
    'rejects $parts with $code ($source)',
    ({ parts, code }) => {
      expect(() => formatLotCode(parts)).toThrow(expect.objectContaining({ code }))
    },
  )
})

describe('parseLotCode', () => {
  it.each([
    {
      text: '261201-LAV-01',
      expected: { pourDate: '2026-12-01', sku: 'LAV', seq: 1 },
      source: 'product format',
    },
    {
      text: ' 270109-oat-hny-12 ',
      expected: { pourDate: '2027-01-09', sku: 'OAT-HNY', seq: 12 },
      source: 'product rule: any case',
    },
    { text: '260230-LAV-01', expected: null, source: 'bad input: no 30 February' },
    { text: '261201-LAV-00', expected: null, source: 'bad input: sequence 0' },
    { text: '261201-LAV-1', expected: null, source: 'bad input: one digit' },
    { text: '261201--01', expected: null, source: 'bad input: no SKU' },
    { text: '261201-LAV--01', expected: null, source: 'bad input' },
    { text: '20261201-LAV-01', expected: null, source: 'bad input: four-digit year' },
    { text: 'LAV-261201-01', expected: null, source: 'bad input: wrong order' },
  ])('$text → $expected ($source)', ({ text, expected }) => {
    expect(parseLotCode(text)).toEqual(expected)
  })

  it.each([
    { parts: { pourDate: '2026-12-01', sku: 'LAV', seq: 1 }, source: 'product format: round trip' },
    { parts: { pourDate: '2031-07-31', sku: 'RS-9', seq: 45 }, source: 'product format: round trip' },
  ])('parses what it formats: $parts ($source)', ({ parts }) => {
    expect(parseLotCode(formatLotCode(parts))).toEqual(parts)
  })
})
