import type { Transaction } from 'sequelize'
import { QueryTypes, UniqueConstraintError } from 'sequelize'
import { computeRecipeBatchSheet } from '@shared/domain/batch-sheet/batch-sheet'
import { DomainError } from '@shared/domain/errors'
import type { ErrorDetail } from '@shared/schemas/errors'
import type { IngredientKind, Recipe, RecipeInput, RecipeListItem } from '@shared/schemas/recipes'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { costPerBarForRecipes } from '@server/modules/recipes/recipe-cost.service'
import { RecipeItemModel, RecipeModel } from '@server/modules/recipes/recipe.model'
import type { RecipeItemRole } from '@server/modules/recipes/recipe.model'
import { loadRecipe, loadRecipes, toBatchRecipe } from '@server/modules/recipes/recipe.queries'

export async function listRecipes(opts: {
  archived: boolean
  withCosts: boolean
}): Promise<RecipeListItem[]> {
  const ids = await sequelize.query<{ id: number }>(
    'SELECT id FROM recipes WHERE (archived_at IS NOT NULL) = $1',
    { bind: [opts.archived], type: QueryTypes.SELECT },
  )
  const recipes = await loadRecipes(ids.map((r) => r.id))
  const costs = opts.withCosts ? await costPerBarForRecipes(recipes.map((r) => r.id)) : null
  return recipes.map((r) => ({
    id: r.id,
    name: r.name,
    oils: r.oils.map((o) => ({ name: o.name, pct: o.pct })),
    superfatPct: r.superfatPct,
    cureDays: r.cureDays,
    barWeightG: r.barWeightG,
    barsPerMould: r.barsPerMould,
    barsKeptBack: r.barsKeptBack,
    mouldOilWeightG: r.mouldOilWeightG,
    archivedAt: r.archivedAt,
    costPerBarCents: costs?.get(r.id)?.costPerBarCents ?? null,
    missingCosts: costs?.get(r.id)?.missingCosts ?? [],
  }))
}

export async function getRecipe(id: number): Promise<Recipe> {
  const recipe = await loadRecipe(id)
  if (!recipe) throw AppError.notFound('That recipe')
  return recipe
}

export async function createRecipe(input: RecipeInput, byUserId: number): Promise<Recipe> {
  const id = await sequelize.transaction(async (t) => {
    await checkName(input.name, null, t)
    await checkIngredients(input, t)
    const recipe = await saveCatching(() =>
      RecipeModel.create({ ...columnsOf(input), archivedAt: null }, { transaction: t }),
    )
    await writeItems(recipe.id, input, t)
    await audit(
      { userId: byUserId, action: 'recipe.created', entity: 'recipe', entityId: recipe.id, data: input },
      t,
    )
    return recipe.id
  })
  return getRecipe(id)
}

/** Replaces the whole recipe, items included, in one transaction. */
export async function updateRecipe(id: number, input: RecipeInput, byUserId: number): Promise<Recipe> {
  await sequelize.transaction(async (t) => {
    const recipe = await RecipeModel.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE })
    if (!recipe) throw AppError.notFound('That recipe')
    if (recipe.archivedAt)
      throw AppError.conflict('recipe_archived', 'Restore this recipe before changing it.')
    await checkName(input.name, id, t)
    await checkIngredients(input, t)
    await saveCatching(() => recipe.update(columnsOf(input), { transaction: t }))
    await RecipeItemModel.destroy({ where: { recipeId: id }, transaction: t })
    await writeItems(id, input, t)
    await audit(
      { userId: byUserId, action: 'recipe.updated', entity: 'recipe', entityId: id, data: input },
      t,
    )
  })
  return getRecipe(id)
}

/** Archived recipes leave the list and cannot be changed; batches keep their own snapshot. */
export async function setArchived(id: number, archived: boolean, byUserId: number): Promise<Recipe> {
  await sequelize.transaction(async (t) => {
    const recipe = await RecipeModel.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE })
    if (!recipe) throw AppError.notFound('That recipe')
    if (archived === (recipe.archivedAt != null)) return
    if (!archived) await checkName(recipe.name, id, t)
    await saveCatching(() => recipe.update({ archivedAt: archived ? new Date() : null }, { transaction: t }))
    await audit(
      {
        userId: byUserId,
        action: archived ? 'recipe.archived' : 'recipe.restored',
        entity: 'recipe',
        entityId: id,
      },
      t,
    )
  })
  return getRecipe(id)
}

function columnsOf(input: RecipeInput) {
  return {
    name: input.name,
    notes: input.notes,
    superfatPct: input.superfatPct,
    waterMode: input.waterMode,
    lyeConcentrationPct: input.lyeConcentrationPct,
    waterLyeRatio: input.waterLyeRatio,
    lyeIngredientId: input.lyeIngredientId,
    waterIngredientId: input.waterIngredientId,
    labourMinutes: input.labourMinutes,
    cureDays: input.cureDays,
    barWeightG: input.barWeightG,
    barsPerMould: input.barsPerMould,
    barsKeptBack: input.barsKeptBack,
    mouldOilWeightG: input.mouldOilWeightG,
  }
}

async function writeItems(recipeId: number, input: RecipeInput, t: Transaction) {
  const rows: {
    recipeId: number
    ingredientId: number
    role: RecipeItemRole
    pctOfOils: number | null
    gPerKgOils: number | null
    qtyPerBar: number | null
    sortOrder: number
  }[] = []
  const add = (
    role: RecipeItemRole,
    ingredientId: number,
    v: Partial<Pick<(typeof rows)[number], 'pctOfOils' | 'gPerKgOils' | 'qtyPerBar'>>,
  ) =>
    rows.push({
      recipeId,
      ingredientId,
      role,
      pctOfOils: null,
      gPerKgOils: null,
      qtyPerBar: null,
      ...v,
      sortOrder: rows.length,
    })
  input.oils.forEach((o) => add('oil', o.ingredientId, { pctOfOils: o.pct }))
  input.fragrances.forEach((f) => add('fragrance', f.ingredientId, { pctOfOils: f.pct }))
  input.additives.forEach((a) => add('additive', a.ingredientId, { gPerKgOils: a.gPerKg }))
  input.packaging.forEach((p) => add('packaging', p.ingredientId, { qtyPerBar: p.qtyPerBar }))
  await RecipeItemModel.bulkCreate(rows, { transaction: t })
}

async function checkName(name: string, exceptId: number | null, t: Transaction) {
  const [row] = await sequelize.query<{ id: number }>(
    `SELECT id FROM recipes WHERE lower(name) = lower($1) AND archived_at IS NULL AND ($2::int IS NULL OR id <> $2)`,
    { bind: [name, exceptId], type: QueryTypes.SELECT, transaction: t },
  )
  if (row) throw AppError.field('name', 'Another recipe already has this name.', 409, 'name_taken')
}

async function saveCatching<T>(save: () => Promise<T>): Promise<T> {
  try {
    return await save()
  } catch (err) {
    // Two saves racing past checkName meet the unique index instead.
    if (err instanceof UniqueConstraintError) {
      throw AppError.field('name', 'Another recipe already has this name.', 409, 'name_taken')
    }
    throw err
  }
}

type IngredientRow = {
  id: number
  name: string
  kind: IngredientKind
  sap_naoh: string | null
  purity_pct: string | null
  max_usage_pct: string | null
  vanillin_pct: string | null
  archived_at: Date | null
}

const KIND_RULES: Record<
  'oils' | 'fragrances' | 'additives' | 'packaging' | 'lye' | 'water',
  { kinds: IngredientKind[]; what: string }
> = {
  oils: { kinds: ['oil'], what: 'an oil or butter' },
  fragrances: { kinds: ['fragrance'], what: 'a fragrance' },
  additives: { kinds: ['additive', 'colourant'], what: 'an additive or colourant' },
  packaging: { kinds: ['packaging'], what: 'a packaging item' },
  lye: { kinds: ['lye'], what: 'a lye' },
  water: { kinds: ['liquid'], what: 'a liquid' },
}

/**
 * Every ingredient must exist, be in use and be of the right kind for its row (400 with the
 * row's field); then the recipe must compute, and no fragrance may exceed its maximum usage
 * (422 fragrance_over_max on `fragrances.N.pct`).
 */
async function checkIngredients(input: RecipeInput, t: Transaction) {
  const ids = [...input.oils, ...input.fragrances, ...input.additives, ...input.packaging].map(
    (r) => r.ingredientId,
  )
  if (input.lyeIngredientId != null) ids.push(input.lyeIngredientId)
  if (input.waterIngredientId != null) ids.push(input.waterIngredientId)
  const rows = await sequelize.query<IngredientRow>(
    `SELECT id, name, kind, sap_naoh, purity_pct, max_usage_pct, vanillin_pct, archived_at
       FROM ingredients WHERE id = ANY($1::int[])`,
    { bind: [[...new Set(ids)]], type: QueryTypes.SELECT, transaction: t },
  )
  const byId = new Map(rows.map((r) => [r.id, r]))
  const details: ErrorDetail[] = []
  const check = (rule: keyof typeof KIND_RULES, id: number, field: string) => {
    const ing = byId.get(id)
    const { kinds, what } = KIND_RULES[rule]
    if (!ing) details.push({ field, message: 'There is no ingredient with this id.' })
    else if (!kinds.includes(ing.kind)) details.push({ field, message: `${ing.name} is not ${what}.` })
    else if (ing.archived_at) details.push({ field, message: `${ing.name} is archived.` })
    else if (rule === 'oils' && ing.sap_naoh == null) {
      details.push({ field, message: `${ing.name} has no saponification value.` })
    }
  }
  input.oils.forEach((r, i) => check('oils', r.ingredientId, `oils.${i}.ingredientId`))
  input.fragrances.forEach((r, i) => check('fragrances', r.ingredientId, `fragrances.${i}.ingredientId`))
  input.additives.forEach((r, i) => check('additives', r.ingredientId, `additives.${i}.ingredientId`))
  input.packaging.forEach((r, i) => check('packaging', r.ingredientId, `packaging.${i}.ingredientId`))
  if (input.lyeIngredientId != null) check('lye', input.lyeIngredientId, 'lyeIngredientId')
  if (input.waterIngredientId != null) check('water', input.waterIngredientId, 'waterIngredientId')
  if (details.length > 0) {
    throw AppError.invalid(
      details.length === 1 ? details[0]!.message : 'Some ingredients need attention.',
      details,
    )
  }

  const num = (v: string | null) => (v == null ? null : Number(v))
  const ing = (id: number) => byId.get(id)!
  const lye = input.lyeIngredientId == null ? null : ing(input.lyeIngredientId)
  const recipe = toBatchRecipe({
    oils: input.oils.map((o) => ({
      ...o,
      name: ing(o.ingredientId).name,
      sapNaoh: Number(ing(o.ingredientId).sap_naoh),
    })),
    superfatPct: input.superfatPct,
    waterMode: input.waterMode,
    lyeConcentrationPct: input.lyeConcentrationPct,
    waterLyeRatio: input.waterLyeRatio,
    lye: lye ? { purityPct: num(lye.purity_pct) } : null,
    fragrances: input.fragrances.map((f) => ({
      ...f,
      name: ing(f.ingredientId).name,
      maxUsagePct: num(ing(f.ingredientId).max_usage_pct),
      vanillinPct: num(ing(f.ingredientId).vanillin_pct),
    })),
    additives: input.additives.map((a) => ({ ...a, name: ing(a.ingredientId).name })),
  })
  let warnings
  try {
    warnings = computeRecipeBatchSheet(recipe, 1000).warnings
  } catch (err) {
    if (err instanceof DomainError && err.field === 'lyePurityPct') {
      throw AppError.field('lyeIngredientId', `This lye's purity cannot be used: ${err.message}`)
    }
    throw err
  }
  const over = warnings
    .filter((w) => w.code === 'fragrance_over_max')
    .map((w) => {
      const i = input.fragrances.findIndex((f) => f.ingredientId === w.ingredientId)
      return { field: `fragrances.${i}.pct`, message: w.message }
    })
  if (over.length > 0) {
    throw AppError.unprocessable(
      'fragrance_over_max',
      over.length === 1 ? over[0]!.message : 'Some fragrances are over their maximum usage.',
      over,
    )
  }
}
