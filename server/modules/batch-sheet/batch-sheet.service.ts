import { QueryTypes } from 'sequelize'
import {
  LYE_LINE_NAME,
  WATER_LINE_NAME,
  computeBatchSheet,
  computeRecipeBatchSheet,
  oilWeightForBars,
} from '@shared/domain/batch-sheet/batch-sheet'
import { LYE_CAUTIONS } from '@shared/domain/lye/lye'
import type {
  BatchSheetAnswer,
  BatchSheetRequest,
  RecipeBatchSheet,
  RecipeSheetQuery,
} from '@shared/schemas/batch-sheet'
import type { ErrorDetail } from '@shared/schemas/errors'
import type { IngredientKind } from '@shared/schemas/recipes'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { barsFromBatch } from '@server/modules/recipes/recipe-cost.service'
import { loadRecipe, toBatchRecipe } from '@server/modules/recipes/recipe.queries'

type IngredientRow = {
  id: number
  name: string
  kind: IngredientKind
  sap_naoh: string | null
  max_usage_pct: string | null
  vanillin_pct: string | null
}

const num = (v: string | null) => (v == null ? null : Number(v))

/** The contract's batch sheet for oils given in grams (and optional fragrances and additives). */
export async function batchSheetForOils(input: BatchSheetRequest): Promise<BatchSheetAnswer> {
  const fragrances = input.fragrances ?? []
  const additives = input.additives ?? []
  const ids = [...input.oils, ...fragrances, ...additives].map((r) => r.ingredientId)
  const rows = await sequelize.query<IngredientRow>(
    'SELECT id, name, kind, sap_naoh, max_usage_pct, vanillin_pct FROM ingredients WHERE id = ANY($1::int[])',
    { bind: [[...new Set(ids)]], type: QueryTypes.SELECT },
  )
  const byId = new Map(rows.map((r) => [r.id, r]))
  const details: ErrorDetail[] = []
  const check = (id: number, field: string, kinds: IngredientKind[], what: string) => {
    const ing = byId.get(id)
    if (!ing) details.push({ field, message: 'There is no ingredient with this id.' })
    else if (!kinds.includes(ing.kind)) details.push({ field, message: `${ing.name} is not ${what}.` })
    else if (kinds.includes('oil') && ing.sap_naoh == null) {
      details.push({ field, message: `${ing.name} has no saponification value.` })
    }
  }
  input.oils.forEach((o, i) => check(o.ingredientId, `oils.${i}.ingredientId`, ['oil'], 'an oil or butter'))
  fragrances.forEach((f, i) =>
    check(f.ingredientId, `fragrances.${i}.ingredientId`, ['fragrance'], 'a fragrance'),
  )
  additives.forEach((a, i) =>
    check(
      a.ingredientId,
      `additives.${i}.ingredientId`,
      ['additive', 'colourant'],
      'an additive or colourant',
    ),
  )
  if (details.length > 0) {
    throw AppError.invalid(
      details.length === 1 ? details[0]!.message : 'Some ingredients need attention.',
      details,
    )
  }
  const ing = (id: number) => byId.get(id)!
  const sheet = computeBatchSheet({
    oils: input.oils.map((o) => ({
      ingredientId: o.ingredientId,
      name: ing(o.ingredientId).name,
      grams: o.grams,
      sapNaoh: Number(ing(o.ingredientId).sap_naoh),
    })),
    superfatPct: input.superfatPct,
    water:
      input.lyeConcentrationPct != null
        ? { mode: 'concentration', pct: input.lyeConcentrationPct }
        : { mode: 'ratio', ratio: input.waterLyeRatio! },
    lyePurityPct: input.lyePurityPct ?? 100,
    fragrances: fragrances.map((f) => ({
      ingredientId: f.ingredientId,
      name: ing(f.ingredientId).name,
      pctOfOils: f.pct,
      maxUsagePct: num(ing(f.ingredientId).max_usage_pct),
      vanillinPct: num(ing(f.ingredientId).vanillin_pct),
    })),
    additives: additives.map((a) => ({
      ingredientId: a.ingredientId,
      name: ing(a.ingredientId).name,
      gPerKgOils: a.gPerKg,
    })),
  })
  return {
    naohG: sheet.naohG,
    waterG: sheet.waterG,
    oilsG: sheet.oilsG,
    totalG: sheet.totalG,
    lines: sheet.lines
      .filter((l) => l.ingredientId != null)
      .map((l) => ({ ingredientId: l.ingredientId!, name: l.name, grams: l.grams })),
  }
}

/** A recipe's full batch sheet for its mould, a chosen oil weight, or a number of bars. */
export async function batchSheetForRecipe(recipeId: number, q: RecipeSheetQuery): Promise<RecipeBatchSheet> {
  const recipe = await loadRecipe(recipeId)
  if (!recipe) throw AppError.notFound('That recipe')
  const batchRecipe = toBatchRecipe(recipe)
  const oilWeightG =
    q.bars != null
      ? oilWeightForBars({ bars: q.bars, barWeightG: recipe.barWeightG, recipe: batchRecipe })
      : (q.oilWeightG ?? recipe.mouldOilWeightG)
  const sheet = computeRecipeBatchSheet(batchRecipe, oilWeightG)
  const lyeName = recipe.lye?.name ?? LYE_LINE_NAME
  return {
    recipeId: recipe.id,
    recipeName: recipe.name,
    basis: q.bars != null ? 'bars' : q.oilWeightG != null ? 'oilWeight' : 'mould',
    requestedBars: q.bars ?? null,
    superfatPct: recipe.superfatPct,
    water: batchRecipe.water,
    lyeName,
    lyePurityPct: batchRecipe.lyePurityPct ?? 100,
    cureDays: recipe.cureDays,
    barWeightG: recipe.barWeightG,
    barsKeptBack: recipe.barsKeptBack,
    oilsG: sheet.oilsG,
    naohG: sheet.naohG,
    waterG: sheet.waterG,
    fragranceG: sheet.fragranceG,
    additivesG: sheet.additivesG,
    totalG: sheet.totalG,
    lines: sheet.lines.map((l) =>
      l.role === 'lye'
        ? { ...l, ingredientId: recipe.lye?.ingredientId ?? null, name: lyeName }
        : l.role === 'water'
          ? {
              ...l,
              ingredientId: recipe.water?.ingredientId ?? null,
              name: recipe.water?.name ?? WATER_LINE_NAME,
            }
          : l,
    ),
    expectedBars: barsFromBatch(sheet.totalG, recipe.barWeightG),
    warnings: sheet.warnings,
    cautions: LYE_CAUTIONS,
  }
}
