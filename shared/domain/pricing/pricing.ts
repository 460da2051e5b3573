import { DomainError, requireFinite, requireNonNegative, requirePositive } from '@shared/domain/errors'
import { assertCents, roundUpToStep, stripFloatNoise } from '@shared/domain/money/money'

/** Margins are a share of the selling price, so 100 % or more is impossible. */
export const MARGIN_RANGE = Object.freeze({ min: 0, maxExclusive: 100 })

function requireMargin(marginPct: number, field: string): number {
  requireFinite(marginPct, field)
  if (marginPct < MARGIN_RANGE.min || marginPct >= MARGIN_RANGE.maxExclusive) {
    throw new DomainError(
      'out_of_range',
      `${field} must be at least 0 and below 100 (got ${marginPct})`,
      field,
    )
  }
  return marginPct
}

/**
 * The lowest price on the studio's price step that earns `marginPct` on the price:
 * cost ÷ (1 − margin), up to the next whole cent, then up to the step.
 */
export function suggestedUnitPriceCents(costCents: number, marginPct: number, stepCents: number): number {
  requireNonNegative(costCents, 'costCents')
  requireMargin(marginPct, 'marginPct')
  // 100 − 99.9 is 0.0999999999999943 in binary: the cancellation noise is absolute, so the
  // divisor is cleaned to a fixed 9 decimals (no margin is set finer), the quotient relatively.
  const keptPct = Number((100 - marginPct).toFixed(9))
  const raw = stripFloatNoise((costCents * 100) / keptPct)
  return roundUpToStep(Math.ceil(raw), stepCents)
}

/**
 * Keystone: retail = 2 × wholesale, a 100 % markup on the shop's cost or a 50 % margin on retail
 * (Monash Business School, Marketing Dictionary, "keystone pricing").
 */
export function keystoneMsrpCents(wholesaleCents: number): number {
  assertCents(wholesaleCents, 'wholesaleCents')
  requireNonNegative(wholesaleCents, 'wholesaleCents')
  return 2 * wholesaleCents
}

/** Margin on the selling price, percent: (price − cost) ÷ price × 100. Negative below cost. */
export function marginPct(priceCents: number, costCents: number): number {
  requirePositive(priceCents, 'priceCents')
  requireNonNegative(costCents, 'costCents')
  return ((priceCents - costCents) * 100) / priceCents
}

export type PriceLevel = 'ok' | 'under_margin' | 'under_cost'

/**
 * `under_cost` (the caller refuses the price) when the price is below cost; `under_margin` (the
 * caller warns) when it earns less than the tier's target margin. A price exactly at cost is
 * under margin, not under cost.
 */
export function priceCheck({
  priceCents,
  costCents,
  targetMarginPct,
}: {
  priceCents: number
  costCents: number
  targetMarginPct: number
}): { level: PriceLevel; marginPct: number } {
  requireMargin(targetMarginPct, 'targetMarginPct')
  const margin = marginPct(priceCents, costCents)
  // Compare without float noise, so a price suggested for exactly the target margin passes.
  const level: PriceLevel =
    priceCents < costCents
      ? 'under_cost'
      : stripFloatNoise(margin) < stripFloatNoise(targetMarginPct)
        ? 'under_margin'
        : 'ok'
  return { level, marginPct: margin }
}

export interface PriceBreak {
  minCases: number
  unitPriceCents: number
}

/** The break a line of `cases` cases pays: the one with the greatest minCases ≤ cases, or null. */
export function selectPriceBreak<B extends PriceBreak>(breaks: readonly B[], cases: number): B | null {
  requireNonNegative(cases, 'cases')
  let best: B | null = null
  for (const b of breaks) {
    if (b.minCases <= cases && (best === null || b.minCases > best.minCases)) best = b
  }
  return best
}

export type PriceBreakProblemCode =
  'min_cases_invalid' | 'price_invalid' | 'duplicate_min_cases' | 'no_single_case_break' | 'price_rises'

export interface PriceBreakProblem {
  code: PriceBreakProblemCode
  /** Position in the list given, for pointing at the form row; null for the list as a whole. */
  index: number | null
  message: string
}

/**
 * Everything wrong with a tier's breaks for one product, all at once. An empty list has no
 * problems: the product is simply not priced for that tier. Equal prices at larger counts are
 * allowed; a price that goes up as the case count grows is not.
 */
export function validatePriceBreaks(breaks: readonly PriceBreak[]): PriceBreakProblem[] {
  const problems: PriceBreakProblem[] = []
  const seen = new Map<number, number>()
  breaks.forEach((b, index) => {
    if (!Number.isSafeInteger(b.minCases) || b.minCases < 1) {
      problems.push({
        code: 'min_cases_invalid',
        index,
        message: `Minimum cases must be a whole number of at least 1 (got ${b.minCases})`,
      })
    }
    if (!Number.isSafeInteger(b.unitPriceCents) || b.unitPriceCents <= 0) {
      problems.push({
        code: 'price_invalid',
        index,
        message: `Unit price must be a positive whole number of cents (got ${b.unitPriceCents})`,
      })
    }
    const first = seen.get(b.minCases)
    if (first !== undefined) {
      problems.push({
        code: 'duplicate_min_cases',
        index,
        message: `Two breaks start at ${b.minCases} cases (rows ${first + 1} and ${index + 1})`,
      })
    } else {
      seen.set(b.minCases, index)
    }
  })
  // The ladder checks look only at rows whose case count is usable; the others are reported above.
  const ordered = breaks
    .map((b, index) => ({ ...b, index }))
    .filter((b) => Number.isSafeInteger(b.minCases) && b.minCases >= 1)
    .sort((a, b) => a.minCases - b.minCases)
  if (breaks.length > 0 && ordered[0]?.minCases !== 1) {
    problems.push({
      code: 'no_single_case_break',
      index: null,
      message: 'The first break must start at 1 case',
    })
  }
  for (let i = 1; i < ordered.length; i++) {
    const prev = ordered[i - 1]!
    const cur = ordered[i]!
    if (cur.minCases > prev.minCases && cur.unitPriceCents > prev.unitPriceCents) {
      problems.push({
        code: 'price_rises',
        index: cur.index,
        message: `The price at ${cur.minCases} cases is higher than at ${prev.minCases} cases`,
      })
    }
  }
  return problems
}
