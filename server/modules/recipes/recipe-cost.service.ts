import type { Transaction } from 'sequelize'
import {
  LYE_LINE_NAME,
  WATER_LINE_NAME,
  computeRecipeBatchSheet,
} from '@shared/domain/batch-sheet/batch-sheet'
import { costBreakdown, costPerBar } from '@shared/domain/costing/costing'
import type { CostCategory, CostSheet, CostSheetLine, IngredientKind, Recipe } from '@shared/schemas/recipes'
import { AppError } from '@server/lib/app-error'
import { getSettings } from '@server/modules/settings/settings.service'
import { currentUnitCosts } from '@server/modules/ingredients/ingredients.service'
import {
  costedIngredientIds,
  loadRecipe,
  loadRecipes,
  toBatchRecipe,
} from '@server/modules/recipes/recipe.queries'

// What a recipe costs at today's lot prices. Other modules use the two exports at the top:
// products/pricing for suggested prices, batches for the snapshot frozen on a pour.

/**
 * Cost per sellable bar of each recipe for one mould (its mould oil weight and bars per mould)
 * at current lot prices (weighted average over the lots on hand), packaging and labour included.
 * `missingCosts` names ingredients that nothing on hand prices (counted at 0). Ids not found are
 * left out of the map; archived recipes are costed like the others.
 */
export async function costPerBarForRecipes(
  recipeIds: number[],
  transaction?: Transaction,
): Promise<Map<number, { costPerBarCents: number; missingCosts: string[] }>> {
  const recipes = await loadRecipes([...new Set(recipeIds)], transaction)
  const unitCosts = await currentUnitCosts([...new Set(recipes.flatMap(costedIngredientIds))], transaction)
  const { labourRateCents, currency } = await getSettings(transaction)
  const out = new Map<number, { costPerBarCents: number; missingCosts: string[] }>()
  for (const recipe of recipes) {
    const sheet = buildCostSheet(recipe, unitCosts, { labourRateCents, currency })
    out.set(recipe.id, { costPerBarCents: sheet.costPerBarCents, missingCosts: sheet.missingCosts })
  }
  return out
}

/**
 * The recipe with its items (names, kinds, percentages, SAP values, purity, cure days) as plain
 * JSON, for freezing on a batch; null when there is no recipe with that id.
 */
export async function recipeSnapshot(recipeId: number, transaction?: Transaction): Promise<Recipe | null> {
  const recipe = await loadRecipe(recipeId, transaction)
  return recipe ? (JSON.parse(JSON.stringify(recipe)) as Recipe) : null
}

/** The cost sheet of one recipe, optionally for another oil weight and with what-if prices. */
export async function costSheetForRecipe(
  recipeId: number,
  opts: { oilWeightG?: number; priceOverride?: Map<number, number> } = {},
): Promise<CostSheet> {
  const recipe = await loadRecipe(recipeId)
  if (!recipe) throw AppError.notFound('That recipe')
  const ids = new Set(costedIngredientIds(recipe))
  for (const id of opts.priceOverride?.keys() ?? []) {
    if (!ids.has(id))
      throw AppError.field(`query.priceOverride.${id}`, 'That ingredient is not in this recipe.')
  }
  const unitCosts = await currentUnitCosts([...ids])
  const { labourRateCents, currency } = await getSettings()
  return buildCostSheet(recipe, unitCosts, { labourRateCents, currency }, opts)
}

/** Whole bars a batch of this weight cuts into (the float guard keeps 12.0000000001 − ε at 12). */
export function barsFromBatch(totalG: number, barWeightG: number): number {
  return Math.floor(totalG / barWeightG + 1e-9)
}

/**
 * The cost sheet from a recipe and the unit costs of its ingredients (cents per g or per item,
 * null when none are on hand). For the recipe's own mould the bars are its bars per mould; for
 * another oil weight they are the whole bars that batch cuts into.
 */
export function buildCostSheet(
  recipe: Recipe,
  unitCosts: ReadonlyMap<number, number | null>,
  settings: { labourRateCents: number; currency: string },
  opts: { oilWeightG?: number; priceOverride?: ReadonlyMap<number, number> } = {},
): CostSheet {
  const oilWeightG = opts.oilWeightG ?? recipe.mouldOilWeightG
  const overrides = opts.priceOverride ?? new Map<number, number>()
  const sheet = computeRecipeBatchSheet(toBatchRecipe(recipe), oilWeightG)
  const barsCut =
    opts.oilWeightG == null || opts.oilWeightG === recipe.mouldOilWeightG
      ? recipe.barsPerMould
      : barsFromBatch(sheet.totalG, recipe.barWeightG)
  if (barsCut <= recipe.barsKeptBack) {
    throw AppError.field(
      'query.oilWeightG',
      `A batch of ${oilWeightG} g of oils cuts ${barsCut} bars; with ${recipe.barsKeptBack} kept back none are left to sell.`,
    )
  }
  const sellableBars = barsCut - recipe.barsKeptBack

  const kindOf = new Map<number, IngredientKind>(
    [...recipe.oils, ...recipe.fragrances, ...recipe.additives].map((i) => [i.ingredientId, i.kind]),
  )
  const warnings: CostSheet['warnings'] = []
  const missing: string[] = []

  const priced = (
    ingredientId: number | null,
    name: string,
  ): Pick<CostSheetLine, 'unitCostCents' | 'noCost' | 'overridden'> => {
    if (ingredientId == null) return { unitCostCents: null, noCost: true, overridden: false }
    const override = overrides.get(ingredientId)
    if (override != null) return { unitCostCents: override, noCost: false, overridden: true }
    const unit = unitCosts.get(ingredientId) ?? null
    if (unit == null) {
      warnings.push({
        code: 'no_cost',
        ingredientId,
        message: `${name}: nothing on hand to price it, so it is counted at 0. Record a purchase to cost it.`,
      })
      missing.push(name)
      return { unitCostCents: null, noCost: true, overridden: false }
    }
    return { unitCostCents: unit, noCost: false, overridden: false }
  }

  const lines: CostSheetLine[] = sheet.lines.map((l) => {
    let ingredientId = l.ingredientId
    let name = l.name
    let kind: IngredientKind
    if (l.role === 'lye') {
      ingredientId = recipe.lye?.ingredientId ?? null
      name = recipe.lye?.name ?? LYE_LINE_NAME
      kind = 'lye'
    } else if (l.role === 'water') {
      ingredientId = recipe.water?.ingredientId ?? null
      name = recipe.water?.name ?? WATER_LINE_NAME
      kind = 'liquid'
    } else {
      kind = kindOf.get(l.ingredientId!) ?? 'additive'
    }
    if (ingredientId == null) {
      warnings.push({
        code: 'not_costed',
        ingredientId: null,
        message: `${name}: the recipe names no ${l.role} ingredient, so it is counted at 0.`,
      })
      missing.push(name)
    }
    const price = priced(ingredientId, name)
    return {
      ingredientId,
      name,
      kind,
      role: l.role,
      quantity: l.grams,
      unit: 'g',
      perBar: null,
      ...price,
      lineCostCents: price.unitCostCents == null ? 0 : l.grams * price.unitCostCents,
    }
  })

  let packagingPerBarCents = 0
  for (const p of recipe.packaging) {
    const price = priced(p.ingredientId, p.name)
    const perBarCents = price.unitCostCents == null ? 0 : p.qtyPerBar * price.unitCostCents
    packagingPerBarCents += perBarCents
    lines.push({
      ingredientId: p.ingredientId,
      name: p.name,
      kind: 'packaging',
      role: 'packaging',
      quantity: p.qtyPerBar * sellableBars,
      unit: 'each',
      perBar: p.qtyPerBar,
      ...price,
      lineCostCents: perBarCents * sellableBars,
    })
  }

  const ingredientCostCents = lines
    .filter((l) => l.role !== 'packaging')
    .reduce((s, l) => s + l.lineCostCents, 0)
  const cost = costPerBar({
    ingredientCostCents,
    packagingPerBarCents,
    labourMinutes: recipe.labourMinutes,
    hourlyRateCents: settings.labourRateCents,
    barsCut,
    barsKeptBack: recipe.barsKeptBack,
  })
  const breakdown = costBreakdown<CostCategory>([
    ...lines
      .filter((l) => l.role !== 'packaging')
      .map((l) => ({ category: l.kind as CostCategory, cents: l.lineCostCents })),
    { category: 'packaging', cents: cost.packagingCents },
    { category: 'labour', cents: cost.labourCents },
  ])

  const nameOf = new Map(lines.filter((l) => l.ingredientId != null).map((l) => [l.ingredientId!, l.name]))
  return {
    recipeId: recipe.id,
    recipeName: recipe.name,
    currency: settings.currency,
    oilWeightG,
    barsCut,
    barsKeptBack: recipe.barsKeptBack,
    sellableBars,
    lines,
    ingredientCostCents,
    packagingPerBarCents,
    packagingCents: cost.packagingCents,
    labourMinutes: recipe.labourMinutes,
    labourRateCents: settings.labourRateCents,
    labourCents: cost.labourCents,
    totalBatchCents: cost.totalBatchCents,
    costPerBarCents: cost.costPerBarCents,
    breakdown,
    overrides: [...overrides].map(([ingredientId, centsPerUnit]) => ({
      ingredientId,
      name: nameOf.get(ingredientId) ?? '',
      centsPerUnit,
      currentUnitCostCents: unitCosts.get(ingredientId) ?? null,
    })),
    missingCosts: [...new Set(missing)],
    warnings,
  }
}
