import { DomainError } from '@shared/domain/errors'
import { batchReadiness } from '@shared/domain/availability/availability'
import { compareIso } from '@shared/domain/dates/dates'

export interface CuringBatch {
  readyDate: string
  /** The batch's free ledger balance. */
  freeBars: number
}

function requireBars(value: number, min: number, field: string): void {
  if (!Number.isSafeInteger(value) || value < min) {
    throw new DomainError('invalid_bars', `${field} must be a whole number ≥ ${min} (got ${value})`, field)
  }
}

/**
 * The ready date a pre-order of `bars` can be promised for. Pre-orders reserve nothing while the
 * bars cure, so they queue: the free bars of the product's curing batches, taken in ready-date
 * order, first serve the `promisedBars` already promised to earlier pre-orders, then this one.
 * The promise is the earliest ready date by which the running total covers both; null when the
 * curing stock cannot cover it at all. Batches already ready are not curing stock (they are
 * ordered normally), so they are left out.
 */
export function preorderPromiseDate(
  batches: readonly CuringBatch[],
  promisedBars: number,
  bars: number,
  today: string,
): string | null {
  requireBars(promisedBars, 0, 'promisedBars')
  requireBars(bars, 1, 'bars')
  const curing = batches
    .map((batch, i) => {
      requireBars(batch.freeBars, 0, `batches.${i}.freeBars`)
      return batch
    })
    .filter((batch) => batchReadiness(batch, today) === 'curing' && batch.freeBars > 0)
    .sort((a, b) => compareIso(a.readyDate, b.readyDate))
  const needed = promisedBars + bars
  let total = 0
  for (const batch of curing) {
    total += batch.freeBars
    if (total >= needed) return batch.readyDate
  }
  return null
}

/** The bars of curing stock not yet promised to any pre-order (never below zero). */
export function unpromisedCuringBars(
  batches: readonly CuringBatch[],
  promisedBars: number,
  today: string,
): number {
  requireBars(promisedBars, 0, 'promisedBars')
  const curing = batches.reduce((sum, batch, i) => {
    requireBars(batch.freeBars, 0, `batches.${i}.freeBars`)
    return batchReadiness(batch, today) === 'curing' ? sum + batch.freeBars : sum
  }, 0)
  return Math.max(0, curing - promisedBars)
}
