/**
 * Test records for ordering: a product priced at chosen tiers, with batches ready or curing and
 * their `made` stock, written with SQL so each test owns exactly the stock it measures (SKUs and
 * names carry a random suffix; nothing global is assumed).
 */
import { randomBytes } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import { addDays, isoToday } from '@shared/domain/dates/dates'
import { sequelize } from '@server/db/sequelize'
import { invalidateCatalogue } from '@server/modules/catalogue/catalogue-cache'
import { getSettings } from '@server/modules/settings/settings.service'
import { DEMO_SHOPS } from '../../seeders/demo/scenario'

const tag = () => randomBytes(3).toString('hex').toUpperCase()

async function rows<T>(sql: string, bind: unknown[] = []): Promise<T[]> {
  return sequelize.query<T & object>(sql, { bind, type: QueryTypes.SELECT }) as Promise<T[]>
}

export type TierName = 'Standard' | 'Preferred' | 'Distributor'

export async function studioDay(offsetDays = 0): Promise<string> {
  const { timeZone } = await getSettings()
  return addDays(isoToday(new Date(), timeZone), offsetDays)
}

/** The demo shops by their buyer's caller name, with their tiers. */
export const SHOP_OF = { buyerA: DEMO_SHOPS[0]!, buyerB: DEMO_SHOPS[1]!, buyerC: DEMO_SHOPS[2]! } as const

export async function shopId(who: keyof typeof SHOP_OF): Promise<number> {
  const [r] = await rows<{ id: number }>('SELECT id FROM shops WHERE trading_name = $1', [
    SHOP_OF[who].tradingName,
  ])
  return r!.id
}

export type BatchSpec = {
  /** Days from today to the ready date: 0 or less is ready now, more is curing. */
  readyInDays: number
  bars: number
}

export type TestProduct = {
  productId: number
  sku: string
  name: string
  casePack: number
  netWeightG: number
  batchIds: number[]
}

/**
 * A product on a recipe of its own, priced at each tier given (breaks as [minCases, cents a
 * bar]), with one batch per spec and its bars made. Defaults: 6 bars a case, 100 g net.
 */
export async function makeProduct(
  opts: {
    casePack?: number
    netWeightG?: number
    prices?: Partial<Record<TierName, [number, number][]>>
    batches?: BatchSpec[]
    active?: boolean
  } = {},
): Promise<TestProduct> {
  const casePack = opts.casePack ?? 6
  const netWeightG = opts.netWeightG ?? 100
  const prices = opts.prices ?? { Standard: [[1, 700]], Preferred: [[1, 650]], Distributor: [[1, 600]] }
  const [recipe] = await rows<{ id: number }>(
    `INSERT INTO recipes (name, superfat_pct, water_mode, lye_concentration_pct, cure_days, bar_weight_g,
                          bars_per_mould, bars_kept_back, mould_oil_weight_g)
     VALUES ($1, 5, 'concentration', 33, 28, $2, 12, 0, 1000) RETURNING id`,
    [`Order test recipe ${tag()}`, netWeightG + 10],
  )
  const sku = `OT${tag()}`
  const name = `Order test bar ${sku}`
  const [product] = await rows<{ id: number }>(
    `INSERT INTO products (sku, name, scent_notes, description, recipe_id, net_weight_g, cut_weight_g, case_pack, msrp_cents, active)
     VALUES ($1, $2, 'Test scent', 'A bar made for a test.', $3, $4, $5, $6, 1500, $7) RETURNING id`,
    [sku, name, recipe!.id, netWeightG, netWeightG + 10, casePack, opts.active ?? true],
  )
  for (const [tier, breaks] of Object.entries(prices)) {
    for (const [minCases, cents] of breaks ?? []) {
      await sequelize.query(
        `INSERT INTO price_breaks (tier_id, product_id, min_cases, unit_price_cents)
         SELECT id, $2, $3, $4 FROM price_tiers WHERE name = $1`,
        { bind: [tier, product!.id, minCases, cents] },
      )
    }
  }
  const p: TestProduct = { productId: product!.id, sku, name, casePack, netWeightG, batchIds: [] }
  for (const b of opts.batches ?? []) p.batchIds.push(await addBatch(p, b))
  // Written past the services: the in-process catalogue cache must hear of it.
  invalidateCatalogue()
  return p
}

/** One more batch of the product (28-day cure), its bars made. */
export async function addBatch(p: { productId: number; sku: string }, b: BatchSpec): Promise<number> {
  const ready = await studioDay(b.readyInDays)
  const pour = addDays(ready, -28)
  const [batch] = await rows<{ id: number }>(
    `INSERT INTO batches (product_id, recipe_id, recipe_snapshot, lot_code, pour_date, cure_days, ready_date,
                          oil_weight_g, bars_cut)
     SELECT p.id, p.recipe_id, '{}'::jsonb, $2, $3, 28, $4, 1000, $5 FROM products p WHERE p.id = $1
     RETURNING id`,
    [p.productId, `T-${p.sku}-${tag()}`, pour, ready, b.bars],
  )
  await sequelize.query(
    `INSERT INTO stock_moves (batch_id, kind, bars, free_delta, reserved_delta) VALUES ($1, 'made', $2, $2, 0)`,
    { bind: [batch!.id, b.bars] },
  )
  // Written past the services: the in-process catalogue cache must hear of it.
  invalidateCatalogue()
  return batch!.id
}

export type Balance = {
  batchId: number
  free: number
  reserved: number
  movesFree: number
  movesReserved: number
}

/** Each batch's balance row beside the sums of its ledger moves. */
export async function balances(batchIds: number[]): Promise<Balance[]> {
  return rows<Balance>(
    `SELECT s.batch_id AS "batchId", s.free, s.reserved,
            (SELECT COALESCE(SUM(m.free_delta), 0)::int FROM stock_moves m WHERE m.batch_id = s.batch_id) AS "movesFree",
            (SELECT COALESCE(SUM(m.reserved_delta), 0)::int FROM stock_moves m WHERE m.batch_id = s.batch_id) AS "movesReserved"
       FROM batch_stock s WHERE s.batch_id = ANY($1::int[]) ORDER BY s.batch_id`,
    [batchIds],
  )
}

/** Clears a shop's cart and sets whether its opening order is done (so the minimum is known). */
export async function resetShop(
  who: keyof typeof SHOP_OF,
  opts: { openingOrderDone?: boolean; status?: 'active' | 'on_hold' } = {},
): Promise<number> {
  const id = await shopId(who)
  await sequelize.query('DELETE FROM cart_lines WHERE shop_id = $1', { bind: [id] })
  await sequelize.query('UPDATE shops SET opening_order_done = $2, status = $3 WHERE id = $1', {
    bind: [id, opts.openingOrderDone ?? true, opts.status ?? 'active'],
  })
  return id
}

export async function setMinimums(openingMinimumCents: number, reorderMinimumCents: number) {
  const { updateSettings } = await import('@server/modules/settings/settings.service')
  await updateSettings({ openingMinimumCents, reorderMinimumCents })
}
