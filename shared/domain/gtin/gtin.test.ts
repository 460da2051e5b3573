import { describe, expect, it } from 'vitest'
import { DomainError } from '@shared/domain/errors'
import { gtinCheckDigit, isValidGtin } from '@shared/domain/gtin/gtin'

// Weights run 3, 1, 3, … from the rightmost data digit; check = (10 − sum mod 10) mod 10.
describe('gtinCheckDigit', () => {
  it.each([
    // 1·3 + 2·1 + 0·3 + 0·1 + 5·3 + 1·1 + 4·3 + 0·1 + 1·3 + 9·1 + 2·3 + 6·1 = 57 → 3
    { data: '629104150021', check: 3, kind: 'GTIN-13', source: 'GS1 General Specifications' },
    // 3·3 + 9 + 3·3 + 3 + 3·3 + 1 + 8·3 + 3 + 6·3 + 0 + 0·3 + 4 = 89 → 1
    { data: '400638133393', check: 1, kind: 'GTIN-13', source: 'hand calculation' },
    // 5·3 + 4 + 1·3 + 9 + 2·3 + 0 + 0 + 0 + 6·3 + 3 + 0 = 58 → 2
    { data: '03600029145', check: 2, kind: 'GTIN-12', source: 'hand calculation' },
    // 7·3 + 0 + 5·3 + 8 + 3·3 + 6 + 9·3 = 86 → 4
    { data: '9638507', check: 4, kind: 'GTIN-8', source: 'hand calculation' },
    // 3·3 + 2 + 1·3 + 0 + 9·3 + 8 + 7·3 + 6 + 5·3 + 4 + 3·3 + 2 + 1·3 = 109 → 1
    { data: '1234567890123', check: 1, kind: 'GTIN-14', source: 'hand calculation' },
    // 5·3 + 5 = 20 → (10 − 0) mod 10 = 0
    { data: '0000055', check: 0, kind: 'GTIN-8', source: 'hand calculation' },
    { data: '00000000000', check: 0, kind: 'GTIN-12', source: 'hand calculation' },
  ])('$kind $data → $check ($source)', ({ data, check }) => {
    expect(gtinCheckDigit(data)).toBe(check)
    expect(isValidGtin(`${data}${check}`)).toBe(true)
    expect(isValidGtin(`${data}${(check + 1) % 10}`)).toBe(false)
  })

  it.each([
    { data: '123456', source: 'GS1 General Specifications' },
    { data: '62910415002a', source: 'hand calculation' },
    { data: '', source: 'hand calculation' },
    { data: '12345678901234', source: 'GS1 General Specifications' },
  ])('rejects data "$data" ($source)', ({ data }) => {
    expect(() => gtinCheckDigit(data)).toThrow(DomainError)
    expect(() => gtinCheckDigit(data)).toThrow(expect.objectContaining({ field: 'gtin' }))
  })
})

describe('isValidGtin', () => {
  it.each([
    { code: '6291041500213', valid: true, source: 'GS1 General Specifications' },
    { code: '6291041500214', valid: false, source: 'GS1 General Specifications' },
    { code: '4006381333931', valid: true, source: 'hand calculation' },
    { code: '036000291452', valid: true, source: 'hand calculation' },
    { code: '96385074', valid: true, source: 'hand calculation' },
    { code: '12345678901231', valid: true, source: 'hand calculation' },
    // lengths GS1 does not define for a GTIN
    { code: '6291041', valid: false, source: 'GS1 General Specifications' },
    // as a GTIN-12 its data 62910415002 sums to 66, so its check digit would be 4, not 1
    { code: '629104150021', valid: false, source: 'hand calculation' },
    { code: '123456789012345', valid: false, source: 'GS1 General Specifications' },
    { code: '', valid: false, source: 'hand calculation' },
    { code: ' 6291041500213', valid: false, source: 'hand calculation' },
    { code: '6291-041500213', valid: false, source: 'hand calculation' },
    { code: '６２９１０４１５００２１３', valid: false, source: 'hand calculation' },
  ])('"$code" → $valid ($source)', ({ code, valid }) => {
    expect(isValidGtin(code)).toBe(valid)
  })
})
