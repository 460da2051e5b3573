import { z } from 'zod'
import { recordId } from '@shared/schemas/record-id'
import { oilPercentagesAddUp, oilPercentagesSum } from '@shared/domain/batch-sheet/batch-sheet'
import { LYE_CONCENTRATION_RANGE, SUPERFAT_RANGE, WATER_TO_LYE_RATIO_RANGE } from '@shared/domain/lye/lye'
import type { CostShare } from '@shared/domain/costing/costing'

const num = (what: string) => z.number({ error: `Enter ${what}.` })
const ingredientId = z
  .number({ error: 'Choose an ingredient.' })
  .int('Choose an ingredient.')
  .positive('Choose an ingredient.')

const between = (what: string, range: { min: number; max: number }, unit = ' %') =>
  num(what)
    .min(range.min, `Between ${range.min} and ${range.max}${unit}.`)
    .max(range.max, `Between ${range.min} and ${range.max}${unit}.`)

export const WATER_MODES = ['concentration', 'ratio'] as const
export type WaterMode = (typeof WATER_MODES)[number]

/** Most oils a recipe may list; more is a typo or a paste gone wrong. */
export const MAX_RECIPE_ROWS = 20

export const RecipeOilInputSchema = z.object({
  ingredientId,
  pct: num('a percentage').gt(0, 'More than 0 %.').max(100, 'At most 100 %.'),
})
export const RecipeFragranceInputSchema = z.object({
  ingredientId,
  /** Percent of the total oil weight. */
  pct: num('a percentage').gt(0, 'More than 0 %.').max(20, 'At most 20 % of the oils.'),
})
export const RecipeAdditiveInputSchema = z.object({
  ingredientId,
  gPerKg: num('grams per kg of oils').gt(0, 'More than 0 g.').max(500, 'At most 500 g per kg of oils.'),
})
export const RecipePackagingInputSchema = z.object({
  ingredientId,
  qtyPerBar: num('a quantity').gt(0, 'More than 0.').max(100, 'At most 100 per bar.'),
})

/** Rows that name the same ingredient twice; each repeat becomes an issue on its own ingredientId. */
function flagRepeats(rows: readonly { ingredientId: number }[], path: string, ctx: z.RefinementCtx) {
  const seen = new Set<number>()
  rows.forEach((row, i) => {
    if (seen.has(row.ingredientId)) {
      ctx.addIssue({
        code: 'custom',
        path: [path, i, 'ingredientId'],
        message: 'This ingredient is already listed.',
      })
    }
    seen.add(row.ingredientId)
  })
}

/**
 * A recipe as the owner saves it (create and update: an update replaces the whole recipe).
 * Oils are percent of total oils and must add up to 100; fragrances are percent of the oils;
 * additives and colourants are grams per kg of oils; packaging is items per bar.
 */
export const RecipeInputSchema = z
  .object({
    name: z.string().trim().min(1, 'Enter a name.').max(120, 'At most 120 characters.'),
    notes: z.string().trim().max(2000, 'At most 2000 characters.').nullish(),
    oils: z
      .array(RecipeOilInputSchema)
      .min(1, 'Add at least one oil.')
      .max(MAX_RECIPE_ROWS, `At most ${MAX_RECIPE_ROWS} oils.`),
    superfatPct: between('the superfat', SUPERFAT_RANGE),
    waterMode: z.enum(WATER_MODES, { error: 'Choose how the water is set.' }),
    lyeConcentrationPct: between('the lye concentration', LYE_CONCENTRATION_RANGE).nullish(),
    waterLyeRatio: between('the water:lye ratio', WATER_TO_LYE_RATIO_RANGE, '').nullish(),
    lyeIngredientId: ingredientId.nullish(),
    waterIngredientId: ingredientId.nullish(),
    fragrances: z.array(RecipeFragranceInputSchema).max(10, 'At most 10 fragrances.').default([]),
    additives: z
      .array(RecipeAdditiveInputSchema)
      .max(MAX_RECIPE_ROWS, `At most ${MAX_RECIPE_ROWS} additives.`)
      .default([]),
    packaging: z.array(RecipePackagingInputSchema).max(10, 'At most 10 packaging items.').default([]),
    labourMinutes: num('the minutes')
      .int('Whole minutes.')
      .min(0, 'Not negative.')
      .max(1440, 'At most 1440 minutes.'),
    // 28 days is the usual minimum cure for cold-process soap (common practice).
    cureDays: num('the days')
      .int('Whole days.')
      .min(0, 'Not negative.')
      .max(365, 'At most 365 days.')
      .default(28),
    barWeightG: num('the bar weight').gt(0, 'More than 0 g.').max(5000, 'At most 5000 g.'),
    barsPerMould: num('the bars per mould')
      .int('A whole number.')
      .min(1, 'At least 1.')
      .max(500, 'At most 500.'),
    barsKeptBack: num('the bars kept back').int('A whole number.').min(0, 'Not negative.').default(0),
    mouldOilWeightG: num('the oil weight').gt(0, 'More than 0 g.').max(100_000, 'At most 100 kg.'),
  })
  .superRefine((v, ctx) => {
    if (v.oils.length > 0 && !oilPercentagesAddUp(v.oils.map((o) => o.pct))) {
      const sum = Number(oilPercentagesSum(v.oils.map((o) => o.pct)).toFixed(3))
      ctx.addIssue({
        code: 'custom',
        path: ['oils'],
        message: `The oils add up to ${sum} %; they must make 100 %.`,
      })
    }
    if (v.waterMode === 'concentration' && v.lyeConcentrationPct == null) {
      ctx.addIssue({ code: 'custom', path: ['lyeConcentrationPct'], message: 'Enter the lye concentration.' })
    }
    if (v.waterMode === 'ratio' && v.waterLyeRatio == null) {
      ctx.addIssue({ code: 'custom', path: ['waterLyeRatio'], message: 'Enter the water:lye ratio.' })
    }
    if (v.barsKeptBack >= v.barsPerMould) {
      ctx.addIssue({
        code: 'custom',
        path: ['barsKeptBack'],
        message: 'Fewer than the bars per mould: some bars must be left to sell.',
      })
    }
    flagRepeats(v.oils, 'oils', ctx)
    flagRepeats(v.fragrances, 'fragrances', ctx)
    flagRepeats(v.additives, 'additives', ctx)
    flagRepeats(v.packaging, 'packaging', ctx)
  })
  .transform((v) => ({
    ...v,
    notes: v.notes ? v.notes : null,
    // Only the figure of the chosen mode is kept, so the other cannot linger unseen.
    lyeConcentrationPct: v.waterMode === 'concentration' ? (v.lyeConcentrationPct ?? null) : null,
    waterLyeRatio: v.waterMode === 'ratio' ? (v.waterLyeRatio ?? null) : null,
    lyeIngredientId: v.lyeIngredientId ?? null,
    waterIngredientId: v.waterIngredientId ?? null,
  }))
export type RecipeInput = z.output<typeof RecipeInputSchema>
export type RecipeFormValues = z.input<typeof RecipeInputSchema>

export const RecipeIdParamsSchema = z.object({ id: recordId('Not a recipe.') })

export const RecipeListQuerySchema = z.object({
  archived: z
    .enum(['true', 'false'])
    .optional()
    .transform((v) => v === 'true'),
})

const positiveQueryNumber = (message: string) =>
  z.coerce.number({ error: message }).refine((n) => Number.isFinite(n) && n > 0, message)

/**
 * `?oilWeightG=` to cost another batch size than the recipe's mould; `?priceOverride[12]=0.45`
 * to ask "what if ingredient 12 cost 0.45 cents per gram (or per item)".
 */
export const CostSheetQuerySchema = z.object({
  oilWeightG: positiveQueryNumber('A positive oil weight in grams.')
    .refine((n) => n <= 100_000, 'At most 100 kg.')
    .optional(),
  priceOverride: z
    .record(
      z.string().regex(/^[1-9]\d*$/, 'An ingredient id.'),
      z.coerce
        .number({ error: 'A price in cents per unit.' })
        .refine(
          (n) => Number.isFinite(n) && n >= 0 && n <= 1_000_000,
          'A price in cents per unit, 0 or more.',
        ),
    )
    .optional()
    .default({})
    .transform((r) => new Map(Object.entries(r).map(([k, v]) => [Number(k), v]))),
})
export type CostSheetQuery = z.output<typeof CostSheetQuerySchema>

export type IngredientKind = 'oil' | 'lye' | 'liquid' | 'fragrance' | 'colourant' | 'additive' | 'packaging'

/** A recipe with its items joined to ingredient names and kinds. Plain JSON (also the batch snapshot). */
export interface Recipe {
  id: number
  name: string
  notes: string | null
  superfatPct: number
  waterMode: WaterMode
  lyeConcentrationPct: number | null
  waterLyeRatio: number | null
  lye: { ingredientId: number; name: string; kind: IngredientKind; purityPct: number | null } | null
  water: { ingredientId: number; name: string; kind: IngredientKind } | null
  oils: {
    ingredientId: number
    name: string
    kind: IngredientKind
    inci: string | null
    pct: number
    sapNaoh: number
  }[]
  fragrances: {
    ingredientId: number
    name: string
    kind: IngredientKind
    inci: string | null
    pct: number
    maxUsagePct: number | null
    vanillinPct: number | null
  }[]
  additives: {
    ingredientId: number
    name: string
    kind: IngredientKind
    inci: string | null
    gPerKg: number
  }[]
  packaging: { ingredientId: number; name: string; kind: IngredientKind; qtyPerBar: number }[]
  labourMinutes: number
  cureDays: number
  barWeightG: number
  barsPerMould: number
  barsKeptBack: number
  mouldOilWeightG: number
  archivedAt: string | null
  createdAt: string
  updatedAt: string
}

export interface RecipeListItem {
  id: number
  name: string
  oils: { name: string; pct: number }[]
  superfatPct: number
  cureDays: number
  barWeightG: number
  barsPerMould: number
  barsKeptBack: number
  mouldOilWeightG: number
  archivedAt: string | null
  /** Whole cents at current lot prices; null when the caller may not see costs. */
  costPerBarCents: number | null
  /** Names of ingredients with nothing on hand to price them (counted at 0). */
  missingCosts: string[]
}

export type CostCategory = Exclude<IngredientKind, 'packaging'> | 'packaging' | 'labour'

export interface CostSheetLine {
  /** null for a lye or water line whose ingredient the recipe does not name. */
  ingredientId: number | null
  name: string
  kind: IngredientKind
  role: 'oil' | 'lye' | 'water' | 'fragrance' | 'additive' | 'packaging'
  /** Grams for the batch, or items for packaging (per bar × sellable bars). */
  quantity: number
  unit: 'g' | 'each'
  /** Packaging only: items per bar. */
  perBar: number | null
  /** Cents per gram or per item (fractional), null when nothing is on hand to price it. */
  unitCostCents: number | null
  /** Fractional cents; 0 when noCost. */
  lineCostCents: number
  noCost: boolean
  /** True when the what-if price replaced the lots' price. */
  overridden: boolean
}

export interface CostSheet {
  recipeId: number
  recipeName: string
  currency: string
  oilWeightG: number
  /** Bars cut from this batch: the recipe's bars per mould, or what this oil weight yields. */
  barsCut: number
  barsKeptBack: number
  sellableBars: number
  lines: CostSheetLine[]
  ingredientCostCents: number
  packagingPerBarCents: number
  packagingCents: number
  labourMinutes: number
  labourRateCents: number
  labourCents: number
  totalBatchCents: number
  costPerBarCents: number
  breakdown: CostShare<CostCategory>[]
  overrides: {
    ingredientId: number
    name: string
    centsPerUnit: number
    currentUnitCostCents: number | null
  }[]
  missingCosts: string[]
  warnings: { code: 'no_cost' | 'not_costed'; ingredientId: number | null; message: string }[]
}

/** An ingredient a recipe may use, as the recipe form lists it. */
export interface RecipeIngredientOption {
  id: number
  name: string
  kind: IngredientKind
  sapNaoh: number | null
  purityPct: number | null
  maxUsagePct: number | null
  vanillinPct: number | null
  unit: 'g' | 'each'
}
