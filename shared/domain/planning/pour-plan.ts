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

// ---- one product's plan ------------------------------------------------------------------------

export interface ProductPlanInput {
  productId: number
  cureDays: number
  /** Bars one mould of the recipe gives to sell (bars cut less the end slices kept back). */
  sellableBarsPerMould: number
  /** Free bars in ready batches today. */
  readyBars: number
  /** Free bars of batches still curing, by ready date. */
  curing: readonly { readyDate: string; bars: number }[]
  /** Pours the owner has planned and not yet poured: they join the shelf once cured. */
  planned: readonly { pourDate: string; bars: number }[]
  /** Bars ordered per week over the demand window (see weeklyDemand). */
  weeklyDemandBars: number
  /** Bars of open pre-orders still waiting for stock: they take curing bars first, then ready ones. */
  preorderBars: number
}

export interface PlanOptions {
  today: string
  leadTimeDays: number
  /** Weeks of demand a suggested pour should cover once the shelf would empty. */
  coverWeeks: number
  /** Only pours whose latest date falls within this many weeks are suggested. */
  horizonWeeks: number
}

export interface ProductPlan {
  productId: number
  weeklyDemandBars: number
  /** Pre-order bars that neither ready nor curing stock (nor planned pours) can cover. */
  uncoveredPreorderBars: number
  runOutDate: string | null
  latestPourDate: string | null
  /** The suggested pour, or null when stock lasts past the horizon (or nothing is ordered). */
  suggestion: {
    /** The day to pour by: the latest pour date, or today when that date has passed. */
    pourBy: string
    /** True when the latest pour date has passed: the shelf will be empty for a while. */
    late: boolean
    moulds: number
    bars: number
  } | null
}

/**
 * A product's run-out date, latest pour date and suggested pour. Pre-orders take their bars off
 * the supply first (the earliest curing batches, then ready stock), since they wait for exactly
 * those bars; what no supply covers is short today. Planned pours count as curing batches ready
 * on their pour date + cure days. The suggestion covers `coverWeeks` of demand after the run-out
 * date plus any uncovered pre-orders, less the bars that turn ready after the run-out date, in
 * whole moulds; none when those later bars already cover it.
 */
export function planProduct(input: ProductPlanInput, opts: PlanOptions): ProductPlan {
  requireWhole(input.preorderBars, 0, 'invalid_bars', 'preorderBars')
  requireWhole(input.sellableBarsPerMould, 1, 'invalid_bars', 'sellableBarsPerMould')
  requireWhole(opts.coverWeeks, 1, 'invalid_weeks', 'coverWeeks')
  requireWhole(opts.horizonWeeks, 1, 'invalid_weeks', 'horizonWeeks')
  const supply = [
    ...input.curing.map((c) => ({ readyDate: c.readyDate, bars: c.bars })),
    ...input.planned.map((p) => ({ readyDate: readyDateOf(p.pourDate, input.cureDays), bars: p.bars })),
  ].sort((a, b) => compareIso(a.readyDate, b.readyDate))
  let owed = input.preorderBars
  for (const s of supply) {
    const take = Math.min(owed, s.bars)
    s.bars -= take
    owed -= take
  }
  let readyBars = input.readyBars
  const fromReady = Math.min(owed, readyBars)
  readyBars -= fromReady
  owed -= fromReady

  const base = {
    productId: input.productId,
    weeklyDemandBars: input.weeklyDemandBars,
    uncoveredPreorderBars: owed,
  }
  const runOut =
    owed > 0
      ? opts.today
      : runOutDate({
          today: opts.today,
          readyBars,
          curing: supply.filter((s) => s.bars > 0),
          weeklyDemandBars: input.weeklyDemandBars,
        })
  if (runOut === null) return { ...base, runOutDate: null, latestPourDate: null, suggestion: null }
  const latest = latestPourDate(runOut, input.cureDays, opts.leadTimeDays)
  if (compareIso(latest, addDays(opts.today, opts.horizonWeeks * 7)) > 0) {
    return { ...base, runOutDate: runOut, latestPourDate: latest, suggestion: null }
  }
  // Bars that turn ready after the shelf has emptied (a late batch, a planned pour) still serve
  // the weeks the new pour is to cover: they come off what it must make.
  const arrivingLater = supply
    .filter((s) => compareIso(s.readyDate, runOut) > 0)
    .reduce((n, s) => n + s.bars, 0)
  const short = owed + Math.ceil(input.weeklyDemandBars * opts.coverWeeks - 1e-9) - arrivingLater
  if (short <= 0) return { ...base, runOutDate: runOut, latestPourDate: latest, suggestion: null }
  const moulds = suggestedBatchCount(short, input.sellableBarsPerMould)
  const late = compareIso(latest, opts.today) < 0
  return {
    ...base,
    runOutDate: runOut,
    latestPourDate: latest,
    suggestion: {
      pourBy: late ? opts.today : latest,
      late,
      moulds,
      bars: moulds * input.sellableBarsPerMould,
    },
  }
}

function readyDateOf(pourDate: string, cureDays: number): string {
  requireWhole(cureDays, 0, 'invalid_cure_days', 'cureDays')
  return addDays(pourDate, cureDays)
}

/**
 * Ready and curing bars at the start of each of the coming weeks (week 0 is today), with demand
 * taken off the shelf evenly day by day; the shelf never goes below zero (orders then wait).
 */
export function stockOutlook(
  input: Pick<ProductPlanInput, 'readyBars' | 'curing' | 'weeklyDemandBars'>,
  today: string,
  weeks: number,
): { weekStart: string; readyBars: number; curingBars: number }[] {
  requireWhole(weeks, 1, 'invalid_weeks', 'weeks')
  const arrivals = input.curing.map((c) => ({
    day: Math.max(0, daysBetween(today, c.readyDate)),
    bars: c.bars,
  }))
  const out: { weekStart: string; readyBars: number; curingBars: number }[] = []
  let shelf = input.readyBars
  for (let day = 0; day < weeks * 7; day++) {
    for (const a of arrivals) if (a.day === day) shelf += a.bars
    if (day % 7 === 0) {
      const curingBars = arrivals.filter((a) => a.day > day).reduce((s, a) => s + a.bars, 0)
      out.push({ weekStart: addDays(today, day), readyBars: Math.floor(shelf), curingBars })
    }
    shelf = Math.max(0, shelf - input.weeklyDemandBars / 7)
  }
  return out
}
