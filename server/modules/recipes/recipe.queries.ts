import type { Transaction } from 'sequelize'
import { QueryTypes } from 'sequelize'
import type { IngredientKind, Recipe, RecipeIngredientOption, WaterMode } from '@shared/schemas/recipes'
import type { BatchRecipe } from '@shared/domain/batch-sheet/batch-sheet'
import { sequelize } from '@server/db/sequelize'

// Read paths for recipes, on raw SQL: a recipe is one row plus its items joined to ingredients.
// The ingredients and lots tables belong to the ingredients module; they are only read here.

type RecipeRow = {
  id: number
  name: string
  notes: string | null
  superfat_pct: string
  water_mode: WaterMode
  lye_concentration_pct: string | null
  water_lye_ratio: string | null
  lye_ingredient_id: number | null
  lye_name: string | null
  lye_kind: IngredientKind | null
  lye_purity_pct: string | null
  water_ingredient_id: number | null
  water_name: string | null
  water_kind: IngredientKind | null
  labour_minutes: number
  cure_days: number
  bar_weight_g: string
  bars_per_mould: number
  bars_kept_back: number
  mould_oil_weight_g: string
  archived_at: Date | null
  created_at: Date
  updated_at: Date
}

type ItemRow = {
  recipe_id: number
  ingredient_id: number
  role: 'oil' | 'fragrance' | 'additive' | 'packaging'
  pct_of_oils: string | null
  g_per_kg_oils: string | null
  qty_per_bar: string | null
  name: string
  kind: IngredientKind
  inci: string | null
  sap_naoh: string | null
  max_usage_pct: string | null
  vanillin_pct: string | null
}

const n = (v: string | number) => Number(v)
const nOrNull = (v: string | number | null) => (v == null ? null : Number(v))

/** Recipes by id (archived ones too), items in their saved order. Ids not found are left out. */
export async function loadRecipes(ids: readonly number[], transaction?: Transaction): Promise<Recipe[]> {
  if (ids.length === 0) return []
  const rows = await sequelize.query<RecipeRow>(
    `SELECT r.*, l.name AS lye_name, l.kind AS lye_kind, l.purity_pct AS lye_purity_pct,
            w.name AS water_name, w.kind AS water_kind
       FROM recipes r
       LEFT JOIN ingredients l ON l.id = r.lye_ingredient_id
       LEFT JOIN ingredients w ON w.id = r.water_ingredient_id
      WHERE r.id = ANY($1::int[])
      ORDER BY lower(r.name), r.id`,
    { bind: [ids], type: QueryTypes.SELECT, transaction },
  )
  const items = await sequelize.query<ItemRow>(
    `SELECT ri.recipe_id, ri.ingredient_id, ri.role, ri.pct_of_oils, ri.g_per_kg_oils, ri.qty_per_bar,
            i.name, i.kind, i.inci, i.sap_naoh, i.max_usage_pct, i.vanillin_pct
       FROM recipe_items ri JOIN ingredients i ON i.id = ri.ingredient_id
      WHERE ri.recipe_id = ANY($1::int[])
      ORDER BY ri.recipe_id, ri.sort_order, ri.id`,
    { bind: [ids], type: QueryTypes.SELECT, transaction },
  )
  const byRecipe = new Map<number, ItemRow[]>()
  for (const it of items) byRecipe.set(it.recipe_id, [...(byRecipe.get(it.recipe_id) ?? []), it])

  return rows.map((r) => {
    const its = byRecipe.get(r.id) ?? []
    const of = (role: ItemRow['role']) => its.filter((i) => i.role === role)
    return {
      id: r.id,
      name: r.name,
      notes: r.notes,
      superfatPct: n(r.superfat_pct),
      waterMode: r.water_mode,
      lyeConcentrationPct: nOrNull(r.lye_concentration_pct),
      waterLyeRatio: nOrNull(r.water_lye_ratio),
      lye:
        r.lye_ingredient_id == null
          ? null
          : {
              ingredientId: r.lye_ingredient_id,
              name: r.lye_name!,
              kind: r.lye_kind!,
              purityPct: nOrNull(r.lye_purity_pct),
            },
      water:
        r.water_ingredient_id == null
          ? null
          : { ingredientId: r.water_ingredient_id, name: r.water_name!, kind: r.water_kind! },
      oils: of('oil').map((i) => ({
        ingredientId: i.ingredient_id,
        name: i.name,
        kind: i.kind,
        inci: i.inci,
        pct: n(i.pct_of_oils!),
        sapNaoh: n(i.sap_naoh ?? 0),
      })),
      fragrances: of('fragrance').map((i) => ({
        ingredientId: i.ingredient_id,
        name: i.name,
        kind: i.kind,
        inci: i.inci,
        pct: n(i.pct_of_oils!),
        maxUsagePct: nOrNull(i.max_usage_pct),
        vanillinPct: nOrNull(i.vanillin_pct),
      })),
      additives: of('additive').map((i) => ({
        ingredientId: i.ingredient_id,
        name: i.name,
        kind: i.kind,
        inci: i.inci,
        gPerKg: n(i.g_per_kg_oils!),
      })),
      packaging: of('packaging').map((i) => ({
        ingredientId: i.ingredient_id,
        name: i.name,
        kind: i.kind,
        qtyPerBar: n(i.qty_per_bar!),
      })),
      labourMinutes: r.labour_minutes,
      cureDays: r.cure_days,
      barWeightG: n(r.bar_weight_g),
      barsPerMould: r.bars_per_mould,
      barsKeptBack: r.bars_kept_back,
      mouldOilWeightG: n(r.mould_oil_weight_g),
      archivedAt: r.archived_at ? r.archived_at.toISOString() : null,
      createdAt: r.created_at.toISOString(),
      updatedAt: r.updated_at.toISOString(),
    }
  })
}

export async function loadRecipe(id: number, transaction?: Transaction): Promise<Recipe | null> {
  return (await loadRecipes([id], transaction))[0] ?? null
}

/** Every ingredient a recipe's cost depends on. */
export function costedIngredientIds(recipe: Recipe): number[] {
  return [
    ...recipe.oils,
    ...recipe.fragrances,
    ...recipe.additives,
    ...recipe.packaging,
    ...(recipe.lye ? [recipe.lye] : []),
    ...(recipe.water ? [recipe.water] : []),
  ].map((i) => i.ingredientId)
}

export type BatchRecipeSource = Pick<
  Recipe,
  'superfatPct' | 'waterMode' | 'lyeConcentrationPct' | 'waterLyeRatio'
> & {
  lye: { purityPct: number | null } | null
  oils: readonly { ingredientId: number; name: string; pct: number; sapNaoh: number }[]
  fragrances: readonly {
    ingredientId: number
    name: string
    pct: number
    maxUsagePct: number | null
    vanillinPct: number | null
  }[]
  additives: readonly { ingredientId: number; name: string; gPerKg: number }[]
}

/** The recipe as the batch-sheet computation takes it (purity from the recipe's lye, 100 % without one). */
export function toBatchRecipe(recipe: BatchRecipeSource): BatchRecipe {
  return {
    oils: recipe.oils.map((o) => ({
      ingredientId: o.ingredientId,
      name: o.name,
      pct: o.pct,
      sapNaoh: o.sapNaoh,
    })),
    superfatPct: recipe.superfatPct,
    water:
      recipe.waterMode === 'ratio'
        ? { mode: 'ratio', ratio: recipe.waterLyeRatio! }
        : { mode: 'concentration', pct: recipe.lyeConcentrationPct! },
    lyePurityPct: recipe.lye?.purityPct ?? 100,
    fragrances: recipe.fragrances.map((f) => ({
      ingredientId: f.ingredientId,
      name: f.name,
      pctOfOils: f.pct,
      maxUsagePct: f.maxUsagePct,
      vanillinPct: f.vanillinPct,
    })),
    additives: recipe.additives.map((a) => ({
      ingredientId: a.ingredientId,
      name: a.name,
      gPerKgOils: a.gPerKg,
    })),
  }
}

/** The ingredients in use, with what the recipe form needs to check rows as they are typed. */
export async function ingredientOptions(): Promise<RecipeIngredientOption[]> {
  const rows = await sequelize.query<{
    id: number
    name: string
    kind: IngredientKind
    sap_naoh: string | null
    purity_pct: string | null
    max_usage_pct: string | null
    vanillin_pct: string | null
    unit: 'g' | 'each'
  }>(
    `SELECT id, name, kind, sap_naoh, purity_pct, max_usage_pct, vanillin_pct, unit
       FROM ingredients WHERE archived_at IS NULL ORDER BY lower(name), id`,
    { type: QueryTypes.SELECT },
  )
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    kind: r.kind,
    sapNaoh: nOrNull(r.sap_naoh),
    purityPct: nOrNull(r.purity_pct),
    maxUsagePct: nOrNull(r.max_usage_pct),
    vanillinPct: nOrNull(r.vanillin_pct),
    unit: r.unit,
  }))
}
