import { describe, expect, it } from 'vitest'
import { DomainError } from '@shared/domain/errors'
import {
  GRAMS_PER,
  formatGrams,
  formatOunces,
  gramsTo,
  toBaseQuantity,
  toGrams,
  type MassUnit,
} from '@shared/domain/units/units'

describe('GRAMS_PER', () => {
  it.each([
    { unit: 'g', grams: 1, source: 'SI definition' },
    { unit: 'kg', grams: 1000, source: 'SI definition' },
    { unit: 'lb', grams: 453.59237, source: 'NIST Handbook 44 App. C (1959 agreement)' },
    { unit: 'oz', grams: 28.349523125, source: 'NIST Handbook 44 App. C (1959 agreement)' },
  ] as const)('1 $unit = $grams g ($source)', ({ unit, grams }) => {
    expect(GRAMS_PER[unit]).toBe(grams)
  })

  it('16 oz is exactly 1 lb (NIST Handbook 44 App. C)', () => {
    expect(16 * GRAMS_PER.oz).toBe(GRAMS_PER.lb)
    expect(gramsTo(toGrams(1, 'lb'), 'oz')).toBe(16)
  })
})

describe('toGrams / gramsTo', () => {
  it.each<{ qty: number; unit: MassUnit; grams: number; source: string }>([
    { qty: 2.5, unit: 'kg', grams: 2500, source: 'SI definition' },
    { qty: 1, unit: 'lb', grams: 453.59237, source: 'NIST Handbook 44 App. C' },
    // 50 lb sack of coconut oil: 50 × 453.59237 = 22 679.6185 g
    { qty: 50, unit: 'lb', grams: 22679.6185, source: 'hand calculation' },
    // 4 oz bar: 4 × 28.349523125 = 113.3980925 g
    { qty: 4, unit: 'oz', grams: 113.3980925, source: 'hand calculation' },
    { qty: 0, unit: 'oz', grams: 0, source: 'hand calculation' },
  ])('$qty $unit = $grams g ($source)', ({ qty, unit, grams }) => {
    expect(toGrams(qty, unit)).toBeCloseTo(grams, 9)
    expect(gramsTo(grams, unit)).toBeCloseTo(qty, 9)
  })

  it.each<{ call: () => unknown; field: string; source: string }>([
    { call: () => toGrams(-1, 'g'), field: 'qty', source: 'hand calculation' },
    { call: () => toGrams(Number.NaN, 'kg'), field: 'qty', source: 'hand calculation' },
    { call: () => gramsTo(-0.5, 'oz'), field: 'grams', source: 'hand calculation' },
    { call: () => toBaseQuantity(-3, 'each'), field: 'qty', source: 'hand calculation' },
  ])('rejects bad input on $field ($source)', ({ call, field }) => {
    expect(call).toThrow(DomainError)
    expect(call).toThrow(expect.objectContaining({ field }))
  })
})

describe('toBaseQuantity', () => {
  it.each([
    { qty: 2, unit: 'lb', quantity: 907.18474, baseUnit: 'g', source: 'NIST Handbook 44 App. C' },
    { qty: 0.75, unit: 'kg', quantity: 750, baseUnit: 'g', source: 'SI definition' },
    { qty: 500, unit: 'each', quantity: 500, baseUnit: 'each', source: 'hand calculation' },
  ] as const)('$qty $unit → $quantity $baseUnit ($source)', ({ qty, unit, quantity, baseUnit }) => {
    const result = toBaseQuantity(qty, unit)
    expect(result.baseUnit).toBe(baseUnit)
    expect(result.quantity).toBeCloseTo(quantity, 9)
  })
})

describe('formatGrams / formatOunces', () => {
  it.each([
    { grams: 1234.56, text: '1,234.6 g', source: 'hand calculation' },
    { grams: 0, text: '0.0 g', source: 'hand calculation' },
    { grams: 70.6325, text: '70.6 g', source: 'hand calculation' },
  ])('formatGrams($grams) = $text ($source)', ({ grams, text }) => {
    expect(formatGrams(grams)).toBe(text)
  })

  it.each([
    // 113.3980925 g ÷ 28.349523125 = 4 oz exactly
    { grams: 113.3980925, text: '4.00 oz', source: 'NIST Handbook 44 App. C' },
    // 500 g ÷ 28.349523125 = 17.6370… oz
    { grams: 500, text: '17.64 oz', source: 'hand calculation' },
    { grams: 453.59237 * 3, text: '48.00 oz', source: 'NIST Handbook 44 App. C' },
  ])('formatOunces($grams) = $text ($source)', ({ grams, text }) => {
    expect(formatOunces(grams)).toBe(text)
  })
})
