/**
 * Order numbers read `O26-00042`: the letter O (for order, so it never looks like an invoice
 * number), the two-digit year the order was placed, a hyphen, and the order's sequence within
 * that year, zero-padded to five digits (a sixth digit appears only past 99 999 orders a year).
 * Four-digit years and six-digit sequences belong to invoice numbers (`2026-000042`), so a number
 * read over the phone can only be one of the two. The server hands out the sequence per year.
 */
import { DomainError } from '@shared/domain/errors'

const ORDER_NUMBER = /^O(\d{2})-(\d{5,})$/

export interface OrderNumberParts {
  year: number
  seq: number
}

export function formatOrderNumber(year: number, seq: number): string {
  if (!Number.isSafeInteger(year) || year < 2000 || year > 2099) {
    throw new DomainError('invalid_year', `Order years run 2000–2099 (got ${year})`, 'year')
  }
  if (!Number.isSafeInteger(seq) || seq < 1 || seq > 9_999_999) {
    throw new DomainError(
      'invalid_sequence',
      `The sequence must be a whole number from 1 (got ${seq})`,
      'seq',
    )
  }
  return `O${String(year % 100).padStart(2, '0')}-${String(seq).padStart(5, '0')}`
}

/** The parts of a typed order number (any case, spaces around it ignored), or null. */
export function parseOrderNumber(text: string): OrderNumberParts | null {
  const match = ORDER_NUMBER.exec(text.trim().toUpperCase())
  if (!match) return null
  const year = 2000 + Number(match[1])
  const seq = Number(match[2])
  if (seq < 1 || seq > 9_999_999) return null
  // One spelling per order: 'O26-000042' is not a second way to write 'O26-00042'.
  return formatOrderNumber(year, seq) === match[0] ? { year, seq } : null
}
