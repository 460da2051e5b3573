import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { lotUnitCostCents } from '@shared/domain/costing/costing'
import { compareIso, isoToday } from '@shared/domain/dates/dates'
import { toBaseQuantity } from '@shared/domain/units/units'
import { PurchaseSchema, unitProblem } from '@shared/schemas/ingredients'
import type {
  BaseUnit,
  IngredientKind,
  PurchaseBatchUse,
  PurchaseDetail,
  PurchaseListQuery,
  PurchasePatch,
  PurchaseRow,
  PurchaseUnit,
  PurchaseValues,
} from '@shared/schemas/ingredients'
import { issuesToDetails } from '@shared/schemas/errors'
import type { ErrorDetail } from '@shared/schemas/errors'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { Ingredient } from '@server/modules/ingredients/ingredient.model'
import { IngredientLot } from '@server/modules/purchases/ingredient-lot.model'
import { getSettings } from '@server/modules/settings/settings.service'

type LotDb = {
  id: number
  ingredient_id: number
  ingredient_name: string
  ingredient_kind: IngredientKind
  unit: BaseUnit
  supplier: string
  supplier_lot_code: string | null
  received_on: string
  entered_quantity: string
  entered_unit: PurchaseUnit
  quantity: string
  remaining: string
  cost_cents: number
  freight_cents: number
  notes: string | null
  used: boolean
  created_at: Date
}

const LOT_SELECT = `
  SELECT l.id, l.ingredient_id, i.name AS ingredient_name, i.kind AS ingredient_kind, i.unit, l.supplier,
         l.supplier_lot_code, l.received_on, l.entered_quantity, l.entered_unit, l.quantity, l.remaining,
         l.cost_cents, l.freight_cents, l.notes, l.created_at,
         (l.remaining < l.quantity OR EXISTS (SELECT 1 FROM batch_lots bl WHERE bl.ingredient_lot_id = l.id)) AS used
    FROM ingredient_lots l JOIN ingredients i ON i.id = l.ingredient_id`

/** Cents per base unit, freight included: the one rule for what a purchase cost per g or item. */
export function unitCostOf(lot: { quantity: number; costCents: number; freightCents: number }): number {
  return lotUnitCostCents({ quantity: lot.quantity, costCents: lot.costCents + lot.freightCents })
}

function toRow(r: LotDb): PurchaseRow {
  const quantity = Number(r.quantity)
  return {
    id: r.id,
    ingredientId: r.ingredient_id,
    ingredientName: r.ingredient_name,
    ingredientKind: r.ingredient_kind,
    unit: r.unit,
    supplier: r.supplier,
    supplierLotCode: r.supplier_lot_code,
    receivedOn: r.received_on,
    enteredQuantity: Number(r.entered_quantity),
    enteredUnit: r.entered_unit,
    quantity,
    remaining: Number(r.remaining),
    costCents: r.cost_cents,
    freightCents: r.freight_cents,
    totalCents: r.cost_cents + r.freight_cents,
    unitCost: unitCostOf({ quantity, costCents: r.cost_cents, freightCents: r.freight_cents }),
    notes: r.notes,
    inUse: r.used,
    createdAt: r.created_at.toISOString(),
  }
}

/** Purchases, newest received first; `ids` picks particular ones. */
export async function lotRows(
  filter: PurchaseListQuery & { ids?: readonly number[] },
  transaction?: Transaction,
): Promise<PurchaseRow[]> {
  const rows = await sequelize.query<LotDb>(
    `${LOT_SELECT}
      WHERE ($1::int IS NULL OR l.ingredient_id = $1)
        AND ($2::date IS NULL OR l.received_on >= $2)
        AND ($3::date IS NULL OR l.received_on <= $3)
        AND ($4::int[] IS NULL OR l.id = ANY($4))
      ORDER BY l.received_on DESC, l.id DESC`,
    {
      bind: [filter.ingredientId ?? null, filter.from ?? null, filter.to ?? null, filter.ids ?? null],
      type: QueryTypes.SELECT,
      transaction,
    },
  )
  return rows.map(toRow)
}

export const listPurchases = (query: PurchaseListQuery) => lotRows(query)

export async function getPurchase(id: number): Promise<PurchaseDetail> {
  const [row] = await lotRows({ ids: [id] })
  if (!row) throw AppError.notFound('That purchase')
  const batches = await sequelize.query<{
    batch_id: number
    lot_code: string
    pour_date: string
    product_name: string | null
    quantity: string
    cost_cents: string
  }>(
    `SELECT b.id AS batch_id, b.lot_code, b.pour_date, p.name AS product_name, bl.quantity, bl.cost_cents
       FROM batch_lots bl
       JOIN batches b ON b.id = bl.batch_id
       LEFT JOIN products p ON p.id = b.product_id
      WHERE bl.ingredient_lot_id = $1
      ORDER BY b.pour_date DESC, b.id DESC`,
    { bind: [id], type: QueryTypes.SELECT },
  )
  const uses: PurchaseBatchUse[] = batches.map((b) => ({
    batchId: b.batch_id,
    lotCode: b.lot_code,
    pourDate: b.pour_date,
    productName: b.product_name,
    quantity: Number(b.quantity),
    costCents: Number(b.cost_cents),
  }))
  return { ...row, batches: uses }
}

/** Today in the studio's time zone: the latest date a purchase may have been received. */
export async function studioToday(): Promise<string> {
  return isoToday(new Date(), (await getSettings()).timeZone)
}

/**
 * What the schema cannot know: the ingredient (active, and of a kind the unit fits), the date
 * against the studio's own calendar, and the same delivery recorded twice. Problems come back
 * with the purchase's field names.
 */
export async function checkAgainstRecords(
  v: PurchaseValues,
  ctx: { today: string; excludeLotId?: number; transaction?: Transaction; ingredient?: Ingredient | null },
): Promise<ErrorDetail[]> {
  const ingredient =
    ctx.ingredient !== undefined
      ? ctx.ingredient
      : await Ingredient.findByPk(v.ingredientId, { transaction: ctx.transaction })
  const problems = checkIngredientAndDate(v, ingredient, ctx.today)
  if (ingredient) {
    const [dup] = await recordedDeliveries([{ ...v, ingredientId: ingredient.id }], ctx)
    if (dup !== undefined) problems.push(duplicateDelivery(dup))
  }
  return problems
}

/** The checks of checkAgainstRecords that need no query: the ingredient found (or not), the unit, the date. */
export function checkIngredientAndDate(
  v: PurchaseValues,
  ingredient: Ingredient | null,
  today: string,
): ErrorDetail[] {
  const problems: ErrorDetail[] = []
  if (!ingredient)
    problems.push({ field: 'ingredientId', message: 'No such ingredient: choose one from the list.' })
  else if (ingredient.archivedAt) {
    problems.push({
      field: 'ingredientId',
      message: `${ingredient.name} is archived: restore it before recording a purchase.`,
    })
  } else {
    const unit = unitProblem(ingredient.kind, v.unit)
    if (unit) problems.push({ field: 'unit', message: unit })
  }
  if (compareIso(v.receivedOn, today) > 0) {
    problems.push({
      field: 'receivedOn',
      message: `The date received cannot be in the future (today is ${today}).`,
    })
  }
  return problems
}

type DeliveryKey = Pick<PurchaseValues, 'ingredientId' | 'supplier' | 'supplierLotCode' | 'receivedOn'>

/**
 * For each delivery, the id of a purchase already recorded with the same ingredient, supplier,
 * lot code and date (case aside), or undefined; one query however many are asked about. A
 * delivery without a lot code is never a duplicate.
 */
export async function recordedDeliveries(
  keys: readonly DeliveryKey[],
  ctx: { excludeLotId?: number; transaction?: Transaction } = {},
): Promise<(number | undefined)[]> {
  const asked = keys.map((k, i) => ({ ...k, i })).filter((k) => k.supplierLotCode)
  const out: (number | undefined)[] = keys.map(() => undefined)
  if (asked.length === 0) return out
  const rows = await sequelize.query<{ i: number; id: number }>(
    `SELECT k.i, dup.id
       FROM unnest($1::int[], $2::int[], $3::text[], $4::text[], $5::date[])
            AS k(i, ingredient_id, supplier, supplier_lot_code, received_on)
       JOIN LATERAL (
         SELECT l.id FROM ingredient_lots l
          WHERE l.ingredient_id = k.ingredient_id AND lower(l.supplier) = lower(k.supplier)
            AND lower(l.supplier_lot_code) = lower(k.supplier_lot_code) AND l.received_on = k.received_on
            AND ($6::int IS NULL OR l.id <> $6)
          LIMIT 1) dup ON true`,
    {
      bind: [
        asked.map((k) => k.i),
        asked.map((k) => k.ingredientId),
        asked.map((k) => k.supplier),
        asked.map((k) => k.supplierLotCode),
        asked.map((k) => k.receivedOn),
        ctx.excludeLotId ?? null,
      ],
      type: QueryTypes.SELECT,
      transaction: ctx.transaction,
    },
  )
  for (const r of rows) out[r.i] = r.id
  return out
}

export function duplicateDelivery(existingId: number): ErrorDetail {
  return {
    field: 'supplierLotCode',
    message: `Already recorded as purchase #${existingId}: same ingredient, supplier, lot code and date.`,
  }
}

/** The columns of a purchase as stored: entered quantity and unit, and the base quantity (g or each). */
export function lotColumns(v: PurchaseValues) {
  const { quantity } = toBaseQuantity(v.quantity, v.unit)
  return {
    ingredientId: v.ingredientId,
    supplier: v.supplier,
    supplierLotCode: v.supplierLotCode,
    receivedOn: v.receivedOn,
    enteredQuantity: v.quantity,
    enteredUnit: v.unit,
    quantity,
    remaining: quantity,
    costCents: v.costCents,
    freightCents: v.freightCents,
    notes: v.notes,
  }
}

export async function recordPurchase(v: PurchaseValues, byUserId: number): Promise<PurchaseRow> {
  const today = await studioToday()
  const id = await sequelize.transaction(async (t) => {
    const problems = await checkAgainstRecords(v, { today, transaction: t })
    if (problems.length > 0)
      throw AppError.invalid(
        problems.length === 1 ? problems[0]!.message : 'Some fields need attention.',
        problems,
      )
    const lot = await IngredientLot.create({ ...lotColumns(v), createdBy: byUserId }, { transaction: t })
    await audit(
      {
        userId: byUserId,
        action: 'purchase.recorded',
        entity: 'ingredient_lot',
        entityId: lot.id,
        data: { ...v },
      },
      t,
    )
    return lot.id
  })
  return (await lotRows({ ids: [id] }))[0]!
}

/** Editable only while nothing of it has gone into a batch; the merged purchase is checked again. */
export async function updatePurchase(
  id: number,
  patch: PurchasePatch,
  byUserId: number,
): Promise<PurchaseRow> {
  const today = await studioToday()
  await sequelize.transaction(async (t) => {
    const lot = await IngredientLot.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE })
    if (!lot) throw AppError.notFound('That purchase')
    const [use] = await sequelize.query<{ n: number }>(
      'SELECT count(*)::int AS n FROM batch_lots WHERE ingredient_lot_id = $1',
      { bind: [id], type: QueryTypes.SELECT, transaction: t },
    )
    if ((use?.n ?? 0) > 0 || lot.remaining < lot.quantity) {
      throw AppError.conflict(
        'lot_in_use',
        'Part of this purchase has gone into a batch, so it can no longer be changed.',
      )
    }
    const merged = PurchaseSchema.safeParse({
      ingredientId: lot.ingredientId,
      supplier: lot.supplier,
      supplierLotCode: lot.supplierLotCode,
      receivedOn: lot.receivedOn,
      quantity: lot.enteredQuantity,
      unit: lot.enteredUnit,
      costCents: lot.costCents,
      freightCents: lot.freightCents,
      notes: lot.notes,
      ...patch,
    })
    if (!merged.success) {
      const details = issuesToDetails(merged.error.issues)
      throw AppError.invalid(
        details.length === 1 ? `${details[0]!.field}: ${details[0]!.message}` : 'Some fields need attention.',
        details,
      )
    }
    const problems = await checkAgainstRecords(merged.data, { today, excludeLotId: id, transaction: t })
    if (problems.length > 0)
      throw AppError.invalid(
        problems.length === 1 ? problems[0]!.message : 'Some fields need attention.',
        problems,
      )
    await lot.update(lotColumns(merged.data), { transaction: t })
    await audit(
      { userId: byUserId, action: 'purchase.updated', entity: 'ingredient_lot', entityId: id, data: patch },
      t,
    )
  })
  return (await lotRows({ ids: [id] }))[0]!
}
