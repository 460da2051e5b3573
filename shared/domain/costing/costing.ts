import { DomainError, requireInteger, requireNonNegative, requirePositive } from '@shared/domain/errors'
import { assertCents, roundHalfUp } from '@shared/domain/money/money'
import { compareIso, isValidIsoDate } from '@shared/domain/dates/dates'

// Unit costs are cents per base unit (per gram, or per item for 'each') and stay fractional:
// olive oil at 0.41 ¢/g rounded to whole cents would cost 0 ¢. Only the cost per bar is rounded.

/** Cost of one base unit of a purchase, freight included in `costCents`. */
export function lotUnitCostCents(lot: { quantity: number; costCents: number }): number {
  requirePositive(lot.quantity, 'quantity')
  assertCents(lot.costCents, 'costCents')
  requireNonNegative(lot.costCents, 'costCents')
  return lot.costCents / lot.quantity
}

/**
 * The ingredient's current cost: the average of the unit costs of lots still on hand, weighted
 * by the quantity left in each. Used-up lots (remaining 0) no longer count; null when nothing is
 * on hand, so the caller can say "no cost yet" instead of showing 0.
 */
export function weightedAverageUnitCost(
  lots: readonly { remainingQuantity: number; unitCost: number }[],
): number | null {
  let quantity = 0
  let cost = 0
  lots.forEach((lot, i) => {
    requireNonNegative(lot.remainingQuantity, `lots.${i}.remainingQuantity`)
    requireNonNegative(lot.unitCost, `lots.${i}.unitCost`)
    if (lot.remainingQuantity === 0) return
    quantity += lot.remainingQuantity
    cost += lot.remainingQuantity * lot.unitCost
  })
  return quantity > 0 ? cost / quantity : null
}

export interface LotOnHand {
  id: number
  /** Calendar date, YYYY-MM-DD. */
  receivedDate: string
  remainingQuantity: number
  unitCost: number
}

export interface LotTake {
  lotId: number
  quantity: number
  /** quantity × unit cost, unrounded. */
  costCents: number
}

/**
 * Which lots a batch uses: the oldest received first, equal dates by lot id. `shortBy` is what
 * the lots on hand could not cover (0 when they could). The input is not changed.
 */
export function consumeOldestFirst(
  lots: readonly LotOnHand[],
  needed: number,
): { takes: LotTake[]; shortBy: number } {
  requireNonNegative(needed, 'needed')
  lots.forEach((lot, i) => {
    if (!isValidIsoDate(lot.receivedDate)) {
      throw new DomainError(
        'invalid_date',
        `Not a calendar date (YYYY-MM-DD): ${lot.receivedDate}`,
        `lots.${i}.receivedDate`,
      )
    }
    requireNonNegative(lot.remainingQuantity, `lots.${i}.remainingQuantity`)
    requireNonNegative(lot.unitCost, `lots.${i}.unitCost`)
  })
  const ordered = [...lots].sort((a, b) => compareIso(a.receivedDate, b.receivedDate) || a.id - b.id)
  const takes: LotTake[] = []
  let left = needed
  for (const lot of ordered) {
    if (left <= 0) break
    if (lot.remainingQuantity <= 0) continue
    // A lot that covers the rest takes exactly the rest, so no float residue is left to report.
    const quantity = lot.remainingQuantity >= left ? left : lot.remainingQuantity
    left = quantity === left ? 0 : left - quantity
    takes.push({ lotId: lot.id, quantity, costCents: quantity * lot.unitCost })
  }
  return { takes, shortBy: left }
}

export interface CostPerBarInput {
  /** Ingredient cost of the whole batch (may carry fractions of a cent). */
  ingredientCostCents: number
  packagingPerBarCents: number
  labourMinutes: number
  hourlyRateCents: number
  barsCut: number
  /** End slices and samples that are not sold. */
  barsKeptBack: number
}

export interface CostPerBar {
  sellableBars: number
  batchIngredientCents: number
  labourCents: number
  /** Packaging per bar × sellable bars: bars kept back are not packed. */
  packagingCents: number
  totalBatchCents: number
  /** Whole cents, rounded half up: this is the figure frozen on the batch. */
  costPerBarCents: number
}

/** All the batch costs carried by the bars that can be sold. Only the per-bar figure is rounded. */
export function costPerBar(input: CostPerBarInput): CostPerBar {
  requireNonNegative(input.ingredientCostCents, 'ingredientCostCents')
  requireNonNegative(input.packagingPerBarCents, 'packagingPerBarCents')
  requireNonNegative(input.labourMinutes, 'labourMinutes')
  requireNonNegative(input.hourlyRateCents, 'hourlyRateCents')
  requireInteger(input.barsCut, 'barsCut', 0)
  requireInteger(input.barsKeptBack, 'barsKeptBack', 0)
  const sellableBars = input.barsCut - input.barsKeptBack
  if (sellableBars <= 0) {
    throw new DomainError(
      'no_sellable_bars',
      `No bars left to sell: ${input.barsCut} cut, ${input.barsKeptBack} kept back`,
      input.barsCut === 0 ? 'barsCut' : 'barsKeptBack',
    )
  }
  const batchIngredientCents = input.ingredientCostCents
  const labourCents = (input.labourMinutes * input.hourlyRateCents) / 60
  const packagingCents = input.packagingPerBarCents * sellableBars
  const totalBatchCents = batchIngredientCents + labourCents + packagingCents
  return {
    sellableBars,
    batchIngredientCents,
    labourCents,
    packagingCents,
    totalBatchCents,
    costPerBarCents: roundHalfUp(totalBatchCents / sellableBars),
  }
}

export interface CostShare<C extends string> {
  category: C
  cents: number
  /** Percent of the total, 0–100 (all 0 when the total is 0). */
  pct: number
}

/**
 * Shares of a cost by category, for a chart: parts of the same category are added up, the
 * largest share comes first (equal ones keep their first-seen order). Typical categories are the
 * ingredient kinds plus 'packaging' and 'labour'.
 */
export function costBreakdown<C extends string>(
  parts: readonly { category: C; cents: number }[],
): CostShare<C>[] {
  const totals = new Map<C, number>()
  parts.forEach((part, i) => {
    requireNonNegative(part.cents, `parts.${i}.cents`)
    totals.set(part.category, (totals.get(part.category) ?? 0) + part.cents)
  })
  const total = [...totals.values()].reduce((s, c) => s + c, 0)
  return [...totals]
    .map(([category, cents]) => ({ category, cents, pct: total > 0 ? (cents / total) * 100 : 0 }))
    .sort((a, b) => b.cents - a.cents)
}

/** The three parts of a costed batch, ready for costBreakdown. */
export function costPerBarParts(
  cost: CostPerBar,
): { category: 'ingredients' | 'labour' | 'packaging'; cents: number }[] {
  return [
    { category: 'ingredients', cents: cost.batchIngredientCents },
    { category: 'labour', cents: cost.labourCents },
    { category: 'packaging', cents: cost.packagingCents },
  ]
}
