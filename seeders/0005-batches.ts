import type { Migration } from '@server/db/migrator'
import { expectedBars } from '@shared/domain/batches/expected-bars'
import { addDays, compareIso, isoToday } from '@shared/domain/dates/dates'
import { DEMO_PRODUCTS } from './demo/catalogue'
import { DEMO_STAFF } from './demo/scenario'

/**
 * The demo studio's pours, dated back from the day the seed runs so the curing screen always
 * tells the same story: most bars are ready (poured 40–70 days ago), some batches are still curing
 * and turn ready over the next one to five weeks, and Rose Clay Glow is sold out (its older batch
 * was written off as damaged) with a new batch ready in about three weeks.
 *
 * Batches go through the same service that the owner's form uses, inside one transaction: lots
 * are drawn down oldest first, recipes frozen, lot codes and costs worked out as for real.
 * Supplies are the purchases of 0002 (one box and one label per bar, 5 kg of shea butter), so the
 * moulds per batch are chosen to fit them with some left for new pours.
 */
export type DemoPour = {
  sku: string
  /** Days before the seed runs. */
  pouredDaysAgo: number
  /** Moulds of the recipe's mould oil weight. */
  moulds: number
  location: string
  notes?: string
  writeOff?: { reason: 'damaged'; note: string }
}

// In pour order, oldest first, so the oldest lots go to the oldest batches.
export const DEMO_POURS: DemoPour[] = [
  { sku: 'ORP', pouredDaysAgo: 68, moulds: 3, location: 'Rack A, shelf 1' },
  { sku: 'LAV', pouredDaysAgo: 64, moulds: 3, location: 'Rack A, shelf 2' },
  { sku: 'CDR', pouredDaysAgo: 61, moulds: 3, location: 'Rack A, shelf 3' },
  { sku: 'LAV-MINI', pouredDaysAgo: 58, moulds: 2, location: 'Rack A, shelf 4' },
  { sku: 'CHR', pouredDaysAgo: 55, moulds: 3, location: 'Rack B, shelf 1' },
  {
    sku: 'HNY',
    pouredDaysAgo: 50,
    moulds: 3,
    location: 'Rack B, shelf 2',
    notes: 'Browned evenly to a warm tan.',
  },
  { sku: 'GCL', pouredDaysAgo: 48, moulds: 2, location: 'Rack B, shelf 3' },
  { sku: 'UNS', pouredDaysAgo: 45, moulds: 3, location: 'Rack B, shelf 4' },
  {
    sku: 'RSC',
    pouredDaysAgo: 44,
    moulds: 2,
    location: 'Rack C, shelf 1',
    writeOff: {
      reason: 'damaged',
      note: 'The rack tipped over while cleaning: every bar cracked or chipped.',
    },
  },
  { sku: 'UNS-XL', pouredDaysAgo: 42, moulds: 2, location: 'Rack C, shelf 2' },
  { sku: 'LAV', pouredDaysAgo: 21, moulds: 2, location: 'Curing rack 1' },
  { sku: 'CDR-MINI', pouredDaysAgo: 16, moulds: 2, location: 'Curing rack 1' },
  { sku: 'RSC', pouredDaysAgo: 7, moulds: 3, location: 'Curing rack 2' },
  { sku: 'HNY-XL', pouredDaysAgo: 5, moulds: 2, location: 'Curing rack 2' },
  { sku: 'CHR', pouredDaysAgo: 2, moulds: 2, location: 'Curing rack 3' },
]

export const up: Migration = async ({ context: { sequelize } }) => {
  // The batch service reads the app's database settings at import; the seeder runs wherever the
  // demo is loaded (npm start, the test setup), so hand it this connection's address when unset.
  // Every query below runs on this seeder's own transaction, whatever the app's pool points at.
  const cfg = sequelize.config
  const hadUrl = process.env.DATABASE_URL !== undefined
  if (!hadUrl) {
    process.env.DATABASE_URL = `postgres://${encodeURIComponent(cfg.username)}:${encodeURIComponent(String(cfg.password ?? ''))}@${cfg.host}:${cfg.port}/${cfg.database}`
  }
  const { recordBatch } = await import('@server/modules/batches/batches.service')
  const { recordStockMove } = await import('@server/modules/batches/stock-moves.service')
  if (!hadUrl) delete process.env.DATABASE_URL

  await sequelize.transaction(async (t) => {
    const q = async <T>(sql: string, bind: unknown[]) =>
      (await sequelize.query(sql, { bind, transaction: t }))[0] as T[]
    const [owner] = await q<{ id: number }>('SELECT id FROM users WHERE email = $1', [DEMO_STAFF[0]!.email])
    const [tz] = await q<{ value: string }>(
      `SELECT value #>> '{}' AS value FROM settings WHERE key = 'timeZone'`,
      [],
    )
    const today = isoToday(new Date(), tz?.value ?? 'UTC')
    type ProductRow = {
      id: number
      sku: string
      cut_weight_g: number
      mould_oil_weight_g: string
      bars_per_mould: number
      bars_kept_back: number
      bar_weight_g: string
      /** The day the last of the recipe's ingredients first arrived. */
      supplied_on: string | null
    }
    const products = await q<ProductRow>(
      `SELECT p.id, p.sku, p.cut_weight_g, r.mould_oil_weight_g, r.bars_per_mould, r.bars_kept_back, r.bar_weight_g,
              (SELECT max(first)::text FROM (
                 SELECT min(l.received_on) AS first FROM ingredient_lots l
                  WHERE l.remaining > 0
                    AND (l.ingredient_id IN (SELECT ingredient_id FROM recipe_items WHERE recipe_id = r.id)
                         OR l.ingredient_id IN (r.lye_ingredient_id, r.water_ingredient_id))
                  GROUP BY l.ingredient_id) f) AS supplied_on
         FROM products p JOIN recipes r ON r.id = p.recipe_id
        WHERE p.sku = ANY($1::text[])`,
      [DEMO_PRODUCTS.map((p) => p.sku)],
    )
    const bySku = new Map(products.map((p) => [p.sku, p]))

    for (const plan of DEMO_POURS) {
      const product = bySku.get(plan.sku)
      if (!product) throw new Error(`Seeding batches: no product with SKU ${plan.sku} (seeded by 0004).`)
      // Nothing is poured before its ingredients arrived: a seed run soon after the demo
      // purchases moves a pour to the day the last of them came in.
      let pourDate = addDays(today, -plan.pouredDaysAgo)
      if (product.supplied_on && compareIso(product.supplied_on, pourDate) > 0) pourDate = product.supplied_on
      if (compareIso(pourDate, today) > 0) continue
      const oilWeightG = Number(product.mould_oil_weight_g) * plan.moulds
      const { barsCut, barsKeptBack } = expectedBars(
        {
          mouldOilWeightG: Number(product.mould_oil_weight_g),
          barsPerMould: product.bars_per_mould,
          barsKeptBack: product.bars_kept_back,
          barWeightG: Number(product.bar_weight_g),
        },
        oilWeightG,
        product.cut_weight_g,
      )
      const batch = await recordBatch(
        {
          productId: product.id,
          pourDate,
          oilWeightG,
          barsCut,
          barsKeptBack,
          keptBackReason: 'End slices of each loaf',
          location: plan.location,
          notes: plan.notes ?? null,
        },
        owner?.id ?? null,
        t,
      )
      if (plan.writeOff) {
        await recordStockMove(
          {
            batchId: batch.id,
            kind: 'written_off',
            bars: batch.free,
            reason: plan.writeOff.reason,
            note: plan.writeOff.note,
            userId: owner?.id ?? null,
          },
          t,
        )
      }
    }
  })
}

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    ALTER TABLE stock_moves DISABLE TRIGGER stock_moves_no_update;
    UPDATE ingredient_lots l SET remaining = l.remaining + x.q
      FROM (SELECT ingredient_lot_id, SUM(quantity) AS q FROM batch_lots GROUP BY ingredient_lot_id) x
     WHERE l.id = x.ingredient_lot_id;
    DELETE FROM stock_moves; DELETE FROM batch_stock; DELETE FROM batch_lots; DELETE FROM batches;
    ALTER TABLE stock_moves ENABLE TRIGGER stock_moves_no_update;
  `)
}
