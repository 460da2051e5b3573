import { z } from 'zod'
import type { BatchLine, BatchWarning, WaterSpec } from '@shared/domain/batch-sheet/batch-sheet'
import {
  LYE_CONCENTRATION_RANGE,
  LYE_PURITY_RANGE,
  SUPERFAT_RANGE,
  WATER_TO_LYE_RATIO_RANGE,
} from '@shared/domain/lye/lye'
import type { LyeCautions } from '@shared/domain/lye/lye'

const inRange = (what: string, range: { min: number; max: number }, unit = ' %') =>
  z
    .number({ error: `Enter ${what} as a number.` })
    .min(range.min, `${what} must be between ${range.min} and ${range.max}${unit}.`)
    .max(range.max, `${what} must be between ${range.min} and ${range.max}${unit}.`)

const ingredientId = z
  .number({ error: 'An ingredient id.' })
  .int('An ingredient id.')
  .positive('An ingredient id.')

/**
 * The contract's `POST /api/batch-sheet`: oils in grams, superfat, lye concentration, optional
 * lye purity. Fragrances (percent of oils), additives (g per kg of oils) and a water:lye ratio in
 * place of the concentration may be added; the answer's keys stay those of the contract.
 */
export const BatchSheetRequestSchema = z
  .object({
    oils: z
      .array(
        z.object({
          ingredientId,
          grams: z
            .number({ error: 'Enter the grams as a number.' })
            .gt(0, 'More than 0 g.')
            .max(1_000_000, 'At most 1,000 kg.'),
        }),
      )
      .min(1, 'Add at least one oil.')
      .max(40, 'At most 40 oils.'),
    superfatPct: inRange('Superfat', SUPERFAT_RANGE),
    lyeConcentrationPct: inRange('Lye concentration', LYE_CONCENTRATION_RANGE).optional(),
    waterLyeRatio: inRange('Water:lye ratio', WATER_TO_LYE_RATIO_RANGE, '').optional(),
    lyePurityPct: inRange('Lye purity', LYE_PURITY_RANGE).optional(),
    fragrances: z
      .array(
        z.object({
          ingredientId,
          pct: z.number().gt(0, 'More than 0 %.').max(20, 'At most 20 % of the oils.'),
        }),
      )
      .max(10)
      .optional(),
    additives: z
      .array(
        z.object({
          ingredientId,
          gPerKg: z.number().gt(0, 'More than 0 g.').max(500, 'At most 500 g per kg.'),
        }),
      )
      .max(40)
      .optional(),
  })
  .superRefine((v, ctx) => {
    if (v.lyeConcentrationPct == null && v.waterLyeRatio == null) {
      ctx.addIssue({ code: 'custom', path: ['lyeConcentrationPct'], message: 'Enter the lye concentration.' })
    }
    if (v.lyeConcentrationPct != null && v.waterLyeRatio != null) {
      ctx.addIssue({
        code: 'custom',
        path: ['waterLyeRatio'],
        message: 'Give either the lye concentration or the water:lye ratio, not both.',
      })
    }
  })
export type BatchSheetRequest = z.output<typeof BatchSheetRequestSchema>

/** The contract's answer: unrounded numbers; `lines` are the ingredients given (oils first). */
export interface BatchSheetAnswer {
  naohG: number
  waterG: number
  oilsG: number
  totalG: number
  lines: { ingredientId: number; name: string; grams: number }[]
}

const positiveQuery = (message: string, max: number, integer = false) =>
  z.coerce
    .number({ error: message })
    .refine((n) => Number.isFinite(n) && n > 0 && n <= max && (!integer || Number.isInteger(n)), message)

/** `?oilWeightG=` or `?bars=` (not both); neither gives the recipe's own mould. */
export const RecipeSheetQuerySchema = z
  .object({
    oilWeightG: positiveQuery('An oil weight in grams, more than 0 and at most 100,000.', 100_000).optional(),
    bars: positiveQuery('A whole number of bars from 1 to 1000.', 1000, true).optional(),
  })
  .refine((v) => v.oilWeightG == null || v.bars == null, {
    path: ['bars'],
    message: 'Choose an oil weight or a number of bars, not both.',
  })
export type RecipeSheetQuery = z.output<typeof RecipeSheetQuerySchema>

/** A recipe's batch sheet: every line in grams and ounces, lye and water, warnings and cautions. */
export interface RecipeBatchSheet {
  recipeId: number
  recipeName: string
  /** What the sheet was sized by: the recipe's mould, a chosen oil weight, or a number of bars. */
  basis: 'mould' | 'oilWeight' | 'bars'
  requestedBars: number | null
  superfatPct: number
  water: WaterSpec
  lyeName: string
  lyePurityPct: number
  cureDays: number
  barWeightG: number
  barsKeptBack: number
  oilsG: number
  naohG: number
  waterG: number
  fragranceG: number
  additivesG: number
  totalG: number
  lines: BatchLine[]
  /** Whole bars of barWeightG the batch cuts into. */
  expectedBars: number
  warnings: BatchWarning[]
  cautions: LyeCautions
}
