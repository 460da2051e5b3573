import { QueryTypes, UniqueConstraintError } from 'sequelize'
import type { Transaction } from 'sequelize'
import { weightedAverageUnitCost } from '@shared/domain/costing/costing'
import { sapNaohToKoh } from '@shared/domain/lye/lye'
import { COST_RULE, CreateIngredientSchema } from '@shared/schemas/ingredients'
import type {
  BaseUnit,
  IngredientDetail,
  IngredientKind,
  IngredientListQuery,
  IngredientPatch,
  IngredientRow,
  IngredientValues,
} from '@shared/schemas/ingredients'
import { issuesToDetails } from '@shared/schemas/errors'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { Ingredient } from '@server/modules/ingredients/ingredient.model'
import { lotRows, unitCostOf } from '@server/modules/purchases/purchases.service'

type Row = {
  id: number
  name: string
  kind: IngredientKind
  inci: string | null
  sap_naoh: string | null
  sap_koh: string | null
  purity_pct: string | null
  max_usage_pct: string | null
  vanillin_pct: string | null
  unit: BaseUnit
  reorder_level: string | null
  notes: string | null
  archived_at: Date | null
  on_hand: string
  lots: number
  lots_on_hand: number
  in_recipes: boolean
}

const num = (v: string | null) => (v === null ? null : Number(v))

const NAME_TAKEN = 'Another active ingredient already has this name.'

/**
 * Current unit cost per ingredient by COST_RULE: the lots on hand, each at its own unit cost
 * (freight included), weighted by what is left. Null where nothing is on hand. The one reader of
 * this rule: the ingredient screens, recipe costs and pricing all come here. `null` asks for every
 * ingredient with lots on hand.
 */
export async function currentUnitCosts(
  ingredientIds: readonly number[] | null,
  transaction?: Transaction,
): Promise<Map<number, number | null>> {
  if (ingredientIds !== null && ingredientIds.length === 0) return new Map()
  const lots = await sequelize.query<{
    ingredient_id: number
    quantity: string
    remaining: string
    cost_cents: number
    freight_cents: number
  }>(
    `SELECT ingredient_id, quantity, remaining, cost_cents, freight_cents FROM ingredient_lots
      WHERE remaining > 0 AND ($1::int[] IS NULL OR ingredient_id = ANY($1))`,
    { bind: [ingredientIds], type: QueryTypes.SELECT, transaction },
  )
  const byIngredient = new Map<number, { remainingQuantity: number; unitCost: number }[]>()
  for (const l of lots) {
    const list = byIngredient.get(l.ingredient_id) ?? []
    list.push({
      remainingQuantity: Number(l.remaining),
      unitCost: unitCostOf({
        quantity: Number(l.quantity),
        costCents: l.cost_cents,
        freightCents: l.freight_cents,
      }),
    })
    byIngredient.set(l.ingredient_id, list)
  }
  const out = new Map<number, number | null>((ingredientIds ?? []).map((id) => [id, null]))
  for (const [id, list] of byIngredient) out.set(id, weightedAverageUnitCost(list))
  return out
}

async function rows(
  filter: { kind?: IngredientKind; includeArchived?: boolean; ids?: readonly number[] },
  transaction?: Transaction,
): Promise<IngredientRow[]> {
  const found = await sequelize.query<Row>(
    `SELECT i.id, i.name, i.kind, i.inci, i.sap_naoh, i.sap_koh, i.purity_pct, i.max_usage_pct, i.vanillin_pct,
            i.unit, i.reorder_level, i.notes, i.archived_at,
            COALESCE(l.on_hand, 0) AS on_hand, COALESCE(l.lots, 0)::int AS lots, COALESCE(l.lots_on_hand, 0)::int AS lots_on_hand,
            EXISTS (SELECT 1 FROM recipe_items ri WHERE ri.ingredient_id = i.id)
              OR EXISTS (SELECT 1 FROM recipes r WHERE r.lye_ingredient_id = i.id OR r.water_ingredient_id = i.id) AS in_recipes
       FROM ingredients i
       LEFT JOIN (SELECT ingredient_id, sum(remaining) AS on_hand, count(*) AS lots,
                         count(*) FILTER (WHERE remaining > 0) AS lots_on_hand
                    FROM ingredient_lots GROUP BY ingredient_id) l ON l.ingredient_id = i.id
      WHERE ($1::text IS NULL OR i.kind = $1)
        AND ($2::boolean OR i.archived_at IS NULL)
        AND ($3::int[] IS NULL OR i.id = ANY($3))
      ORDER BY lower(i.name), i.id`,
    {
      bind: [filter.kind ?? null, filter.includeArchived ?? false, filter.ids ?? null],
      type: QueryTypes.SELECT,
      transaction,
    },
  )
  const costs = await currentUnitCosts(
    found.map((r) => r.id),
    transaction,
  )
  return found.map((r) => {
    const onHand = Number(r.on_hand)
    const reorderLevel = num(r.reorder_level)
    return {
      id: r.id,
      name: r.name,
      kind: r.kind,
      inci: r.inci,
      sapNaoh: num(r.sap_naoh),
      // Rows written with only the NaOH value still answer both (CIAAW molar masses).
      sapKoh:
        r.sap_koh !== null
          ? Number(r.sap_koh)
          : r.sap_naoh !== null
            ? sapNaohToKoh(Number(r.sap_naoh))
            : null,
      purityPct: num(r.purity_pct),
      maxUsagePct: num(r.max_usage_pct),
      vanillinPct: num(r.vanillin_pct),
      unit: r.unit,
      reorderLevel,
      notes: r.notes,
      archived: r.archived_at !== null,
      archivedAt: r.archived_at ? r.archived_at.toISOString() : null,
      onHand,
      currentUnitCost: costs.get(r.id) ?? null,
      lots: r.lots,
      lotsOnHand: r.lots_on_hand,
      belowReorder: reorderLevel !== null && onHand < reorderLevel,
      kindLocked: r.lots > 0 || r.in_recipes,
    }
  })
}

export const listIngredients = (query: IngredientListQuery) => rows(query)

async function rowOf(id: number, transaction?: Transaction): Promise<IngredientRow> {
  const [row] = await rows({ ids: [id], includeArchived: true }, transaction)
  if (!row) throw AppError.notFound('That ingredient')
  return row
}

export async function getIngredient(id: number): Promise<IngredientDetail> {
  const ingredient = await rowOf(id)
  return { ingredient, lots: await lotRows({ ingredientId: id }), costRule: COST_RULE }
}

async function assertNameFree(name: string, exceptId: number | null, transaction: Transaction) {
  const [taken] = await sequelize.query<{ id: number }>(
    `SELECT id FROM ingredients WHERE lower(name) = lower($1) AND archived_at IS NULL AND ($2::int IS NULL OR id <> $2) LIMIT 1`,
    { bind: [name, exceptId], type: QueryTypes.SELECT, transaction },
  )
  if (taken) throw AppError.field('name', NAME_TAKEN, 409, 'name_taken')
}

// Two requests with the same new name can both pass the check; the unique index settles it.
function nameRace(err: unknown): never {
  if (err instanceof UniqueConstraintError) throw AppError.field('name', NAME_TAKEN, 409, 'name_taken')
  throw err
}

function columns(v: IngredientValues) {
  return {
    name: v.name,
    kind: v.kind,
    inci: v.inci,
    sapKoh: v.sapKoh,
    sapNaoh: v.sapNaoh,
    purityPct: v.purityPct,
    maxUsagePct: v.maxUsagePct,
    vanillinPct: v.vanillinPct,
    unit: v.unit,
    reorderLevel: v.reorderLevel,
    notes: v.notes,
  }
}

export async function createIngredient(v: IngredientValues, byUserId: number): Promise<IngredientRow> {
  const id = await sequelize
    .transaction(async (t) => {
      await assertNameFree(v.name, null, t)
      const ingredient = await Ingredient.create({ ...columns(v), archivedAt: null }, { transaction: t })
      await audit(
        {
          userId: byUserId,
          action: 'ingredient.created',
          entity: 'ingredient',
          entityId: ingredient.id,
          data: v,
        },
        t,
      )
      return ingredient.id
    })
    .catch(nameRace)
  return rowOf(id)
}

// Fields that belong to one kind only; when the kind changes they are dropped unless sent again.
const KIND_FIELDS = {
  sapKoh: 'oil',
  sapNaoh: 'oil',
  purityPct: 'lye',
  maxUsagePct: 'fragrance',
  vanillinPct: 'fragrance',
} as const satisfies Partial<Record<keyof IngredientPatch, IngredientKind>>

/** The patch on top of the record, checked by the same rules as a new ingredient. */
function merge(current: Ingredient, patch: IngredientPatch): IngredientValues {
  const base: Record<string, unknown> = {
    name: current.name,
    kind: current.kind,
    inci: current.inci,
    sapKoh: current.sapKoh,
    sapNaoh: current.sapNaoh,
    purityPct: current.purityPct,
    maxUsagePct: current.maxUsagePct,
    vanillinPct: current.vanillinPct,
    reorderLevel: current.reorderLevel,
    notes: current.notes,
  }
  // A new SAP value replaces the pair: the other one follows from it again.
  if ('sapKoh' in patch || 'sapNaoh' in patch) {
    base.sapKoh = null
    base.sapNaoh = null
  }
  const kind = patch.kind ?? current.kind
  if (kind !== current.kind) {
    for (const [field, owner] of Object.entries(KIND_FIELDS))
      if (owner !== kind && !(field in patch)) base[field] = null
  }
  const merged = CreateIngredientSchema.safeParse({ ...base, ...patch })
  if (!merged.success) {
    const details = issuesToDetails(merged.error.issues)
    throw AppError.invalid(
      details.length === 1 ? `${details[0]!.field}: ${details[0]!.message}` : 'Some fields need attention.',
      details,
    )
  }
  return merged.data
}

export async function updateIngredient(
  id: number,
  patch: IngredientPatch,
  byUserId: number,
): Promise<IngredientRow> {
  await sequelize
    .transaction(async (t) => {
      const ingredient = await Ingredient.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE })
      if (!ingredient) throw AppError.notFound('That ingredient')
      const next = merge(ingredient, patch)
      if (next.kind !== ingredient.kind) {
        const current = await rowOf(id, t)
        if (current.kindLocked) {
          throw AppError.field(
            'kind',
            `The kind cannot change once purchases or recipes use this ingredient (${current.lots} purchase${current.lots === 1 ? '' : 's'} recorded).`,
            409,
            'kind_locked',
          )
        }
      }
      if (!ingredient.archivedAt && next.name.toLowerCase() !== ingredient.name.toLowerCase()) {
        await assertNameFree(next.name, id, t)
      }
      await ingredient.update(columns(next), { transaction: t })
      await audit(
        { userId: byUserId, action: 'ingredient.updated', entity: 'ingredient', entityId: id, data: patch },
        t,
      )
    })
    .catch(nameRace)
  return rowOf(id)
}

/** Archived ingredients leave the lists and pickers; their purchases and history stay. */
export async function archiveIngredient(id: number, byUserId: number): Promise<IngredientRow> {
  await sequelize.transaction(async (t) => {
    const ingredient = await Ingredient.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE })
    if (!ingredient) throw AppError.notFound('That ingredient')
    if (ingredient.archivedAt) return
    await ingredient.update({ archivedAt: new Date() }, { transaction: t })
    await audit({ userId: byUserId, action: 'ingredient.archived', entity: 'ingredient', entityId: id }, t)
  })
  return rowOf(id)
}

export async function restoreIngredient(id: number, byUserId: number): Promise<IngredientRow> {
  await sequelize
    .transaction(async (t) => {
      const ingredient = await Ingredient.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE })
      if (!ingredient) throw AppError.notFound('That ingredient')
      if (!ingredient.archivedAt) return
      await assertNameFree(ingredient.name, id, t)
      await ingredient.update({ archivedAt: null }, { transaction: t })
      await audit({ userId: byUserId, action: 'ingredient.restored', entity: 'ingredient', entityId: id }, t)
    })
    .catch(nameRace)
  return rowOf(id)
}
