import type { Migration } from '@server/db/migrator'
import { DEMO_RECIPES } from './demo/catalogue'

// The demo studio's recipes. Ingredients come from 0002 and are looked up by name.
export const up: Migration = async ({ context: { sequelize } }) => {
  const q = async <T>(sql: string, bind: unknown[] = []) => (await sequelize.query(sql, { bind }))[0] as T[]
  const rows = await q<{ id: number; name: string }>(
    'SELECT id, name FROM ingredients WHERE archived_at IS NULL',
  )
  const ids = new Map(rows.map((r) => [r.name, r.id]))
  const id = (name: string) => {
    const found = ids.get(name)
    if (found == null) throw new Error(`Seeding recipes: no ingredient named "${name}" (seeded by 0002).`)
    return found
  }
  for (const r of DEMO_RECIPES) {
    const [recipe] = await q<{ id: number }>(
      `INSERT INTO recipes (name, superfat_pct, water_mode, lye_concentration_pct, lye_ingredient_id, water_ingredient_id,
                            labour_minutes, cure_days, bar_weight_g, bars_per_mould, bars_kept_back, mould_oil_weight_g)
       VALUES ($1, $2, 'concentration', $3, $4, $5, $6, $7, $8, $9, $10, $11) RETURNING id`,
      [
        r.name,
        r.superfatPct,
        r.lyeConcentrationPct,
        id('Sodium hydroxide'),
        id('Distilled water'),
        r.labourMinutes,
        r.cureDays,
        r.barWeightG,
        r.barsPerMould,
        r.barsKeptBack,
        r.mouldOilWeightG,
      ],
    )
    type Item = readonly [
      string,
      'oil' | 'fragrance' | 'additive' | 'packaging',
      'pct_of_oils' | 'g_per_kg_oils' | 'qty_per_bar',
      number,
    ]
    const items: Item[] = [
      ...r.oils.map(([name, v]) => [name, 'oil', 'pct_of_oils', v] as const),
      ...r.fragrances.map(([name, v]) => [name, 'fragrance', 'pct_of_oils', v] as const),
      ...r.additives.map(([name, v]) => [name, 'additive', 'g_per_kg_oils', v] as const),
      ...r.packaging.map(([name, v]) => [name, 'packaging', 'qty_per_bar', v] as const),
    ]
    let order = 0
    for (const [name, role, column, value] of items) {
      await q(
        `INSERT INTO recipe_items (recipe_id, ingredient_id, role, ${column}, sort_order) VALUES ($1, $2, $3, $4, $5)`,
        [recipe!.id, id(name), role, value, order++],
      )
    }
  }
}

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query('DELETE FROM recipe_items; DELETE FROM recipes')
}
