import { render, screen } from '@testing-library/react'
import { describe, expect, it } from 'vitest'
import { Money, formatMoney } from '@/components/ui/money'

describe('formatMoney', () => {
  it.each([
    { cents: 450, currency: 'USD', expected: '$4.50' },
    { cents: 123456, currency: 'USD', expected: '$1,234.56' },
    { cents: 0, currency: 'USD', expected: '$0.00' },
    { cents: -1999, currency: 'USD', expected: '-$19.99' },
    { cents: 1050, currency: 'EUR', expected: '€10.50' },
    // The yen has no minor unit (ISO 4217 exponent 0): 500 is ¥500, not ¥5.
    { cents: 500, currency: 'JPY', expected: '¥500' },
  ])('$cents in $currency is $expected', ({ cents, currency, expected }) => {
    expect(formatMoney(cents, currency, 'en-US')).toBe(expected)
  })
})

describe('Money', () => {
  it('shows cents as dollars by default, with tabular figures', () => {
    render(<Money cents={2599} locale="en-US" />)
    const amount = screen.getByText('$25.99')
    expect(amount).toHaveClass('tabular-nums')
  })
})
