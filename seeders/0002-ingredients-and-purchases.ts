import type { Migration } from '@server/db/migrator'
import { sapKohToNaoh } from '@shared/domain/lye/lye'
import { toBaseQuantity } from '@shared/domain/units/units'
import { DEMO_INGREDIENTS } from './demo/catalogue'
import { DEMO_STAFF } from './demo/scenario'
import { referenceOils } from './reference/oils'

// Every ingredient the demo studio buys, with its purchases. Oils take their saponification value
// from the reference table (each inside its published range) and keep both forms of it.
export const up: Migration = async ({ context: { sequelize } }) => {
  const q = async <T>(sql: string, bind: unknown[] = []) => (await sequelize.query(sql, { bind }))[0] as T[]
  const [owner] = await q<{ id: number }>('SELECT id FROM users WHERE email = $1', [DEMO_STAFF[0]!.email])

  for (const ing of DEMO_INGREDIENTS) {
    let sapKoh: number | null = null
    if (ing.kind === 'oil') {
      const ref = referenceOils.find((o) => o.name === ing.referenceOil)
      if (!ref) throw new Error(`${ing.name}: no reference oil named ${ing.referenceOil ?? '(none)'}`)
      sapKoh = ref.sapKoh
    }
    const [row] = await q<{ id: number }>(
      `INSERT INTO ingredients (name, kind, inci, sap_koh, sap_naoh, purity_pct, max_usage_pct, vanillin_pct, unit)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9) RETURNING id`,
      [
        ing.name,
        ing.kind,
        ing.inci,
        sapKoh,
        sapKoh === null ? null : sapKohToNaoh(sapKoh),
        ing.kind === 'lye' ? (ing.purityPct ?? 100) : null,
        ing.kind === 'fragrance' ? (ing.maxUsagePct ?? null) : null,
        ing.kind === 'fragrance' ? (ing.vanillinPct ?? null) : null,
        ing.kind === 'packaging' ? 'each' : 'g',
      ],
    )
    for (const [supplier, lotCode, receivedOn, qty, unit, costCents] of ing.purchases) {
      const { quantity } = toBaseQuantity(qty, unit)
      await q(
        `INSERT INTO ingredient_lots (ingredient_id, supplier, supplier_lot_code, received_on, entered_quantity, entered_unit,
                                      quantity, remaining, cost_cents, freight_cents, created_by)
         VALUES ($1, $2, $3, $4, $5, $6, $7, $7, $8, 0, $9)`,
        [row!.id, supplier, lotCode, receivedOn, qty, unit, quantity, costCents, owner?.id ?? null],
      )
    }
  }
}

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query('DELETE FROM ingredient_lots; DELETE FROM ingredients;')
}
