import { DomainError } from '@shared/domain/errors'
import { addDays, compareIso, daysBetween } from '@shared/domain/dates/dates'

function requireWhole(value: number, min: number, code: string, field: string): void {
  if (!Number.isSafeInteger(value) || value < min) {
    throw new DomainError(code, `${field} must be a whole number ≥ ${min} (got ${value})`, field)
  }
}

export interface RunOutInput {
  today: string
  /** Free bars in ready batches now. */
  readyBars: number
  /** Batches not yet ready: their free bars join the shelf at the start of their ready date. */
  curing: readonly { readyDate: string; bars: number }[]
  weeklyDemandBars: number
}

/**
 * The date the shelf first empties if orders take `weeklyDemandBars` a week, spread evenly over
 * the days from the start of today. A curing batch that turns ready before the shelf is empty
 * extends it; one that turns ready after the shelf has emptied does not move the date (the gap
 * is what the plan must avoid). A batch ready on the very day the shelf would empty arrives in
 * time. Null when there is no demand.
 */
export function runOutDate(input: RunOutInput): string | null {
  const { today, readyBars, curing, weeklyDemandBars } = input
  requireWhole(readyBars, 0, 'invalid_bars', 'readyBars')
  if (typeof weeklyDemandBars !== 'number' || !Number.isFinite(weeklyDemandBars) || weeklyDemandBars < 0) {
    throw new DomainError(
      'invalid_demand',
      `Weekly demand must be ≥ 0 bars (got ${weeklyDemandBars})`,
      'weeklyDemandBars',
    )
  }
  const arrivals = curing
    .map((c, i) => {
      requireWhole(c.bars, 0, 'invalid_bars', `curing.${i}.bars`)
      return { day: Math.max(0, daysBetween(today, c.readyDate)), bars: c.bars }
    })
    .sort((a, b) => a.day - b.day)
  if (weeklyDemandBars === 0) return null

  // Seven times the bars on the shelf: a day's demand is then the weekly figure, and whole
  // weekly figures keep every step in exact integers.
  let shelf7 = 7 * readyBars
  let day = 0
  for (const arrival of arrivals) {
    const beforeArrival = shelf7 - weeklyDemandBars * (arrival.day - day)
    if (beforeArrival < 0) break
    shelf7 = beforeArrival + 7 * arrival.bars
    day = arrival.day
  }
  return addDays(today, day + Math.floor(shelf7 / weeklyDemandBars))
}

/** The last day to pour so the batch has cured, with `leadTimeDays` to spare, by `runOut`. */
export function latestPourDate(runOut: string, cureDays: number, leadTimeDays: number): string {
  requireWhole(cureDays, 0, 'invalid_cure_days', 'cureDays')
  requireWhole(leadTimeDays, 0, 'invalid_days', 'leadTimeDays')
  return addDays(runOut, -(cureDays + leadTimeDays))
}

/** Whole batches to pour to cover a shortfall; 0 when nothing is short. */
export function suggestedBatchCount(shortBars: number, barsPerMould: number): number {
  requireWhole(barsPerMould, 1, 'invalid_bars', 'barsPerMould')
  if (typeof shortBars !== 'number' || !Number.isFinite(shortBars)) {
    throw new DomainError('invalid_bars', `Short bars must be a number (got ${shortBars})`, 'shortBars')
  }
  return shortBars <= 0 ? 0 : Math.ceil(shortBars / barsPerMould)
}

/** Bars ordered per week over a window, both end dates included. */
export function weeklyDemand(
  orders: readonly { date: string; bars: number }[],
  windowStart: string,
  windowEnd: string,
): number {
  const days = daysBetween(windowStart, windowEnd) + 1
  if (days < 1) throw new DomainError('invalid_window', 'The window ends before it starts', 'windowEnd')
  let bars = 0
  orders.forEach((order, i) => {
    requireWhole(order.bars, 0, 'invalid_bars', `orders.${i}.bars`)
    if (compareIso(order.date, windowStart) >= 0 && compareIso(order.date, windowEnd) <= 0) bars += order.bars
  })
  return (bars * 7) / days
}
