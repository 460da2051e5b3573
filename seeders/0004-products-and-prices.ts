import type { Migration } from '@server/db/migrator'
import { DEMO_PRODUCTS } from './demo/catalogue'

// The demo bars and their price breaks per tier. Recipes (0003) and tiers (0001) are found by name.
export const up: Migration = async ({ context: { sequelize } }) => {
  const q = async <T>(sql: string, bind: unknown[] = []) => (await sequelize.query(sql, { bind }))[0] as T[]
  const tiers = new Map(
    (await q<{ id: number; name: string }>('SELECT id, name FROM price_tiers')).map((t) => [t.name, t.id]),
  )
  for (const p of DEMO_PRODUCTS) {
    const [recipe] = await q<{ id: number }>(
      'SELECT id FROM recipes WHERE lower(name) = lower($1) AND archived_at IS NULL',
      [p.recipe],
    )
    if (!recipe) throw new Error(`seeding ${p.sku}: no recipe named "${p.recipe}"`)
    const [product] = await q<{ id: number }>(
      `INSERT INTO products (sku, name, scent_notes, description, recipe_id, net_weight_g, cut_weight_g,
                             case_pack, msrp_cents, gtin, active)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, true) RETURNING id`,
      [
        p.sku,
        p.name,
        p.scentNotes,
        p.description,
        recipe.id,
        p.netWeightG,
        p.cutWeightG,
        p.casePack,
        p.msrpCents,
        p.gtin,
      ],
    )
    for (const [tierName, breaks] of Object.entries(p.prices)) {
      const tierId = tiers.get(tierName)
      if (!tierId) throw new Error(`seeding ${p.sku}: no price tier named "${tierName}"`)
      for (const [minCases, unitPriceCents] of breaks) {
        await q(
          'INSERT INTO price_breaks (tier_id, product_id, min_cases, unit_price_cents) VALUES ($1, $2, $3, $4)',
          [tierId, product!.id, minCases, unitPriceCents],
        )
      }
    }
  }
}

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query('DELETE FROM price_breaks')
  await sequelize.query('DELETE FROM products')
}
