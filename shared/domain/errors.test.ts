import { describe, expect, it } from 'vitest'
import {
  DomainError,
  requireFinite,
  requireInRange,
  requireInteger,
  requireNonNegative,
  requirePositive,
} from '@shared/domain/errors'

describe('DomainError', () => {
  it('is an Error carrying a code and a field (hand calculation)', () => {
    const error = new DomainError('out_of_range', 'superfatPct must be between 0 and 20', 'superfatPct')
    expect(error).toBeInstanceOf(Error)
    expect(error).toMatchObject({ name: 'DomainError', code: 'out_of_range', field: 'superfatPct' })
    expect(new DomainError('x', 'no field').field).toBeUndefined()
  })
})

describe('guards', () => {
  it.each([
    { call: () => requireFinite(Number.NaN, 'a'), code: 'invalid_number', source: 'hand calculation' },
    {
      call: () => requireFinite(Number.POSITIVE_INFINITY, 'a'),
      code: 'invalid_number',
      source: 'hand calculation',
    },
    { call: () => requireNonNegative(-0.001, 'a'), code: 'negative', source: 'hand calculation' },
    { call: () => requirePositive(0, 'a'), code: 'not_positive', source: 'hand calculation' },
    { call: () => requireInteger(1.5, 'a'), code: 'not_integer', source: 'hand calculation' },
    { call: () => requireInteger(0, 'a', 1), code: 'out_of_range', source: 'hand calculation' },
    {
      call: () => requireInRange(20.01, { min: 0, max: 20 }, 'a'),
      code: 'out_of_range',
      source: 'hand calculation',
    },
  ])('$code ($source)', ({ call, code }) => {
    expect(call).toThrow(expect.objectContaining({ name: 'DomainError', code, field: 'a' }))
  })

  it.each([
    { call: () => requireNonNegative(0, 'a'), value: 0, source: 'hand calculation' },
    { call: () => requireInRange(20, { min: 0, max: 20 }, 'a'), value: 20, source: 'hand calculation' },
    { call: () => requireInRange(0, { min: 0, max: 20 }, 'a'), value: 0, source: 'hand calculation' },
    { call: () => requireInteger(1, 'a', 1), value: 1, source: 'hand calculation' },
  ])('passes $value through ($source)', ({ call, value }) => {
    expect(call()).toBe(value)
  })
})
