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
  ])('$cents in $currency is $expected', ({ cents, currency, expected }) => {
    expect(formatMoney(cents, currency, 'en-US')).toBe(expected)
  })
})

describe('formatMoney refuses what it cannot show exactly', () => {
  it('a currency without hundredths (ISO 4217 exponent 0, e.g. JPY) is refused, not shown off by 100', () => {
    expect(() => formatMoney(500, 'JPY')).toThrow(/two decimal places/)
  })
})

describe('Money', () => {
  it('shows cents in the currency given, with tabular figures', () => {
    render(<Money cents={2599} currency="USD" locale="en-US" />)
    const amount = screen.getByText('$25.99')
    expect(amount).toHaveClass('tabular-nums')
  })
})
