import { QueryTypes, UniqueConstraintError } from 'sequelize'
import type { Transaction } from 'sequelize'
import type { TierCreateInput, TierRow, TierUpdateInput } from '@shared/schemas/pricing'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { PriceTier } from '@server/modules/price-tiers/price-tier.model'

type Row = { id: number; name: string; target_margin_pct: string; sort_order: number; shop_count: number }

export async function listTiers(transaction?: Transaction): Promise<TierRow[]> {
  const rows = await sequelize.query<Row>(
    `SELECT t.id, t.name, t.target_margin_pct, t.sort_order,
            (SELECT count(*)::int FROM shops s WHERE s.tier_id = t.id) AS shop_count
       FROM price_tiers t ORDER BY t.sort_order, t.id`,
    { type: QueryTypes.SELECT, transaction },
  )
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    targetMarginPct: Number(r.target_margin_pct),
    sortOrder: r.sort_order,
    shopCount: r.shop_count,
  }))
}

async function rowOf(id: number): Promise<TierRow> {
  const row = (await listTiers()).find((t) => t.id === id)
  if (!row) throw AppError.notFound('That price tier')
  return row
}

const NAME_TAKEN = 'Another price tier already has this name.'

async function assertNameFree(name: string, exceptId: number | null, transaction: Transaction) {
  const [clash] = await sequelize.query<{ id: number }>(
    'SELECT id FROM price_tiers WHERE lower(name) = lower($1) AND id <> coalesce($2::int, 0)',
    { bind: [name, exceptId], type: QueryTypes.SELECT, transaction },
  )
  if (clash) throw AppError.field('name', NAME_TAKEN, 409, 'name_taken')
}

function uniqueToConflict(err: unknown): never {
  if (err instanceof UniqueConstraintError) throw AppError.field('name', NAME_TAKEN, 409, 'name_taken')
  throw err
}

/** A new tier goes after the others. */
export async function createTier(input: TierCreateInput, byUserId: number): Promise<TierRow> {
  const id = await sequelize
    .transaction(async (t) => {
      await assertNameFree(input.name, null, t)
      const [last] = await sequelize.query<{ max: number | null }>(
        'SELECT max(sort_order)::int AS max FROM price_tiers',
        { type: QueryTypes.SELECT, transaction: t },
      )
      const tier = await PriceTier.create(
        { name: input.name, targetMarginPct: input.targetMarginPct, sortOrder: (last?.max ?? 0) + 1 },
        { transaction: t },
      )
      await audit(
        { userId: byUserId, action: 'tier.created', entity: 'price_tier', entityId: tier.id, data: input },
        t,
      )
      return tier.id
    })
    .catch(uniqueToConflict)
  return rowOf(id)
}

export async function updateTier(id: number, patch: TierUpdateInput, byUserId: number): Promise<TierRow> {
  await sequelize
    .transaction(async (t) => {
      const tier = await PriceTier.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE })
      if (!tier) throw AppError.notFound('That price tier')
      if (patch.name !== undefined) await assertNameFree(patch.name, id, t)
      const changes: Partial<TierUpdateInput> = {}
      if (patch.name !== undefined) changes.name = patch.name
      if (patch.targetMarginPct !== undefined) changes.targetMarginPct = patch.targetMarginPct
      await tier.update(changes, { transaction: t })
      await audit(
        { userId: byUserId, action: 'tier.updated', entity: 'price_tier', entityId: id, data: patch },
        t,
      )
    })
    .catch(uniqueToConflict)
  return rowOf(id)
}
