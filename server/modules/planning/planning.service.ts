import type { Transaction } from 'sequelize'
import { QueryTypes } from 'sequelize'
import { expectedBars } from '@shared/domain/batches/expected-bars'
import { addDays, compareIso, formatDate, startOfIsoWeek } from '@shared/domain/dates/dates'
import { planProduct, stockOutlook, weeklyDemand } from '@shared/domain/planning/pour-plan'
import type {
  CreatePlannedPourInput,
  PlanIngredient,
  PlannedPour,
  PlannedPourStatus,
  PlanProduct,
  PlanQuery,
  PourPlan,
} from '@shared/schemas/planning'
import type { Recipe } from '@shared/schemas/recipes'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { studioToday } from '@server/modules/availability/availability.service'
import { batchNeeds } from '@server/modules/batches/batch-needs'
import { loadRecipes } from '@server/modules/recipes/recipe.queries'
import { getSettings } from '@server/modules/settings/settings.service'

// The pour plan: demand from the order history, supply from the ledger (ready and curing free
// bars) and the owner's planned pours, and from them each product's run-out date, latest pour
// date and suggested pour (shared/domain/planning/pour-plan.ts); then what those pours take from
// the shelves against what is on them. Every read is one set-based query over all products.

const select = <T extends object>(sql: string, bind: unknown[], transaction?: Transaction) =>
  sequelize.query<T>(sql, { bind, type: QueryTypes.SELECT, transaction })

type ProductRow = {
  id: number
  sku: string
  name: string
  case_pack: number
  cut_weight_g: number
  recipe_id: number
}

const sellablePerMould = (recipe: Recipe, cutWeightG: number) => {
  const e = expectedBars(recipe, recipe.mouldOilWeightG, cutWeightG)
  return Math.max(1, e.barsCut - e.barsKeptBack)
}

/** Bars a pour of `moulds` moulds is expected to give to sell, and its oil weight. */
export function pourSize(recipe: Recipe, cutWeightG: number, moulds: number) {
  const oilWeightG = Math.round(moulds * recipe.mouldOilWeightG * 100) / 100
  const e = expectedBars(recipe, oilWeightG, cutWeightG)
  return { oilWeightG, sellableBars: Math.max(1, e.barsCut - e.barsKeptBack) }
}

type PlannedDb = {
  id: number
  product_id: number
  sku: string
  product_name: string
  pour_date: string
  moulds: number
  oil_weight_g: string
  expected_bars: number
  status: PlannedPourStatus
  batch_id: number | null
  note: string | null
  cure_days: number
}

const PLANNED_SQL = `
  SELECT pp.id, pp.product_id, p.sku, p.name AS product_name, pp.pour_date, pp.moulds, pp.oil_weight_g,
         pp.expected_bars, pp.status, pp.batch_id, pp.note, r.cure_days
    FROM planned_pours pp JOIN products p ON p.id = pp.product_id JOIN recipes r ON r.id = p.recipe_id`

const toPlanned = (r: PlannedDb): PlannedPour => ({
  id: r.id,
  productId: r.product_id,
  sku: r.sku,
  productName: r.product_name,
  pourDate: r.pour_date,
  moulds: r.moulds,
  oilWeightG: Number(r.oil_weight_g),
  expectedBars: r.expected_bars,
  readyDate: addDays(r.pour_date, r.cure_days),
  status: r.status,
  batchId: r.batch_id,
  note: r.note,
})

export async function buildPourPlan(q: PlanQuery, transaction?: Transaction): Promise<PourPlan> {
  const today = await studioToday(transaction)
  const { timeZone, pourLeadTimeDays } = await getSettings(transaction)
  const windowEnd = today
  const windowStart = addDays(today, -(q.windowWeeks * 7 - 1))

  const products = await select<ProductRow>(
    `SELECT p.id, p.sku, p.name, p.case_pack, p.cut_weight_g, p.recipe_id
       FROM products p JOIN recipes r ON r.id = p.recipe_id
      WHERE p.active AND r.archived_at IS NULL
      ORDER BY p.sku`,
    [],
    transaction,
  )
  const recipes = new Map(
    (await loadRecipes([...new Set(products.map((p) => p.recipe_id))], transaction)).map((r) => [r.id, r]),
  )
  // Free bars by product and ready date (ready ones dated today or before).
  const stock = await select<{ product_id: number; ready_date: string; free: number }>(
    `SELECT b.product_id, b.ready_date, SUM(s.free)::int AS free
       FROM batches b JOIN batch_stock s ON s.batch_id = b.id
      WHERE s.free > 0
      GROUP BY b.product_id, b.ready_date`,
    [],
    transaction,
  )
  // Bars ordered per product and studio day in the window (cancelled orders and lines taken off
  // excluded, and pre-orders still waiting for their batch counted apart), plus those waiting.
  const demand = await select<{ product_id: number; day: string | null; bars: number }>(
    `SELECT l.product_id,
            CASE WHEN l.preorder AND o.status <> 'shipped'
                      AND NOT EXISTS (SELECT 1 FROM allocations a WHERE a.order_line_id = l.id)
                 THEN NULL ELSE (o.created_at AT TIME ZONE $3)::date::text END AS day,
            SUM(l.bars)::int AS bars
       FROM order_lines l JOIN orders o ON o.id = l.order_id
      WHERE o.status <> 'cancelled' AND l.removed_at IS NULL
        AND ((o.created_at AT TIME ZONE $3)::date BETWEEN $1::date AND $2::date OR l.preorder)
      GROUP BY 1, 2`,
    [windowStart, windowEnd, timeZone],
    transaction,
  )
  const planned = (
    await select<PlannedDb>(
      `${PLANNED_SQL} WHERE pp.status = 'planned' ORDER BY pp.pour_date, pp.id`,
      [],
      transaction,
    )
  ).map(toPlanned)

  const plans: PlanProduct[] = []
  const pours: { product: ProductRow; recipe: Recipe; oilWeightG: number; sellableBars: number }[] = []
  for (const p of products) {
    const recipe = recipes.get(p.recipe_id)
    if (!recipe) continue
    const mine = stock.filter((s) => s.product_id === p.id)
    const readyBars = mine.filter((s) => compareIso(s.ready_date, today) <= 0).reduce((n, s) => n + s.free, 0)
    const curing = mine
      .filter((s) => compareIso(s.ready_date, today) > 0)
      .map((s) => ({ readyDate: s.ready_date, bars: s.free }))
    const orders = demand
      .filter((d) => d.product_id === p.id && d.day !== null)
      .map((d) => ({ date: d.day!, bars: d.bars }))
      .filter((d) => compareIso(d.date, windowStart) >= 0 && compareIso(d.date, windowEnd) <= 0)
    const preorderBars = demand
      .filter((d) => d.product_id === p.id && d.day === null)
      .reduce((n, d) => n + d.bars, 0)
    const myPlanned = planned.filter((pp) => pp.productId === p.id)
    const weekly = weeklyDemand(orders, windowStart, windowEnd)
    const perMould = sellablePerMould(recipe, p.cut_weight_g)
    const result = planProduct(
      {
        productId: p.id,
        cureDays: recipe.cureDays,
        sellableBarsPerMould: perMould,
        readyBars,
        curing,
        planned: myPlanned.map((pp) => ({ pourDate: pp.pourDate, bars: pp.expectedBars })),
        weeklyDemandBars: weekly,
        preorderBars,
      },
      { today, leadTimeDays: pourLeadTimeDays, coverWeeks: q.coverWeeks, horizonWeeks: q.horizonWeeks },
    )
    let suggestion: PlanProduct['suggestion'] = null
    if (result.suggestion) {
      const size = pourSize(recipe, p.cut_weight_g, result.suggestion.moulds)
      suggestion = { ...result.suggestion, bars: size.sellableBars, oilWeightG: size.oilWeightG }
      pours.push({ product: p, recipe, ...size })
    }
    for (const pp of myPlanned) {
      pours.push({ product: p, recipe, oilWeightG: pp.oilWeightG, sellableBars: pp.expectedBars })
    }
    plans.push({
      productId: p.id,
      sku: p.sku,
      name: p.name,
      casePack: p.case_pack,
      cureDays: recipe.cureDays,
      sellableBarsPerMould: perMould,
      readyBars,
      curingBars: curing.reduce((n, c) => n + c.bars, 0),
      plannedBars: myPlanned.reduce((n, pp) => n + pp.expectedBars, 0),
      orderedBars: orders.reduce((n, o) => n + o.bars, 0),
      weeklyDemandBars: Math.round(weekly * 100) / 100,
      weeklyDemandCases: Math.round((weekly / p.case_pack) * 100) / 100,
      preorderBars,
      uncoveredPreorderBars: result.uncoveredPreorderBars,
      runOutDate: result.runOutDate,
      latestPourDate: result.latestPourDate,
      suggestion,
      shortIngredients: [],
      outlook: stockOutlook(
        {
          readyBars,
          curing: [...curing, ...myPlanned.map((pp) => ({ readyDate: pp.readyDate, bars: pp.expectedBars }))],
          weeklyDemandBars: weekly,
        },
        today,
        q.horizonWeeks + 1,
      ),
    })
  }

  const ingredients = await planIngredients(pours, transaction)
  const short = new Set(ingredients.filter((i) => i.toBuy > 0).map((i) => i.ingredientId))
  for (const plan of plans) {
    const recipe = recipes.get(products.find((p) => p.id === plan.productId)!.recipe_id)!
    if (!plan.suggestion && plan.plannedBars === 0) continue
    plan.shortIngredients = recipeIngredients(recipe)
      .filter((i) => short.has(i.ingredientId))
      .map((i) => i.name)
  }

  const byWeek = new Map<string, PourPlan['weeks'][number]['pours']>()
  for (const plan of plans) {
    if (!plan.suggestion) continue
    const week = startOfIsoWeek(plan.suggestion.pourBy)
    byWeek.set(week, [
      ...(byWeek.get(week) ?? []),
      {
        productId: plan.productId,
        sku: plan.sku,
        name: plan.name,
        pourBy: plan.suggestion.pourBy,
        late: plan.suggestion.late,
        moulds: plan.suggestion.moulds,
        bars: plan.suggestion.bars,
      },
    ])
  }
  const weeks = [...byWeek.entries()]
    .sort(([a], [b]) => compareIso(a, b))
    .map(([weekStart, list]) => ({
      weekStart,
      pours: list.sort((a, b) => compareIso(a.pourBy, b.pourBy) || a.sku.localeCompare(b.sku)),
    }))

  return {
    today,
    windowStart,
    windowEnd,
    windowWeeks: q.windowWeeks,
    coverWeeks: q.coverWeeks,
    horizonWeeks: q.horizonWeeks,
    leadTimeDays: pourLeadTimeDays,
    products: plans,
    weeks,
    planned,
    ingredients,
  }
}

function recipeIngredients(recipe: Recipe): { ingredientId: number; name: string }[] {
  return [
    ...recipe.oils,
    ...recipe.fragrances,
    ...recipe.additives,
    ...recipe.packaging,
    ...(recipe.lye ? [recipe.lye] : []),
    ...(recipe.water ? [recipe.water] : []),
  ]
}

/**
 * What the pours take (each pour's batch sheet, as the batch form computes it, plus packaging per
 * sellable bar) against what the lots hold now, and what to buy. Every ingredient of every pour is
 * listed, the ones with nothing on hand too.
 */
async function planIngredients(
  pours: { recipe: Recipe; oilWeightG: number; sellableBars: number }[],
  transaction?: Transaction,
): Promise<PlanIngredient[]> {
  const totals = new Map<number, Omit<PlanIngredient, 'onHand' | 'toBuy'>>()
  for (const pour of pours) {
    for (const need of batchNeeds(pour.recipe, pour.oilWeightG, pour.sellableBars).needs) {
      const seen = totals.get(need.ingredientId)
      if (seen) seen.needed += need.needed
      else
        totals.set(need.ingredientId, {
          ingredientId: need.ingredientId,
          name: need.name,
          kind: need.kind,
          unit: need.unit,
          needed: need.needed,
        })
    }
  }
  const ids = [...totals.keys()]
  const onHand = new Map(
    (
      await select<{ ingredient_id: number; remaining: string }>(
        `SELECT ingredient_id, SUM(remaining) AS remaining FROM ingredient_lots
          WHERE ingredient_id = ANY($1::int[]) GROUP BY ingredient_id`,
        [ids],
        transaction,
      )
    ).map((r) => [r.ingredient_id, Number(r.remaining)]),
  )
  const round = (n: number) => Math.round(n * 100) / 100
  return [...totals.values()]
    .map((t) => {
      const has = round(onHand.get(t.ingredientId) ?? 0)
      const needed = round(t.needed)
      return { ...t, needed, onHand: has, toBuy: Math.max(0, round(needed - has)) }
    })
    .sort((a, b) => b.toBuy - a.toBuy || a.name.localeCompare(b.name))
}

// ---- planned pours ----------------------------------------------------------------------------

export async function getPlannedPour(id: number): Promise<PlannedPour | null> {
  const [row] = await select<PlannedDb>(`${PLANNED_SQL} WHERE pp.id = $1`, [id])
  return row ? toPlanned(row) : null
}

export async function createPlannedPour(input: CreatePlannedPourInput, userId: number): Promise<PlannedPour> {
  const today = await studioToday()
  if (compareIso(input.pourDate, today) < 0) {
    throw AppError.field('pourDate', `Plan a pour for today (${formatDate(today)}) or later.`)
  }
  const [product] = await select<ProductRow & { active: boolean; archived: boolean }>(
    `SELECT p.id, p.sku, p.name, p.case_pack, p.cut_weight_g, p.recipe_id, p.active, (r.archived_at IS NOT NULL) AS archived
       FROM products p JOIN recipes r ON r.id = p.recipe_id WHERE p.id = $1`,
    [input.productId],
  )
  if (!product) throw AppError.field('productId', 'There is no product with that id.')
  if (!product.active || product.archived) {
    throw AppError.unprocessable(
      'not_pourable',
      `${product.name} is not poured now (inactive, or its recipe is archived).`,
      [{ field: 'productId', message: 'Choose an active product with a current recipe.' }],
    )
  }
  const [recipe] = await loadRecipes([product.recipe_id])
  const size = pourSize(recipe!, product.cut_weight_g, input.moulds)
  const id = await sequelize.transaction(async (t) => {
    const [row] = await select<{ id: number }>(
      `INSERT INTO planned_pours (product_id, pour_date, moulds, oil_weight_g, expected_bars, note, created_by)
       VALUES ($1, $2, $3, $4, $5, $6, $7) RETURNING id`,
      [product.id, input.pourDate, input.moulds, size.oilWeightG, size.sellableBars, input.note, userId],
      t,
    )
    await audit(
      { userId, action: 'planned_pour.created', entity: 'planned_pour', entityId: row!.id, data: input },
      t,
    )
    return row!.id
  })
  return (await getPlannedPour(id))!
}

export async function dropPlannedPour(id: number, userId: number): Promise<PlannedPour> {
  await sequelize.transaction(async (t) => {
    const [row] = await select<{ status: string }>(
      'SELECT status FROM planned_pours WHERE id = $1 FOR UPDATE',
      [id],
      t,
    )
    if (!row) throw AppError.notFound('That planned pour')
    if (row.status !== 'planned') {
      throw AppError.conflict('plan_closed', `That planned pour was already ${row.status}.`)
    }
    await sequelize.query(`UPDATE planned_pours SET status = 'dropped', updated_at = now() WHERE id = $1`, {
      bind: [id],
      transaction: t,
    })
    await audit({ userId, action: 'planned_pour.dropped', entity: 'planned_pour', entityId: id }, t)
  })
  return (await getPlannedPour(id))!
}
