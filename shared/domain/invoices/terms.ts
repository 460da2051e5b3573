import { DomainError } from '@shared/domain/errors'
import { percentOf } from '@shared/domain/money/money'
import { addDays, compareIso, daysBetween } from '@shared/domain/dates/dates'

export const PAYMENT_TERMS = ['prepay', 'net_15', 'net_30'] as const
export type PaymentTerms = (typeof PAYMENT_TERMS)[number]

/** Days from the invoice date to the due date: net N is due N days after it (common practice). */
export const TERM_DAYS: Readonly<Record<PaymentTerms, number>> = { prepay: 0, net_15: 15, net_30: 30 }

export function isPaymentTerms(value: unknown): value is PaymentTerms {
  return (PAYMENT_TERMS as readonly unknown[]).includes(value)
}

export function dueDate(issueDate: string, terms: PaymentTerms): string {
  if (!isPaymentTerms(terms))
    throw new DomainError('invalid_terms', `Unknown payment terms: ${String(terms)}`, 'terms')
  return addDays(issueDate, TERM_DAYS[terms])
}

export type InvoiceStatus = 'open' | 'part_paid' | 'paid' | 'overdue' | 'void'

export interface InvoiceAmounts {
  totalCents: number
  paidCents: number
  dueDate: string
  voided: boolean
}

function requireCents(value: number, field: string): void {
  if (!Number.isSafeInteger(value) || value < 0) {
    throw new DomainError('invalid_amount', `${field} must be whole cents ≥ 0 (got ${value})`, field)
  }
}

export function outstandingCents(invoice: InvoiceAmounts): number {
  requireCents(invoice.totalCents, 'totalCents')
  requireCents(invoice.paidCents, 'paidCents')
  return invoice.voided ? 0 : Math.max(0, invoice.totalCents - invoice.paidCents)
}

/**
 * void beats everything; then paid (in full or over); then overdue, which outranks part paid
 * because money still missing after the due date is the fact to act on. Due on the due date,
 * overdue from the day after.
 */
export function invoiceStatus(invoice: InvoiceAmounts, today: string): InvoiceStatus {
  const outstanding = outstandingCents(invoice)
  if (invoice.voided) return 'void'
  if (outstanding === 0) return 'paid'
  if (compareIso(today, invoice.dueDate) > 0) return 'overdue'
  return invoice.paidCents > 0 ? 'part_paid' : 'open'
}

export const AGEING_BUCKETS = ['current', '1_30', '31_60', '61_90', 'over_90'] as const
export type AgeingBucket = (typeof AGEING_BUCKETS)[number]

/** By days past due: 0 or less is current, then 1–30, 31–60, 61–90, over 90. */
export function ageingBucket(due: string, today: string): AgeingBucket {
  const late = daysBetween(due, today)
  if (late <= 0) return 'current'
  if (late <= 30) return '1_30'
  if (late <= 60) return '31_60'
  if (late <= 90) return '61_90'
  return 'over_90'
}

export interface Ageing {
  byBucket: Record<AgeingBucket, number>
  outstandingCents: number
}

/** Outstanding cents per bucket; void and paid invoices add nothing. */
export function ageing(invoices: readonly InvoiceAmounts[], today: string): Ageing {
  const byBucket: Record<AgeingBucket, number> = { current: 0, '1_30': 0, '31_60': 0, '61_90': 0, over_90: 0 }
  let total = 0
  for (const invoice of invoices) {
    const owed = outstandingCents(invoice)
    if (owed === 0) continue
    byBucket[ageingBucket(invoice.dueDate, today)] += owed
    total += owed
  }
  return { byBucket, outstandingCents: total }
}

/**
 * Terms like 2/10 net 30: `discountPct` off the invoice total when paid within `discountDays` of
 * the invoice date (REFERENCES: 2/10 net 30), the last day included (common practice). Rounded
 * half up to the cent.
 */
export function earlyPaymentDiscount(input: {
  totalCents: number
  issueDate: string
  paidOn: string
  discountPct: number
  discountDays: number
}): number {
  requireCents(input.totalCents, 'totalCents')
  if (typeof input.discountPct !== 'number' || !(input.discountPct >= 0 && input.discountPct <= 100)) {
    throw new DomainError(
      'invalid_discount',
      `Discount must be 0–100 % (got ${input.discountPct})`,
      'discountPct',
    )
  }
  if (!Number.isSafeInteger(input.discountDays) || input.discountDays < 0) {
    throw new DomainError('invalid_days', `Discount days must be a whole number ≥ 0`, 'discountDays')
  }
  const days = daysBetween(input.issueDate, input.paidOn)
  if (days > input.discountDays) return 0
  return percentOf(input.totalCents, input.discountPct)
}

/**
 * Invoice numbers read `2026-000123`: the four-digit year of the invoice date, a hyphen, and the
 * invoice's place in that year's series, zero-padded to six digits; the studio's optional prefix
 * (settings: 1–6 capital letters or digits, starting with a letter) goes in front with a hyphen,
 * `SB-2026-000123`. One series per year, gapless (Council Directive 2006/112/EC, Art. 226(2),
 * asks for a sequential number; some national laws add "without gaps"): the server hands out the
 * next sequence inside the transaction that issues the invoice.
 */
const PREFIX = /^[A-Z][A-Z0-9]{0,5}$/

function requirePrefix(prefix: string): void {
  if (prefix !== '' && !PREFIX.test(prefix)) {
    throw new DomainError(
      'invalid_prefix',
      'An invoice prefix is 1–6 capital letters or digits, starting with a letter',
      'prefix',
    )
  }
}

export function formatInvoiceNumber(year: number, seq: number, prefix = ''): string {
  requirePrefix(prefix)
  if (!Number.isSafeInteger(year) || year < 1000 || year > 9999) {
    throw new DomainError('invalid_year', `An invoice year has four digits (got ${year})`, 'year')
  }
  if (!Number.isSafeInteger(seq) || seq < 1 || seq > 999_999) {
    throw new DomainError('invalid_sequence', `The sequence runs 1–999999 (got ${seq})`, 'seq')
  }
  return `${prefix === '' ? '' : `${prefix}-`}${year}-${String(seq).padStart(6, '0')}`
}

export function parseInvoiceNumber(text: string, prefix = ''): { year: number; seq: number } | null {
  requirePrefix(prefix)
  const lead = prefix === '' ? '' : `${prefix}-`
  const clean = text.trim().toUpperCase()
  if (!clean.startsWith(lead)) return null
  const match = /^(\d{4})-(\d{6})$/.exec(clean.slice(lead.length))
  if (!match) return null
  const year = Number(match[1])
  const seq = Number(match[2])
  return year >= 1000 && seq >= 1 ? { year, seq } : null
}

/**
 * Checks one year's issued sequences: numbers skipped below the highest, and numbers used twice.
 * Both lists are empty for a gapless series.
 */
export function checkInvoiceSeries(seqs: readonly number[]): { missing: number[]; duplicated: number[] } {
  const issued = new Set<number>()
  const duplicated = new Set<number>()
  let highest = 0
  seqs.forEach((seq, i) => {
    if (!Number.isSafeInteger(seq) || seq < 1 || seq > 999_999) {
      throw new DomainError('invalid_sequence', `The sequence runs 1–999999 (got ${seq})`, `seqs.${i}`)
    }
    if (issued.has(seq)) duplicated.add(seq)
    issued.add(seq)
    highest = Math.max(highest, seq)
  })
  const missing: number[] = []
  for (let seq = 1; seq <= highest; seq++) if (!issued.has(seq)) missing.push(seq)
  return { missing, duplicated: [...duplicated].sort((a, b) => a - b) }
}
