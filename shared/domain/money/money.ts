import { DomainError, requireFinite, requireInteger } from '@shared/domain/errors'

// The one money helper: every stored or displayed amount is an integer number of cents
// (hundredths of the studio's currency). Intermediate costs (0.37 cents per gram of olive oil)
// may be fractional; they become cents through roundHalfUp or a ceil before they are stored.

/** Throws unless `n` is a whole, exactly representable number of cents. */
export function assertCents(n: number, field = 'cents'): void {
  if (!Number.isSafeInteger(n)) {
    throw new DomainError('not_integer_cents', `${field} must be a whole number of cents (got ${n})`, field)
  }
}

/**
 * Drops binary noise left by decimal inputs (3000 × 1.15 / 100 = 34.49999999999999) by keeping
 * 15 significant digits, the most a double always carries, so a true half rounds as a half.
 */
export function stripFloatNoise(x: number): number {
  return x === 0 ? 0 : Number(x.toPrecision(15))
}

/** Nearest integer, halves away from zero (2.5 → 3, −2.5 → −3). */
export function roundHalfUp(x: number): number {
  requireFinite(x, 'value')
  const clean = stripFloatNoise(x)
  const r = Math.sign(clean) * Math.floor(Math.abs(clean) + 0.5)
  return r === 0 ? 0 : r
}

const currencyFormatters = new Map<string, Intl.NumberFormat>()

/**
 * "$1,234.56" for 123456. Only currencies with two minor digits are accepted: for yen or dinar
 * "cents" would not mean hundredths, and a silent factor of 100 on an invoice is worse than an error.
 */
export function formatCents(cents: number, currency = 'USD', locale = 'en-US'): string {
  assertCents(cents)
  const key = `${locale}|${currency}`
  let f = currencyFormatters.get(key)
  if (!f) {
    f = new Intl.NumberFormat(locale, { style: 'currency', currency })
    if (f.resolvedOptions().maximumFractionDigits !== 2) {
      throw new DomainError(
        'unsupported_currency',
        `${currency} does not have two decimal places; amounts are kept in hundredths`,
        'currency',
      )
    }
    currencyFormatters.set(key, f)
  }
  // Division by 100 of a safe integer is correctly rounded, so formatting to 2 places is exact.
  return f.format(cents / 100)
}

// "12", "12.5", "12.50", ".50", "$1,234.56", "1234.56": grouping commas only in groups of three.
const MONEY_TEXT = /^\$?\s*(\d{1,3}(?:,\d{3})+|\d+)?(?:\.(\d{1,2}))?$/

/**
 * Typed money to cents, or null for anything that is not a plain non-negative amount in the
 * US form (no minus sign, no more than two decimals, no stray characters).
 */
export function parseMoneyToCents(text: string): number | null {
  const match = MONEY_TEXT.exec(text.trim())
  if (!match) return null
  const [, whole, fraction] = match
  if (whole === undefined && fraction === undefined) return null
  const units = whole === undefined ? 0 : Number(whole.replaceAll(',', ''))
  const cents = units * 100 + (fraction === undefined ? 0 : Number(fraction.padEnd(2, '0')))
  return Number.isSafeInteger(cents) ? cents : null
}

/** Smallest multiple of `stepCents` that is ≥ `cents` (a price step of 25 turns 1654 into 1675). */
export function roundUpToStep(cents: number, stepCents: number): number {
  assertCents(cents)
  requireInteger(stepCents, 'stepCents', 1)
  const r = cents % stepCents
  if (r === 0) return cents
  // Remainders take the sign of `cents`: step up from a positive remainder, drop a negative one.
  return r > 0 ? cents + (stepCents - r) : cents - r
}

export function sumCents(values: readonly number[]): number {
  let total = 0
  values.forEach((v, i) => {
    assertCents(v, `values.${i}`)
    total += v
  })
  assertCents(total, 'total')
  return total
}

/** `pct` percent of an amount, rounded half up to whole cents (8.875 % of $10.00 = 89 ¢). */
export function percentOf(cents: number, pct: number): number {
  assertCents(cents)
  requireFinite(pct, 'pct')
  return roundHalfUp((cents * pct) / 100)
}
