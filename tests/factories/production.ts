/**
 * Test records for pouring: ingredients, purchase lots, a recipe and a product, written with SQL
 * so a test owns exactly what it measures (names carry a random suffix; nothing global is assumed).
 */
import { randomBytes } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import { sequelize } from '@server/db/sequelize'
import { invalidateCatalogue } from '@server/modules/catalogue/catalogue-cache'

const tag = () => randomBytes(3).toString('hex').toUpperCase()

async function one<T>(sql: string, bind: unknown[]): Promise<T> {
  const rows = await sequelize.query<T & object>(sql, { bind, type: QueryTypes.SELECT })
  return rows[0] as T
}

type Kind = 'oil' | 'lye' | 'liquid' | 'fragrance' | 'colourant' | 'additive' | 'packaging'

export async function makeIngredient(
  name: string,
  kind: Kind,
  extra: { sapNaoh?: number; purityPct?: number; maxUsagePct?: number } = {},
): Promise<number> {
  const r = await one<{ id: number }>(
    `INSERT INTO ingredients (name, kind, sap_naoh, purity_pct, max_usage_pct, unit)
     VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
    [
      `${name} ${tag()}`,
      kind,
      extra.sapNaoh ?? null,
      extra.purityPct ?? null,
      extra.maxUsagePct ?? null,
      kind === 'packaging' ? 'each' : 'g',
    ],
  )
  return r.id
}

export async function makeLot(
  ingredientId: number,
  lot: {
    receivedOn: string
    quantity: number
    costCents: number
    freightCents?: number
    supplier?: string
    code?: string
  },
): Promise<number> {
  const r = await one<{ id: number }>(
    `INSERT INTO ingredient_lots (ingredient_id, supplier, supplier_lot_code, received_on, entered_quantity, entered_unit,
                                  quantity, remaining, cost_cents, freight_cents)
     SELECT $1, $2, $3, $4, $5, CASE i.unit WHEN 'each' THEN 'each' ELSE 'g' END, $5, $5, $6, $7
       FROM ingredients i WHERE i.id = $1
     RETURNING id`,
    [
      ingredientId,
      lot.supplier ?? 'Test Supply Co',
      lot.code ?? `T-${tag()}`,
      lot.receivedOn,
      lot.quantity,
      lot.costCents,
      lot.freightCents ?? 0,
    ],
  )
  return r.id
}

export async function lotRemaining(lotId: number): Promise<number> {
  return Number(
    (await one<{ remaining: string }>('SELECT remaining FROM ingredient_lots WHERE id = $1', [lotId]))
      .remaining,
  )
}

export async function count(sql: string, bind: unknown[] = []): Promise<number> {
  return (await one<{ n: number }>(`SELECT (${sql})::int AS n`, bind)).n
}

/** SAP values (g NaOH per g of oil) from Codex CXS 210-1999 mid-range KOH values × 0.712888 (CIAAW masses). */
export const TEST_SAP = {
  // olive 190 mg KOH/g (Codex CXS 33-1981 range 184–196, from memory)
  olive: 0.19 * 0.712888,
  // coconut 257 mg KOH/g (Codex CXS 210-1999: 248–265)
  coconut: 0.257 * 0.712888,
}

export type Pourable = Awaited<ReturnType<typeof makePourable>>

/**
 * A product on a two-oil recipe with every ingredient bought: olive 70 %, coconut 30 %, superfat 5 %,
 * lye at 33 %, fragrance 3 % of oils, one box per bar; a 1000 g mould (1461 g of batch) cuts 14 bars of 100 g, 2 kept
 * back; 60 labour minutes. Lots are large unless `small` says otherwise; all arrived `receivedOn`.
 */
export async function makePourable(
  opts: {
    cureDays?: number
    receivedOn?: string
    oliveLots?: { receivedOn: string; quantity: number; costCents: number }[]
  } = {},
) {
  const receivedOn = opts.receivedOn ?? '2024-01-02'
  const olive = await makeIngredient('Test olive oil', 'oil', { sapNaoh: TEST_SAP.olive })
  const coconut = await makeIngredient('Test coconut oil', 'oil', { sapNaoh: TEST_SAP.coconut })
  const lye = await makeIngredient('Test sodium hydroxide', 'lye', { purityPct: 100 })
  const water = await makeIngredient('Test water', 'liquid')
  const fragrance = await makeIngredient('Test lavender', 'fragrance', { maxUsagePct: 5 })
  const box = await makeIngredient('Test box', 'packaging')

  const oliveLots = opts.oliveLots ?? [{ receivedOn, quantity: 200_000, costCents: 80_000 }]
  const lots = {
    olive: [] as number[],
    coconut: await makeLot(coconut, { receivedOn, quantity: 100_000, costCents: 60_000 }),
    lye: await makeLot(lye, { receivedOn, quantity: 50_000, costCents: 20_000, freightCents: 1_000 }),
    water: await makeLot(water, { receivedOn, quantity: 200_000, costCents: 2_000 }),
    fragrance: await makeLot(fragrance, { receivedOn, quantity: 10_000, costCents: 50_000 }),
    box: await makeLot(box, { receivedOn, quantity: 5_000, costCents: 100_000 }),
  }
  for (const l of oliveLots) lots.olive.push(await makeLot(olive, l))

  const recipe = await one<{ id: number }>(
    `INSERT INTO recipes (name, superfat_pct, water_mode, lye_concentration_pct, lye_ingredient_id, water_ingredient_id,
                          labour_minutes, cure_days, bar_weight_g, bars_per_mould, bars_kept_back, mould_oil_weight_g)
     VALUES ($1, 5, 'concentration', 33, $2, $3, 60, $4, 100, 14, 2, 1000) RETURNING id`,
    [`Test recipe ${tag()}`, lye, water, opts.cureDays ?? 28],
  )
  await sequelize.query(
    `INSERT INTO recipe_items (recipe_id, ingredient_id, role, pct_of_oils, g_per_kg_oils, qty_per_bar, sort_order) VALUES
       ($1, $2, 'oil', 70, NULL, NULL, 1),
       ($1, $3, 'oil', 30, NULL, NULL, 2),
       ($1, $4, 'fragrance', 3, NULL, NULL, 3),
       ($1, $5, 'packaging', NULL, NULL, 1, 4)`,
    { bind: [recipe.id, olive, coconut, fragrance, box] },
  )
  const sku = `T${tag()}`
  const product = await one<{ id: number }>(
    `INSERT INTO products (sku, name, recipe_id, net_weight_g, cut_weight_g, case_pack, msrp_cents)
     VALUES ($1, $2, $3, 90, 100, 6, 900) RETURNING id`,
    [sku, `Test bar ${sku}`, recipe.id],
  )
  return {
    productId: product.id,
    sku,
    recipeId: recipe.id,
    ingredients: { olive, coconut, lye, water, fragrance, box },
    lots,
  }
}

/** A shop order with one line, for a `shipped` move to point at (the orders module writes these for real). */
export async function makeShippedOrder(
  batchId: number,
  productId: number,
  bars: number,
  userId: number | null = null,
) {
  const shop = await one<{ id: number; trading_name: string }>(
    'SELECT id, trading_name FROM shops ORDER BY id LIMIT 1',
    [],
  )
  const seq = Math.floor(Math.random() * 900_000) + 1000
  const order = await one<{ id: number; number: string }>(
    `INSERT INTO orders (number, year, seq, shop_id, status, subtotal_cents, total_cents, shipped_at)
     VALUES ($1, 2099, $2, $3, 'shipped', 0, 0, now()) RETURNING id, number`,
    [`T-${seq}`, seq, shop.id],
  )
  const line = await one<{ id: number }>(
    `INSERT INTO order_lines (order_id, product_id, sku, name, cases, case_pack, bars, unit_price_cents, line_total_cents)
     VALUES ($1, $2, 'X', 'X', 1, $3, $3, 0, 0) RETURNING id`,
    [order.id, productId, bars],
  )
  for (const [kind, free, reserved] of [
    ['reserved', -bars, bars],
    ['shipped', 0, -bars],
  ] as const) {
    await sequelize.query(
      `INSERT INTO stock_moves (batch_id, kind, bars, free_delta, reserved_delta, order_id, order_line_id, user_id)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8)`,
      { bind: [batchId, kind, bars, free, reserved, order.id, line.id, userId] },
    )
  }
  // Written past the services: the in-process catalogue cache must hear of it.
  invalidateCatalogue()
  return { orderId: order.id, orderNumber: order.number, shopId: shop.id, shopName: shop.trading_name }
}
