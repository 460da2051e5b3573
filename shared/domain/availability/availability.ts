import { DomainError } from '@shared/domain/errors'
import { addDays, compareIso, daysBetween } from '@shared/domain/dates/dates'

/** Cold-process bars cure 4–6 weeks before sale; 28 days is the usual minimum (common practice). */
export const DEFAULT_CURE_DAYS = 28

export type BatchReadiness = 'curing' | 'ready'

/** A batch turns ready on its ready date by the calendar alone: nobody has to flip it. */
export function batchReadiness(batch: { readyDate: string }, today: string): BatchReadiness {
  return compareIso(batch.readyDate, today) <= 0 ? 'ready' : 'curing'
}

export function readyDate(pourDate: string, cureDays: number): string {
  if (!Number.isSafeInteger(cureDays) || cureDays < 0) {
    throw new DomainError(
      'invalid_cure_days',
      `Cure days must be a whole number ≥ 0 (got ${cureDays})`,
      'cureDays',
    )
  }
  return addDays(pourDate, cureDays)
}

export interface CureProgress {
  /** 0 on the pour date (or before), 1 on the ready date (or after). */
  fraction: number
  daysLeft: number
}

export function cureProgress(pourDate: string, readyOn: string, today: string): CureProgress {
  const total = daysBetween(pourDate, readyOn)
  if (total < 0) throw new DomainError('invalid_dates', 'The ready date is before the pour date', 'readyDate')
  const daysLeft = Math.max(0, daysBetween(today, readyOn))
  if (total === 0) return { fraction: compareIso(today, pourDate) >= 0 ? 1 : 0, daysLeft }
  const elapsed = daysBetween(pourDate, today)
  return { fraction: Math.min(1, Math.max(0, elapsed / total)), daysLeft }
}

export interface BatchStock {
  productId: number
  readyDate: string
  /** The batch's free ledger balance (bars not promised to any order). */
  freeBars: number
}

export interface ProductAvailability {
  readyBars: number
  /** The earliest date a curing batch turns ready, with the free bars of every batch ready that day. */
  nextReady: { date: string; bars: number } | null
}

/** Every product in the input gets an entry, so a sold-out product shows 0 rather than vanishing. */
export function availabilityByProduct(
  batches: readonly BatchStock[],
  today: string,
): Map<number, ProductAvailability> {
  const result = new Map<number, ProductAvailability>()
  batches.forEach((batch, i) => {
    if (!Number.isSafeInteger(batch.freeBars) || batch.freeBars < 0) {
      throw new DomainError(
        'invalid_bars',
        `Free bars must be a whole number ≥ 0 (got ${batch.freeBars})`,
        `batches.${i}.freeBars`,
      )
    }
    const entry = result.get(batch.productId) ?? { readyBars: 0, nextReady: null }
    result.set(batch.productId, entry)
    if (batchReadiness(batch, today) === 'ready') {
      entry.readyBars += batch.freeBars
      return
    }
    // A curing batch with nothing free (all written off) promises nothing.
    if (batch.freeBars === 0) return
    const next = entry.nextReady
    const order = next === null ? -1 : compareIso(batch.readyDate, next.date)
    if (next === null || order < 0) entry.nextReady = { date: batch.readyDate, bars: batch.freeBars }
    else if (order === 0) next.bars += batch.freeBars
  })
  return result
}

export function casesFromBars(bars: number, casePack: number): number {
  if (!Number.isSafeInteger(casePack) || casePack < 1) {
    throw new DomainError(
      'invalid_case_pack',
      `Case pack must be a whole number ≥ 1 (got ${casePack})`,
      'casePack',
    )
  }
  if (!Number.isSafeInteger(bars) || bars < 0) {
    throw new DomainError('invalid_bars', `Bars must be a whole number ≥ 0 (got ${bars})`, 'bars')
  }
  return Math.floor(bars / casePack)
}
