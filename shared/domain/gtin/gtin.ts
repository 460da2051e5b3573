import { DomainError } from '@shared/domain/errors'

/** GTIN-8, GTIN-12 (UPC-A), GTIN-13 (EAN-13) and GTIN-14, check digit included. */
export const GTIN_LENGTHS: readonly number[] = Object.freeze([8, 12, 13, 14])

/**
 * GS1 General Specifications check digit: weights 3 and 1 alternate from the rightmost data
 * digit (which gets 3); check = (10 − sum mod 10) mod 10. `dataDigits` is the code without its
 * check digit: 7, 11, 12 or 13 digits.
 */
export function gtinCheckDigit(dataDigits: string): number {
  if (!/^\d+$/.test(dataDigits) || !GTIN_LENGTHS.includes(dataDigits.length + 1)) {
    throw new DomainError('invalid_gtin', 'A GTIN without its check digit is 7, 11, 12 or 13 digits', 'gtin')
  }
  let sum = 0
  for (let i = 0; i < dataDigits.length; i++) {
    const digit = dataDigits.charCodeAt(dataDigits.length - 1 - i) - 48
    sum += i % 2 === 0 ? digit * 3 : digit
  }
  return (10 - (sum % 10)) % 10
}

/** Digits only (no spaces), 8, 12, 13 or 14 of them, and the last one is the right check digit. */
export function isValidGtin(code: string): boolean {
  if (!/^\d+$/.test(code) || !GTIN_LENGTHS.includes(code.length)) return false
  return gtinCheckDigit(code.slice(0, -1)) === Number(code.at(-1))
}
