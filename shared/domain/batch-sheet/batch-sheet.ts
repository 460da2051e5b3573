import {
  DomainError,
  requireInRange,
  requireInteger,
  requireNonNegative,
  requirePositive,
} from '@shared/domain/errors'
import {
  LYE_CONCENTRATION_RANGE,
  LYE_PURITY_RANGE,
  SUPERFAT_RANGE,
  WATER_TO_LYE_RATIO_RANGE,
  naohForOils,
  waterFromConcentration,
  waterFromRatio,
} from '@shared/domain/lye/lye'
import { GRAMS_PER } from '@shared/domain/units/units'

/**
 * Vanillin share of a fragrance (percent) above which the soap is expected to brown as it cures
 * (common practice: a few tenths of a percent browns, near 0.15 % is usually fine).
 */
export const VANILLIN_WARN_PCT = 0.5
/** Oil percentages of a recipe must add up to 100 within this many percentage points. */
export const OILS_SUM_TOLERANCE = 0.01

export const LYE_LINE_NAME = 'Sodium hydroxide (lye)'
export const WATER_LINE_NAME = 'Water'

export type WaterSpec = { mode: 'concentration'; pct: number } | { mode: 'ratio'; ratio: number }

export interface BatchFragrance {
  ingredientId: number
  name: string
  pctOfOils: number
  /** Maximum use level, percent, from the supplier's IFRA certificate (Category 9, rinse-off). */
  maxUsagePct?: number | null
  /** Vanillin content of the fragrance, percent. */
  vanillinPct?: number | null
}

export interface BatchAdditive {
  ingredientId: number
  name: string
  gPerKgOils: number
}

interface BatchCommon {
  superfatPct: number
  water: WaterSpec
  lyePurityPct?: number
  fragrances?: readonly BatchFragrance[]
  additives?: readonly BatchAdditive[]
}

export interface BatchSheetInput extends BatchCommon {
  oils: readonly { ingredientId: number; name: string; grams: number; sapNaoh: number }[]
}

/** A recipe: oils as percent of total oils (summing to 100), everything else as in a batch. */
export interface BatchRecipe extends BatchCommon {
  oils: readonly { ingredientId: number; name: string; pct: number; sapNaoh: number }[]
}

export type BatchLineRole = 'oil' | 'lye' | 'water' | 'fragrance' | 'additive'

export interface BatchLine {
  ingredientId: number | null
  name: string
  role: BatchLineRole
  grams: number
  ounces: number
  pctOfOils: number
}

export interface BatchWarning {
  /** `fragrance_over_max` blocks saving the recipe or batch; `vanillin_browning` only informs. */
  code: 'fragrance_over_max' | 'vanillin_browning'
  ingredientId: number
  message: string
}

export interface BatchSheet {
  oilsG: number
  naohG: number
  waterG: number
  fragranceG: number
  additivesG: number
  totalG: number
  lines: BatchLine[]
  warnings: BatchWarning[]
}

const pct = (n: number) => `${Number(n.toFixed(2))} %`

/**
 * Every ingredient's weight for a batch of the given oils. Numbers are unrounded; the UI rounds.
 *
 * A fragrance's maximum usage is compared with its share of the oils, not of the whole batch.
 * The certificate's limit is a share of the finished bar, and every bar weighs more than its oils
 * (oils + lye + fragrance at least, even after the water has cured off), so this comparison can only
 * err on the safe side.
 */
export function computeBatchSheet(input: BatchSheetInput): BatchSheet {
  const { oils, superfatPct, water } = input
  const fragrances = input.fragrances ?? []
  const additives = input.additives ?? []
  const purityPct = input.lyePurityPct ?? 100

  if (oils.length === 0) throw new DomainError('no_oils', 'A batch needs at least one oil', 'oils')
  requireInRange(superfatPct, SUPERFAT_RANGE, 'superfatPct')
  requireInRange(purityPct, LYE_PURITY_RANGE, 'lyePurityPct')
  if (water.mode === 'concentration') requireInRange(water.pct, LYE_CONCENTRATION_RANGE, 'water.pct')
  else requireInRange(water.ratio, WATER_TO_LYE_RATIO_RANGE, 'water.ratio')
  fragrances.forEach((f, i) => {
    requireNonNegative(f.pctOfOils, `fragrances.${i}.pctOfOils`)
    if (f.maxUsagePct != null)
      requireInRange(f.maxUsagePct, { min: 0, max: 100 }, `fragrances.${i}.maxUsagePct`)
    if (f.vanillinPct != null)
      requireInRange(f.vanillinPct, { min: 0, max: 100 }, `fragrances.${i}.vanillinPct`)
  })
  additives.forEach((a, i) => requireNonNegative(a.gPerKgOils, `additives.${i}.gPerKgOils`))

  const naohG = naohForOils(oils, superfatPct, purityPct)
  const oilsG = oils.reduce((sum, o) => sum + o.grams, 0)
  if (oilsG <= 0) throw new DomainError('no_oils', 'The oils must weigh more than 0 g', 'oils')
  const waterG =
    water.mode === 'concentration'
      ? waterFromConcentration(naohG, water.pct)
      : waterFromRatio(naohG, water.ratio)

  const line = (
    ingredientId: number | null,
    name: string,
    role: BatchLineRole,
    grams: number,
  ): BatchLine => ({
    ingredientId,
    name,
    role,
    grams,
    ounces: grams / GRAMS_PER.oz,
    pctOfOils: (grams / oilsG) * 100,
  })

  const fragranceLines = fragrances.map((f) =>
    line(f.ingredientId, f.name, 'fragrance', (oilsG * f.pctOfOils) / 100),
  )
  const additiveLines = additives.map((a) =>
    line(a.ingredientId, a.name, 'additive', (oilsG * a.gPerKgOils) / 1000),
  )
  const fragranceG = fragranceLines.reduce((sum, l) => sum + l.grams, 0)
  const additivesG = additiveLines.reduce((sum, l) => sum + l.grams, 0)

  const warnings: BatchWarning[] = []
  for (const f of fragrances) {
    if (f.maxUsagePct != null && f.pctOfOils > f.maxUsagePct) {
      warnings.push({
        code: 'fragrance_over_max',
        ingredientId: f.ingredientId,
        message: `${f.name} at ${pct(f.pctOfOils)} of oils is over its maximum usage of ${pct(f.maxUsagePct)} (IFRA certificate, Category 9).`,
      })
    }
    if (f.vanillinPct != null && f.vanillinPct > VANILLIN_WARN_PCT) {
      warnings.push({
        code: 'vanillin_browning',
        ingredientId: f.ingredientId,
        message: `${f.name} contains ${pct(f.vanillinPct)} vanillin: expect the bars to brown as they cure.`,
      })
    }
  }

  return {
    oilsG,
    naohG,
    waterG,
    fragranceG,
    additivesG,
    totalG: oilsG + naohG + waterG + fragranceG + additivesG,
    lines: [
      ...oils.map((o) => line(o.ingredientId, o.name, 'oil', o.grams)),
      line(null, LYE_LINE_NAME, 'lye', naohG),
      line(null, WATER_LINE_NAME, 'water', waterG),
      ...fragranceLines,
      ...additiveLines,
    ],
    warnings,
  }
}

export function oilPercentagesSum(pcts: readonly number[]): number {
  return pcts.reduce((sum, p) => sum + p, 0)
}

/**
 * True when the percentages add up to 100 within OILS_SUM_TOLERANCE. Use this rather than
 * comparing by hand: 3 × 33.33 is 99.99 but 100 − 99.99 is 0.010000000000005 in binary.
 */
export function oilPercentagesAddUp(pcts: readonly number[]): boolean {
  return Math.abs(oilPercentagesSum(pcts) - 100) <= OILS_SUM_TOLERANCE + 1e-9
}

/**
 * Grams of each oil for a total oil weight. The percentages must add up to 100 within
 * OILS_SUM_TOLERANCE; they are then normalised by their sum, so the oils weigh exactly `oilWeightG`.
 */
export function scaleOils<T extends { ingredientId: number; pct: number }>(
  oilsPct: readonly T[],
  oilWeightG: number,
): (T & { grams: number })[] {
  requireNonNegative(oilWeightG, 'oilWeightG')
  oilsPct.forEach((o, i) => requireNonNegative(o.pct, `oils.${i}.pct`))
  const pcts = oilsPct.map((o) => o.pct)
  const sum = oilPercentagesSum(pcts)
  if (!oilPercentagesAddUp(pcts)) {
    throw new DomainError(
      'oils_sum',
      `The oil percentages add up to ${Number(sum.toFixed(4))} %, not 100 %`,
      'oils',
    )
  }
  return oilsPct.map((o) => ({ ...o, grams: (oilWeightG * o.pct) / sum }))
}

/** The batch sheet of a recipe for a chosen oil weight. */
export function computeRecipeBatchSheet(recipe: BatchRecipe, oilWeightG: number): BatchSheet {
  return computeBatchSheet({ ...recipe, oils: scaleOils(recipe.oils, oilWeightG) })
}

/**
 * The oil weight whose whole batch (oils + lye + water + fragrance + additives) weighs
 * bars × cut bar weight. Every part scales linearly with the oils, so the batch-to-oil ratio of a
 * 1000 g run holds for any size. Count in `bars` every bar you will cut, end slices included;
 * losses in the pot and mould are not modelled.
 */
export function oilWeightForBars({
  bars,
  barWeightG,
  recipe,
}: {
  bars: number
  barWeightG: number
  recipe: BatchRecipe
}): number {
  requireInteger(bars, 'bars', 1)
  requirePositive(barWeightG, 'barWeightG')
  const run = computeRecipeBatchSheet(recipe, 1000)
  return (bars * barWeightG) / (run.totalG / run.oilsG)
}
