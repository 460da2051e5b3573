import type { Transaction } from 'sequelize'
import { QueryTypes } from 'sequelize'
import { cureProgress, readyDate } from '@shared/domain/availability/availability'
import { formatLotCode, parseLotCode } from '@shared/domain/batches/lot-code'
import { consumeOldestFirst, costPerBar } from '@shared/domain/costing/costing'
import type { LotOnHand, LotTake } from '@shared/domain/costing/costing'
import { compareIso, formatDate, isoToday } from '@shared/domain/dates/dates'
import { roundHalfUp } from '@shared/domain/money/money'
import type {
  BatchDetail,
  BatchLotRow,
  BatchRow,
  BatchStatus,
  BatchSuggestion,
  ListBatchesQuery,
  PourableProduct,
  RecordBatchInput,
  SuggestLotsQuery,
  SuggestedTake,
  SuggestionLine,
  UpdateBatchInput,
} from '@shared/schemas/batches'
import type { Recipe } from '@shared/schemas/recipes'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { Batch } from '@server/modules/batches/batch.model'
import { expectedBars } from '@shared/domain/batches/expected-bars'
import { batchNeeds, roundQty } from '@server/modules/batches/batch-needs'
import type { Need } from '@server/modules/batches/batch-needs'
import { shipmentsForBatches } from '@server/modules/batches/shipments'
import { recordStockMove, toMoveRow } from '@server/modules/batches/stock-moves.service'
import { markPlannedPourPoured } from '@server/modules/planning/planned-pours.service'
import { recipeSnapshot } from '@server/modules/recipes/recipe-cost.service'
import { getSettings } from '@server/modules/settings/settings.service'

// Pouring: what a batch needs and from which lots, recording it in one transaction (lots drawn
// down, the recipe frozen, a lot code, a ready date, a cost per bar, and the `made` move), and the
// read paths of the curing screen. Every query inside a transaction passes it on.

const select = <T extends object>(sql: string, bind: unknown[], transaction?: Transaction) =>
  sequelize.query<T>(sql, { bind, type: QueryTypes.SELECT, transaction })

async function studioToday(transaction?: Transaction): Promise<{ today: string; timeZone: string }> {
  const { timeZone } = await getSettings(transaction)
  return { today: isoToday(new Date(), timeZone), timeZone }
}

// ---- products that can be poured -----------------------------------------------------------

type ProductRow = {
  id: number
  sku: string
  name: string
  active: boolean
  case_pack: number
  cut_weight_g: number
  recipe_id: number
  recipe_name: string
  recipe_archived: boolean
  cure_days: number
  mould_oil_weight_g: string
  bars_per_mould: number
  bars_kept_back: number
  bar_weight_g: string
}

const PRODUCT_SQL = `
  SELECT p.id, p.sku, p.name, p.active, p.case_pack, p.cut_weight_g, p.recipe_id, r.name AS recipe_name,
         (r.archived_at IS NOT NULL) AS recipe_archived, r.cure_days, r.mould_oil_weight_g, r.bars_per_mould,
         r.bars_kept_back, r.bar_weight_g
    FROM products p JOIN recipes r ON r.id = p.recipe_id`

const toPourable = (r: ProductRow): PourableProduct => ({
  id: r.id,
  sku: r.sku,
  name: r.name,
  active: r.active,
  casePack: r.case_pack,
  cutWeightG: r.cut_weight_g,
  recipeId: r.recipe_id,
  recipeName: r.recipe_name,
  cureDays: r.cure_days,
  mouldOilWeightG: Number(r.mould_oil_weight_g),
  barsPerMould: r.bars_per_mould,
  barsKeptBackPerMould: r.bars_kept_back,
  barWeightG: Number(r.bar_weight_g),
})

export async function listPourableProducts(): Promise<PourableProduct[]> {
  const rows = await select<ProductRow>(`${PRODUCT_SQL} ORDER BY p.active DESC, p.sku`, [])
  return rows.map(toPourable)
}

async function productForPour(productId: number, t: Transaction | undefined, lock: boolean) {
  // The recipe row is the lock that queues two pours of one product (their lot codes would clash);
  // the product is only shared-locked so its recipe cannot change under us.
  const [row] = await select<ProductRow>(
    `${PRODUCT_SQL} WHERE p.id = $1${lock ? ' FOR UPDATE OF r FOR SHARE OF p' : ''}`,
    [productId],
    t,
  )
  if (!row) throw AppError.field('productId', 'There is no product with that id.')
  if (row.recipe_archived) {
    throw AppError.unprocessable(
      'recipe_archived',
      `${row.name} uses an archived recipe; give it a current recipe first.`,
      [{ field: 'productId', message: 'This product’s recipe is archived.' }],
    )
  }
  const recipe = await recipeSnapshot(row.recipe_id, t)
  if (!recipe) throw AppError.field('productId', 'This product’s recipe was not found.')
  return { product: row, recipe }
}

// ---- lots --------------------------------------------------------------------------------

type LotDb = {
  id: number
  ingredient_id: number
  ingredient_name: string
  supplier: string
  supplier_lot_code: string | null
  received_on: string
  quantity: string
  remaining: string
  unit_cost: string
}

type Lot = LotOnHand & {
  ingredientId: number
  ingredientName: string
  supplier: string
  supplierLotCode: string | null
}

const LOT_SQL = `
  SELECT l.id, l.ingredient_id, i.name AS ingredient_name, l.supplier, l.supplier_lot_code, l.received_on,
         l.quantity, l.remaining, (l.cost_cents + l.freight_cents)::numeric / l.quantity AS unit_cost
    FROM ingredient_lots l JOIN ingredients i ON i.id = l.ingredient_id`

const toLot = (r: LotDb): Lot => ({
  id: r.id,
  ingredientId: r.ingredient_id,
  ingredientName: r.ingredient_name,
  supplier: r.supplier,
  supplierLotCode: r.supplier_lot_code,
  receivedDate: r.received_on,
  remainingQuantity: Number(r.remaining),
  unitCost: Number(r.unit_cost),
})

/** Lots of these ingredients with something left that had arrived by the pour date, oldest first. */
async function lotsOnHand(
  ingredientIds: number[],
  pourDate: string,
  t: Transaction | undefined,
  lock: boolean,
) {
  const rows = await select<LotDb>(
    `${LOT_SQL}
      WHERE l.ingredient_id = ANY($1::int[]) AND l.remaining > 0 AND l.received_on <= $2
      ORDER BY ${lock ? 'l.id FOR UPDATE OF l' : 'l.received_on, l.id'}`,
    [ingredientIds, pourDate],
    t,
  )
  return rows.map(toLot)
}

type Plan = {
  lines: SuggestionLine[]
  shortfalls: BatchSuggestion['shortfalls']
}

/** The oldest-first takes for every need. */
function planOldestFirst(needs: Need[], lots: Lot[]): Plan {
  const lines: SuggestionLine[] = []
  const shortfalls: Plan['shortfalls'] = []
  for (const need of needs) {
    const mine = lots.filter((l) => l.ingredientId === need.ingredientId)
    const { takes, shortBy } = consumeOldestFirst(mine, need.needed)
    const byId = new Map(mine.map((l) => [l.id, l]))
    const available = roundQty(mine.reduce((s, l) => s + l.remainingQuantity, 0))
    const short = roundQty(shortBy)
    const describe = (l: Lot) => ({
      ingredientLotId: l.id,
      supplier: l.supplier,
      supplierLotCode: l.supplierLotCode,
      receivedOn: l.receivedDate,
      remaining: l.remainingQuantity,
    })
    lines.push({
      ...need,
      available,
      shortBy: short,
      takes: takes.map((tk: LotTake): SuggestedTake => ({
        ...describe(byId.get(tk.lotId)!),
        quantity: roundQty(tk.quantity),
        costCents: roundQty(tk.costCents),
      })),
      lots: [...mine].sort((a, b) => compareIso(a.receivedDate, b.receivedDate) || a.id - b.id).map(describe),
    })
    if (short > 0) {
      shortfalls.push({
        ingredientId: need.ingredientId,
        name: need.name,
        unit: need.unit,
        needed: need.needed,
        available,
        shortBy: short,
      })
    }
  }
  return { lines, shortfalls }
}

const fmtQty = (q: number, unit: 'g' | 'each') =>
  unit === 'each'
    ? `${q} ${q === 1 ? 'piece' : 'pieces'}`
    : `${Number(q.toFixed(2)).toLocaleString('en-US')} g`

// ---- lot codes -------------------------------------------------------------------------------

/** The next lot code of this SKU for the pour date: one more than the day's highest. */
async function nextLotCode(sku: string, pourDate: string, t?: Transaction): Promise<string> {
  const prefix = formatLotCode({ pourDate, sku, seq: 1 }).slice(0, -2)
  const rows = await select<{ lot_code: string }>(
    'SELECT lot_code FROM batches WHERE lot_code LIKE $1',
    [`${prefix.replace(/[\\%_]/g, (c) => `\\${c}`)}%`],
    t,
  )
  // LAV and LAV-MINI share the prefix "…-LAV-": keep only codes whose SKU is exactly ours.
  const seqs = rows.map((r) => parseLotCode(r.lot_code)).filter((p) => p?.sku === sku.toUpperCase())
  const next = Math.max(0, ...seqs.map((p) => p!.seq)) + 1
  if (next > 99) {
    throw AppError.conflict('lot_code_exhausted', `${sku} already has 99 batches poured on ${pourDate}.`, [
      { field: 'pourDate', message: 'No lot numbers left for this product on this day.' },
    ])
  }
  return formatLotCode({ pourDate, sku, seq: next })
}

// ---- suggestion --------------------------------------------------------------------------

function barsFor(
  recipe: Recipe,
  oilWeightG: number,
  cutWeightG: number,
  given: { barsCut?: number; barsKeptBack?: number },
) {
  const expected = expectedBars(recipe, oilWeightG, cutWeightG)
  const barsCut = given.barsCut ?? expected.barsCut
  const barsKeptBack = given.barsKeptBack ?? Math.min(expected.barsKeptBack, barsCut - 1)
  if (barsKeptBack >= barsCut) {
    throw AppError.field(
      'barsKeptBack',
      'Keep back fewer bars than you cut: at least one bar must be left to sell.',
    )
  }
  return { moulds: expected.moulds, barsCut, barsKeptBack, sellableBars: barsCut - barsKeptBack }
}

function costOf(
  lines: { role: string; takes: { costCents: number }[] }[],
  recipe: Recipe,
  labourRateCents: number,
  barsCut: number,
  barsKeptBack: number,
) {
  let ingredientCents = 0
  let packagingCents = 0
  for (const line of lines) {
    const cents = line.takes.reduce((s, tk) => s + tk.costCents, 0)
    if (line.role === 'packaging') packagingCents += cents
    else ingredientCents += cents
  }
  const sellable = barsCut - barsKeptBack
  return costPerBar({
    ingredientCostCents: ingredientCents,
    packagingPerBarCents: packagingCents / sellable,
    labourMinutes: recipe.labourMinutes,
    hourlyRateCents: labourRateCents,
    barsCut,
    barsKeptBack,
  })
}

/**
 * The batch sheet of a planned pour and the oldest-first lots for each ingredient, shortfalls
 * named. Reads only; pass a transaction to see what it has written (a seeder's restock).
 */
export async function suggestLots(q: SuggestLotsQuery, transaction?: Transaction): Promise<BatchSuggestion> {
  const { today } = await studioToday(transaction)
  const pourDate = q.pourDate ?? today
  const { product, recipe } = await productForPour(q.productId, transaction, false)
  const oilWeightG = q.oilWeightG ?? recipe.mouldOilWeightG
  const bars = barsFor(recipe, oilWeightG, product.cut_weight_g, q)
  const { sheet, needs, untracked } = batchNeeds(recipe, oilWeightG, bars.sellableBars)
  const lots = await lotsOnHand(
    needs.map((n) => n.ingredientId),
    pourDate,
    transaction,
    false,
  )
  const plan = planOldestFirst(needs, lots)
  const { labourRateCents } = await getSettings(transaction)
  const cost = costOf(plan.lines, recipe, labourRateCents, bars.barsCut, bars.barsKeptBack)
  return {
    productId: product.id,
    sku: product.sku,
    recipeId: recipe.id,
    recipeName: recipe.name,
    pourDate,
    oilWeightG,
    ...bars,
    cureDays: recipe.cureDays,
    readyDate: readyDate(pourDate, recipe.cureDays),
    lotCode: await nextLotCode(product.sku, pourDate, transaction),
    lines: plan.lines,
    shortfalls: plan.shortfalls,
    warnings: sheet.warnings,
    untracked,
    estimatedCostPerBarCents: plan.shortfalls.length ? null : cost.costPerBarCents,
  }
}

// ---- recording a batch ---------------------------------------------------------------------

type Take = { lot: Lot; quantity: number; costCents: number; role: string }

/** The owner's own list of lots: every one real, of this recipe, arrived by the pour date, with enough left. */
function takesFromInput(
  input: NonNullable<RecordBatchInput['lots']>,
  lots: Lot[],
  needs: Need[],
  pourDate: string,
): Take[] {
  const byId = new Map(lots.map((l) => [l.id, l]))
  const needOf = new Map(needs.map((n) => [n.ingredientId, n]))
  const problems: { field: string; message: string }[] = []
  const short: Record<string, unknown>[] = []
  const takes: Take[] = []
  input.forEach((row, i) => {
    if (row.quantity === 0) return
    const lot = byId.get(row.ingredientLotId)
    const field = `lots.${i}.ingredientLotId`
    if (!lot) return problems.push({ field, message: 'There is no purchase lot with that id.' })
    const need = needOf.get(lot.ingredientId)
    if (!need)
      return problems.push({ field, message: `${lot.ingredientName} is not in this product’s recipe.` })
    if (compareIso(lot.receivedDate, pourDate) > 0) {
      return problems.push({
        field,
        message: `This lot of ${lot.ingredientName} arrived on ${formatDate(lot.receivedDate)}, after the pour date.`,
      })
    }
    if (need.unit === 'each' && !Number.isInteger(row.quantity)) {
      return problems.push({
        field: `lots.${i}.quantity`,
        message: `${lot.ingredientName} is counted in whole pieces.`,
      })
    }
    const quantity = roundQty(row.quantity)
    if (quantity > lot.remainingQuantity + 1e-9) {
      const message = `Lot ${lot.supplierLotCode ?? `#${lot.id}`} of ${lot.ingredientName} has ${fmtQty(lot.remainingQuantity, need.unit)} left, not ${fmtQty(quantity, need.unit)}.`
      short.push({
        field: `lots.${i}.quantity`,
        message,
        ingredientId: lot.ingredientId,
        ingredientName: lot.ingredientName,
        ingredientLotId: lot.id,
        supplierLotCode: lot.supplierLotCode,
        requested: quantity,
        remaining: lot.remainingQuantity,
        unit: need.unit,
      })
    }
    takes.push({ lot, quantity, costCents: quantity * lot.unitCost, role: need.role })
  })
  if (problems.length)
    throw AppError.invalid(
      problems.length === 1 ? problems[0]!.message : 'Some lots need attention.',
      problems,
    )
  if (takes.length === 0) throw AppError.field('lots', 'Take something from at least one lot.')
  const covered = new Set(takes.map((t) => t.lot.ingredientId))
  const missing = needs.filter((n) => !covered.has(n.ingredientId))
  if (missing.length) {
    throw AppError.field(
      'lots',
      `Say which lot each ingredient came from: nothing is taken for ${missing.map((n) => n.name).join(', ')}.`,
    )
  }
  if (short.length)
    throw AppError.conflict(
      'lot_insufficient',
      'Some lots do not have that much left; nothing was recorded.',
      short,
    )
  return takes
}

function takesOldestFirst(needs: Need[], lots: Lot[]): Take[] {
  const plan = planOldestFirst(needs, lots)
  if (plan.shortfalls.length) {
    throw AppError.conflict(
      'lot_insufficient',
      `Not enough on hand for this batch: ${plan.shortfalls.map((s) => `${s.name} is short by ${fmtQty(s.shortBy, s.unit)}`).join('; ')}. Nothing was recorded.`,
      plan.shortfalls.map((s) => ({
        field: 'oilWeightG',
        message: `${s.name}: ${fmtQty(s.needed, s.unit)} needed, ${fmtQty(s.available, s.unit)} on hand.`,
        ingredientId: s.ingredientId,
        ingredientName: s.name,
        needed: s.needed,
        available: s.available,
        shortBy: s.shortBy,
        unit: s.unit,
      })),
    )
  }
  const byId = new Map(lots.map((l) => [l.id, l]))
  return plan.lines.flatMap((line) =>
    line.takes.map((tk) => ({
      lot: byId.get(tk.ingredientLotId)!,
      quantity: tk.quantity,
      costCents: tk.costCents,
      role: line.role,
    })),
  )
}

const inTransaction = <T>(t: Transaction | undefined, fn: (t: Transaction) => Promise<T>): Promise<T> =>
  t ? fn(t) : sequelize.transaction(fn)

/**
 * Records a poured batch in one transaction: the recipe row and the lots are locked, every lot is
 * checked (409 lot_insufficient, nothing written), lots are drawn down into batch_lots, the recipe
 * is frozen on the batch with its lot code, ready date and cost per sellable bar, and the sellable
 * bars enter the ledger as one `made` move. Pass a transaction to run inside the caller's (the
 * demo seeder does); otherwise the batch is committed before it is read back.
 */
export async function recordBatch(
  input: RecordBatchInput,
  userId: number | null,
  transaction?: Transaction,
): Promise<BatchDetail> {
  const id = await inTransaction(transaction, async (t) => {
    const settings = await getSettings(t)
    const today = isoToday(new Date(), settings.timeZone)
    if (compareIso(input.pourDate, today) > 0) {
      throw AppError.field(
        'pourDate',
        `The pour date cannot be in the future (it is ${formatDate(today)} at the studio).`,
      )
    }
    const { product, recipe } = await productForPour(input.productId, t, true)
    const oilWeightG = input.oilWeightG ?? recipe.mouldOilWeightG
    const sellableBars = input.barsCut - input.barsKeptBack
    const { sheet, needs } = batchNeeds(recipe, oilWeightG, sellableBars)
    const over = sheet.warnings.filter((w) => w.code === 'fragrance_over_max')
    if (over.length) {
      throw AppError.unprocessable(
        'fragrance_over_max',
        over.map((w) => w.message).join(' '),
        over.map((w) => ({ field: 'productId', message: w.message })),
      )
    }

    let takes: Take[]
    if (input.lots) {
      const ids = [...new Set(input.lots.map((l) => l.ingredientLotId))]
      const lots = (
        await select<LotDb>(`${LOT_SQL} WHERE l.id = ANY($1::int[]) ORDER BY l.id FOR UPDATE OF l`, [ids], t)
      ).map(toLot)
      takes = takesFromInput(input.lots, lots, needs, input.pourDate)
    } else {
      const lots = await lotsOnHand(
        needs.map((n) => n.ingredientId),
        input.pourDate,
        t,
        true,
      )
      takes = takesOldestFirst(needs, lots)
    }

    const lotCode = await nextLotCode(product.sku, input.pourDate, t)
    const cost = costOf(
      [
        { role: 'ingredient', takes: takes.filter((tk) => tk.role !== 'packaging') },
        { role: 'packaging', takes: takes.filter((tk) => tk.role === 'packaging') },
      ],
      recipe,
      settings.labourRateCents,
      input.barsCut,
      input.barsKeptBack,
    )

    const [batch] = await select<{ id: number }>(
      `INSERT INTO batches (product_id, recipe_id, recipe_snapshot, lot_code, pour_date, cure_days, ready_date, oil_weight_g,
                            bars_cut, bars_kept_back, kept_back_reason, ingredient_cost_cents, cost_per_bar_cents,
                            location, notes, created_by)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15, $16) RETURNING id`,
      [
        product.id,
        recipe.id,
        JSON.stringify(recipe),
        lotCode,
        input.pourDate,
        recipe.cureDays,
        readyDate(input.pourDate, recipe.cureDays),
        oilWeightG,
        input.barsCut,
        input.barsKeptBack,
        input.barsKeptBack > 0 ? input.keptBackReason : null,
        roundHalfUp(cost.batchIngredientCents),
        cost.costPerBarCents,
        input.location,
        input.notes,
        userId,
      ],
      t,
    )
    const batchId = batch!.id

    // One lot may appear once per batch (UNIQUE (batch_id, ingredient_lot_id)): merge repeats.
    const perLot = new Map<number, { quantity: number; costCents: number }>()
    for (const tk of takes) {
      const seen = perLot.get(tk.lot.id) ?? { quantity: 0, costCents: 0 }
      perLot.set(tk.lot.id, {
        quantity: roundQty(seen.quantity + tk.quantity),
        costCents: seen.costCents + tk.costCents,
      })
    }
    const lotIds = [...perLot.keys()]
    const quantities = lotIds.map((lid) => perLot.get(lid)!.quantity)
    const costs = lotIds.map((lid) => roundQty(perLot.get(lid)!.costCents))
    const drawn = await select<{ id: number }>(
      `UPDATE ingredient_lots l SET remaining = l.remaining - x.q, updated_at = now()
         FROM unnest($1::int[], $2::numeric[]) AS x(id, q)
        WHERE l.id = x.id AND l.remaining >= x.q
        RETURNING l.id`,
      [lotIds, quantities],
      t,
    )
    if (drawn.length !== lotIds.length) {
      throw AppError.conflict(
        'lot_insufficient',
        'A lot ran short while the batch was being recorded; nothing was recorded.',
      )
    }
    await sequelize.query(
      `INSERT INTO batch_lots (batch_id, ingredient_lot_id, quantity, cost_cents)
       SELECT $1, x.id, x.q, x.c FROM unnest($2::int[], $3::numeric[], $4::numeric[]) AS x(id, q, c)`,
      { bind: [batchId, lotIds, quantities, costs], transaction: t },
    )
    await audit(
      {
        userId,
        action: 'batch.recorded',
        entity: 'batch',
        entityId: batchId,
        data: { lotCode, productId: product.id, sellableBars, lots: lotIds.length },
      },
      t,
    )
    if (input.plannedPourId) await markPlannedPourPoured(input.plannedPourId, product.id, batchId, t)
    // The last step: the sellable bars enter the ledger.
    await recordStockMove({ batchId, kind: 'made', bars: sellableBars, userId }, t)
    return batchId
  })
  return (await getBatch(id, { withCosts: true }, transaction))!
}

// ---- reading batches ------------------------------------------------------------------------

type BatchDb = {
  id: number
  lot_code: string
  product_id: number
  sku: string
  product_name: string
  case_pack: number
  recipe_id: number
  pour_date: string
  cure_days: number
  ready_date: string
  oil_weight_g: string
  bars_cut: number
  bars_kept_back: number
  kept_back_reason: string | null
  location: string | null
  notes: string | null
  ingredient_cost_cents: number
  cost_per_bar_cents: number | null
  created_at: Date
  created_by_name: string | null
  free: number
  reserved: number
  status: BatchStatus
  recipe_snapshot?: unknown
}

function toBatchRow(r: BatchDb, today: string, withCosts: boolean): BatchRow {
  const progress = cureProgress(r.pour_date, r.ready_date, today)
  return {
    id: r.id,
    lotCode: r.lot_code,
    productId: r.product_id,
    sku: r.sku,
    productName: r.product_name,
    casePack: r.case_pack,
    recipeId: r.recipe_id,
    pourDate: r.pour_date,
    cureDays: r.cure_days,
    readyDate: r.ready_date,
    oilWeightG: Number(r.oil_weight_g),
    barsCut: r.bars_cut,
    barsKeptBack: r.bars_kept_back,
    sellableBars: r.bars_cut - r.bars_kept_back,
    keptBackReason: r.kept_back_reason,
    location: r.location,
    notes: r.notes,
    status: r.status,
    free: r.free,
    reserved: r.reserved,
    onHand: r.free + r.reserved,
    daysLeft: progress.daysLeft,
    progress: progress.fraction,
    createdAt: r.created_at.toISOString(),
    ...(withCosts
      ? { ingredientCostCents: r.ingredient_cost_cents, costPerBarCents: r.cost_per_bar_cents }
      : {}),
  }
}

function batchesSql(snapshot: boolean) {
  return `
    SELECT * FROM (
      SELECT b.id, b.lot_code, b.product_id, p.sku, p.name AS product_name, p.case_pack, b.recipe_id, b.pour_date,
             b.cure_days, b.ready_date, b.oil_weight_g, b.bars_cut, b.bars_kept_back, b.kept_back_reason, b.location,
             b.notes, b.ingredient_cost_cents, b.cost_per_bar_cents, b.created_at, u.name AS created_by_name,
             COALESCE(s.free, 0) AS free, COALESCE(s.reserved, 0) AS reserved,
             CASE WHEN COALESCE(s.free, 0) + COALESCE(s.reserved, 0) = 0 THEN 'used_up'
                  WHEN b.ready_date <= $1::date THEN 'ready'
                  ELSE 'curing' END AS status
             ${snapshot ? ', b.recipe_snapshot' : ''}
        FROM batches b
        JOIN products p ON p.id = b.product_id
        LEFT JOIN batch_stock s ON s.batch_id = b.id
        LEFT JOIN users u ON u.id = b.created_by
       WHERE ($2::int IS NULL OR b.product_id = $2)
         AND ($3::date IS NULL OR b.pour_date >= $3)
         AND ($4::date IS NULL OR b.pour_date <= $4)
         AND ($5::int IS NULL OR b.id = $5)
    ) x
    WHERE ($6::text IS NULL OR x.status = $6)
    ORDER BY x.ready_date, x.id`
}

/** The curing screen's rows: every batch with its ledger balance, status by the calendar. */
export async function listBatches(
  filter: ListBatchesQuery,
  opts: { withCosts: boolean },
): Promise<BatchRow[]> {
  const { today } = await studioToday()
  const rows = await select<BatchDb>(batchesSql(false), [
    today,
    filter.productId ?? null,
    filter.pouredFrom ?? null,
    filter.pouredTo ?? null,
    null,
    filter.status ?? null,
  ])
  return rows.map((r) => toBatchRow(r, today, opts.withCosts))
}

type BatchLotDb = {
  id: number
  ingredient_lot_id: number
  ingredient_id: number
  ingredient_name: string
  ingredient_kind: string
  unit: 'g' | 'each'
  supplier: string
  supplier_lot_code: string | null
  received_on: string
  quantity: string
  cost_cents: string
}

type MoveDb = Parameters<typeof toMoveRow>[0]

/** One batch with the lots it consumed, its ledger, and the shops its bars went to; null when absent. */
export async function getBatch(
  id: number,
  opts: { withCosts: boolean },
  transaction?: Transaction,
): Promise<BatchDetail | null> {
  const settings = await getSettings(transaction)
  const today = isoToday(new Date(), settings.timeZone)
  const [row] = await select<BatchDb>(batchesSql(true), [today, null, null, null, id, null], transaction)
  if (!row) return null
  const lots = await select<BatchLotDb>(
    `SELECT bl.id, bl.ingredient_lot_id, l.ingredient_id, i.name AS ingredient_name, i.kind AS ingredient_kind, i.unit,
            l.supplier, l.supplier_lot_code, l.received_on, bl.quantity, bl.cost_cents
       FROM batch_lots bl
       JOIN ingredient_lots l ON l.id = bl.ingredient_lot_id
       JOIN ingredients i ON i.id = l.ingredient_id
      WHERE bl.batch_id = $1
      ORDER BY CASE i.kind WHEN 'oil' THEN 0 WHEN 'lye' THEN 1 WHEN 'liquid' THEN 2 WHEN 'fragrance' THEN 3
                           WHEN 'colourant' THEN 4 WHEN 'additive' THEN 5 ELSE 6 END, i.name, l.received_on, l.id`,
    [id],
    transaction,
  )
  const moves = await select<MoveDb>(
    `SELECT m.*, u.name AS user_name FROM stock_moves m LEFT JOIN users u ON u.id = m.user_id
      WHERE m.batch_id = $1 ORDER BY m.created_at, m.id`,
    [id],
    transaction,
  )
  const shipments = await shipmentsForBatches([id], settings.timeZone, transaction)
  return {
    ...toBatchRow(row, today, opts.withCosts),
    createdByName: row.created_by_name,
    lots: lots.map((l): BatchLotRow => ({
      id: l.id,
      ingredientLotId: l.ingredient_lot_id,
      ingredientId: l.ingredient_id,
      ingredientName: l.ingredient_name,
      ingredientKind: l.ingredient_kind,
      unit: l.unit,
      supplier: l.supplier,
      supplierLotCode: l.supplier_lot_code,
      receivedOn: l.received_on,
      quantity: Number(l.quantity),
      ...(opts.withCosts ? { costCents: Number(l.cost_cents) } : {}),
    })),
    moves: moves.map(toMoveRow),
    shipments: shipments.get(id) ?? [],
    ...(opts.withCosts ? { recipeSnapshot: row.recipe_snapshot } : {}),
  }
}

/** Where the batch sits and the owner's notes: nothing else changes after pouring. */
export async function updateBatch(id: number, patch: UpdateBatchInput, userId: number): Promise<BatchDetail> {
  await sequelize.transaction(async (t) => {
    const batch = await Batch.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE })
    if (!batch) throw AppError.notFound('That batch')
    const changes: Partial<Pick<Batch, 'location' | 'notes'>> = {}
    if (patch.location !== undefined) changes.location = patch.location
    if (patch.notes !== undefined) changes.notes = patch.notes
    await batch.update(changes, { transaction: t })
    await audit({ userId, action: 'batch.updated', entity: 'batch', entityId: id, data: changes }, t)
  })
  return (await getBatch(id, { withCosts: true }))!
}

/** A write-off or count correction on one batch, never below zero. */
export async function adjustStock(
  batchId: number,
  input: { kind: 'written_off' | 'adjusted'; reason: string; bars: number; note: string | null },
  userId: number,
) {
  return sequelize.transaction(async (t) => {
    const [batch] = await select<{ id: number }>('SELECT id FROM batches WHERE id = $1', [batchId], t)
    if (!batch) throw AppError.notFound('That batch')
    return recordStockMove(
      { batchId, kind: input.kind, bars: input.bars, reason: input.reason, note: input.note, userId },
      t,
    )
  })
}
