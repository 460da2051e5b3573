/**
 * The benchmark's large scenario, loaded on top of the demo data with set-based SQL in one
 * transaction: 300 products priced at every tier, 200 shops with a buyer each, 2,000 more
 * batches, and 50,000 past orders (June 2024 to early December 2025) with their allocations,
 * ledger moves, shipments, invoices and payments. Nothing bypasses the schema: the stock ledger's
 * trigger builds batch_stock from the moves (made, then reserved, then shipped) under its CHECKs,
 * the payments trigger adds to paid_cents, and the invoices of each year form a gapless series
 * of their own (the demo's series of the current year is left as it was).
 */
import bcrypt from 'bcryptjs'
import pg from 'pg'
import { DEMO_PASSWORDS } from '../../seeders/demo/scenario'

export const SCENARIO = {
  products: 300,
  shops: 200,
  newBatches: 2000,
  pastOrders: 50_000,
  /** Orders of the one shop whose history is measured. */
  historyShopOrders: 2000,
  /** Products with plenty of ready stock, for the order placement run. */
  hotProducts: 20,
  hotBatchesEach: 10,
  hotBatchBars: 3000,
} as const

export type ScenarioFacts = {
  historyShopId: number
  historyBuyerEmail: string
  /** Buyers of net-terms bench shops (their orders are not invoiced at placing). */
  buyers: { email: string; userId: number; shopId: number }[]
  hotProductIds: number[]
  invoice40Id: number
  ownerEmail: string
  password: { buyer: string; owner: string }
  counts: Record<string, number>
  loadSeconds: number
}

const STEPS: { name: string; sql: string }[] = [
  {
    name: 'products',
    sql: `
    INSERT INTO products (sku, name, scent_notes, description, recipe_id, net_weight_g, cut_weight_g, case_pack, msrp_cents)
    SELECT 'BX' || lpad(g::text, 4, '0'),
           (ARRAY['Meadow','Harbor','Quarry','Orchard','Fen','Bramble','Cinder','Tide'])[1 + g % 8] || ' ' ||
           (ARRAY['Bar','Block','Round','Slab','Cake'])[1 + g % 5] || ' No. ' || g,
           (ARRAY['Lavender, soft herbal','Cedarwood','Sweet orange','Peppermint','No added scent','Rose geranium'])[1 + g % 6],
           'A cold-process bar from the bench range, number ' || g || ', cured at least four weeks.',
           r.ids[1 + g % array_length(r.ids, 1)], 113, 130, 12, 900 + (g % 6) * 100
      FROM generate_series(1, @@products::int - (SELECT count(*)::int FROM products)) g,
           (SELECT array_agg(id ORDER BY id) AS ids FROM recipes) r`,
  },
  {
    name: 'price breaks',
    sql: `
    INSERT INTO price_breaks (tier_id, product_id, min_cases, unit_price_cents)
    SELECT t.id, p.id, m.min_cases,
           (520 - t.rn * 40 + (p.id % 7) * 10) - CASE WHEN m.min_cases = 5 THEN 20 ELSE 0 END
      FROM products p
      CROSS JOIN (SELECT id, row_number() OVER (ORDER BY sort_order, id) - 1 AS rn FROM price_tiers) t
      CROSS JOIN (VALUES (1), (5)) m(min_cases)
     WHERE p.sku LIKE 'BX%'`,
  },
  {
    name: 'shops and buyers',
    sql: `
    WITH s AS (
      INSERT INTO shops (legal_name, trading_name, contact_name, contact_email, billing_address, shipping_address,
                         tax_id, tier_id, payment_terms, status, opening_order_done, store_type)
      SELECT 'Bench Shop ' || g || ' LLC', 'Bench Shop ' || g, 'Buyer ' || g, 'buyer' || g || '@benchshops.test',
             jsonb_build_object('line1', g || ' Market Street', 'line2', '', 'city', 'Millbrook', 'region', 'VT',
                                'postalCode', '05899', 'country', 'US'),
             jsonb_build_object('line1', g || ' Market Street', 'line2', '', 'city', 'Millbrook', 'region', 'VT',
                                'postalCode', '05899', 'country', 'US'),
             'VT-RS-' || g, t.ids[1 + g % array_length(t.ids, 1)],
             CASE WHEN g % 2 = 0 THEN 'net_30' ELSE 'net_15' END, 'active', true, 'Gift shop'
        FROM generate_series(1, @@shops::int - (SELECT count(*)::int FROM shops)) g,
             (SELECT array_agg(id ORDER BY id) AS ids FROM price_tiers) t
      RETURNING id, contact_email, contact_name
    )
    INSERT INTO users (email, name, role, shop_id, password_hash)
    SELECT contact_email, contact_name, 'buyer', id, @@hash FROM s`,
  },
  {
    // Six earlier pours per product (every 13 weeks from March 2024), sized after the orders are
    // planned; and ten big ready pours of the first bench products for the placing run.
    name: 'batches',
    sql: `
    CREATE TEMP TABLE snap AS
      SELECT r.id AS recipe_id,
             COALESCE((SELECT b.recipe_snapshot FROM batches b WHERE b.recipe_id = r.id LIMIT 1),
                      jsonb_build_object('id', r.id, 'name', r.name)) AS snapshot,
             r.cure_days
        FROM recipes r;
    INSERT INTO batches (product_id, recipe_id, recipe_snapshot, lot_code, pour_date, cure_days, ready_date,
                         oil_weight_g, bars_cut, bars_kept_back, ingredient_cost_cents, cost_per_bar_cents, location)
    SELECT p.id, p.recipe_id, s.snapshot, to_char(d.pour, 'YYMMDD') || '-' || p.sku || '-01', d.pour, 28, d.pour + 28,
           3300, 0, 0, 0, 180, 'Rack B'
      FROM products p JOIN snap s ON s.recipe_id = p.recipe_id
      CROSS JOIN generate_series(0, 5) k
      CROSS JOIN LATERAL (SELECT (date '2024-03-01' + k * 91 + p.id % 30) AS pour) d;
    INSERT INTO batches (product_id, recipe_id, recipe_snapshot, lot_code, pour_date, cure_days, ready_date,
                         oil_weight_g, bars_cut, bars_kept_back, ingredient_cost_cents, cost_per_bar_cents, location)
    SELECT p.id, p.recipe_id, s.snapshot, to_char(d.pour, 'YYMMDD') || '-' || p.sku || '-01', d.pour, 28, d.pour + 28,
           27000, @@hotBars::int + 6, 6, 0, 180, 'Rack H'
      FROM (SELECT * FROM products WHERE sku LIKE 'BX%' ORDER BY id LIMIT @@hotProducts) p
      JOIN snap s ON s.recipe_id = p.recipe_id
      CROSS JOIN generate_series(0, 9) k
      CROSS JOIN LATERAL (SELECT (current_date - 90 + k) AS pour) d`,
  },
  {
    // 50,000 orders, every 950 s from 1 June 2024; one in 25 is the history shop's, one in 50 was cancelled.
    name: 'orders',
    sql: `
    CREATE TEMP TABLE bench_shops AS
      SELECT s.id, row_number() OVER (ORDER BY s.id) AS rn, s.tier_id, s.payment_terms, u.id AS buyer_id
        FROM shops s JOIN users u ON u.shop_id = s.id
       WHERE s.contact_email LIKE '%@benchshops.test';
    CREATE TEMP TABLE plan AS
      SELECT q.*, extract(year FROM q.placed_at AT TIME ZONE 'UTC')::int AS year,
             row_number() OVER (PARTITION BY extract(year FROM q.placed_at AT TIME ZONE 'UTC') ORDER BY q.g)::int AS seq
        FROM (SELECT g, bs.id AS shop_id,
                     timestamptz '2024-06-01 09:00:00+00' + (g - 1) * interval '950 seconds' AS placed_at,
                     CASE WHEN g % 50 = 7 THEN 'cancelled' ELSE 'shipped' END AS status,
                     CASE WHEN g = @@pastOrders::int - 1 THEN 40 ELSE 1 + g % 4 END AS n_lines
                FROM generate_series(1, @@pastOrders::int) g
                CROSS JOIN (SELECT count(*) AS n FROM bench_shops) c
                JOIN bench_shops bs ON bs.rn = CASE WHEN g % 25 = 0 THEN 1 ELSE 2 + g % (c.n - 1) END) q;
    CREATE TEMP TABLE plan_lines AS
      SELECT o.g, k, p.id AS product_id, p.sku, p.name, p.case_pack, p.net_weight_g,
             1 + (o.g + k) % 5 AS cases,
             (SELECT b.unit_price_cents FROM price_breaks b
               WHERE b.tier_id = bs.tier_id AND b.product_id = p.id AND b.min_cases <= 1 + (o.g + k) % 5
               ORDER BY b.min_cases DESC LIMIT 1) AS unit_price_cents
        FROM plan o
        JOIN bench_shops bs ON bs.id = o.shop_id
        CROSS JOIN LATERAL generate_series(0, o.n_lines - 1) k
        JOIN (SELECT id, sku, name, case_pack, net_weight_g, row_number() OVER (ORDER BY id) - 1 AS idx FROM products) p
          ON p.idx = (o.g * 7 + k * 61) % (SELECT count(*) FROM products);
    CREATE TEMP TABLE plan_totals AS
      SELECT g, sum(cases * case_pack * unit_price_cents)::int AS subtotal,
             sum(cases * case_pack * net_weight_g)::int AS weight
        FROM plan_lines GROUP BY g;
    INSERT INTO orders (number, year, seq, shop_id, placed_by, po_number, status, is_opening_order,
                        subtotal_cents, shipping_cents, tax_cents, total_cents, weight_g, tax_exempt, tax_rate_pct,
                        confirmed_at, confirmed_by, cancelled_at, cancelled_by, cancel_reason, packer_id,
                        packing_started_at, packed_at, cartons, packed_weight_g, shipped_at, created_at, updated_at)
    SELECT 'O' || lpad((o.year % 100)::text, 2, '0') || '-' || lpad(o.seq::text, 5, '0'), o.year, o.seq,
           o.shop_id, bs.buyer_id, CASE WHEN o.n_lines = 40 THEN 'BENCH-40' ELSE 'PO-' || o.g END, o.status, false,
           t.subtotal, sh.rate, 0, t.subtotal + sh.rate, t.weight, false, 0,
           o.placed_at + interval '1 day', owner.id,
           CASE WHEN o.status = 'cancelled' THEN o.placed_at + interval '1 day' END,
           CASE WHEN o.status = 'cancelled' THEN owner.id END,
           CASE WHEN o.status = 'cancelled' THEN 'The shop changed its mind.' END,
           CASE WHEN o.status = 'shipped' THEN packer.id END,
           CASE WHEN o.status = 'shipped' THEN o.placed_at + interval '2 days' END,
           CASE WHEN o.status = 'shipped' THEN o.placed_at + interval '2 days 2 hours' END,
           CASE WHEN o.status = 'shipped' THEN 1 + t.weight / 15000 END,
           CASE WHEN o.status = 'shipped' THEN t.weight + 400 END,
           CASE WHEN o.status = 'shipped' THEN o.placed_at + interval '3 days' END,
           o.placed_at, o.placed_at + interval '3 days'
      FROM plan o
      JOIN bench_shops bs ON bs.id = o.shop_id
      JOIN plan_totals t ON t.g = o.g
      CROSS JOIN LATERAL (SELECT CASE WHEN t.weight <= 5000 THEN 1500 WHEN t.weight <= 15000 THEN 2800
                                      WHEN t.weight <= 30000 THEN 4500 ELSE 6500 END AS rate) sh
      CROSS JOIN (SELECT id FROM users WHERE role = 'owner' ORDER BY id LIMIT 1) owner
      CROSS JOIN (SELECT id FROM users WHERE role = 'packer' ORDER BY id LIMIT 1) packer
     ORDER BY o.g;
    CREATE TEMP TABLE order_ids AS
      SELECT o.id, p.g, o.status, o.created_at, o.shipped_at FROM orders o
        JOIN plan p ON o.year = p.year AND o.seq = p.seq;
    INSERT INTO order_sequences (year, last)
      SELECT year, max(seq) FROM orders WHERE number LIKE 'O24-%' OR number LIKE 'O25-%' GROUP BY year
      ON CONFLICT (year) DO UPDATE SET last = EXCLUDED.last;
    INSERT INTO order_lines (order_id, product_id, sku, name, cases, case_pack, bars, unit_price_cents,
                             line_total_cents, preorder, sort_order)
    SELECT oi.id, l.product_id, l.sku, l.name, l.cases, l.case_pack, l.cases * l.case_pack, l.unit_price_cents,
           l.cases * l.case_pack * l.unit_price_cents, false, l.k
      FROM plan_lines l JOIN order_ids oi ON oi.g = l.g
     ORDER BY oi.id, l.k`,
  },
  {
    // Each shipped line took its bars from the product's latest pour that was ready on the day.
    name: 'allocations',
    sql: `
    CREATE TEMP TABLE plan_alloc AS
      SELECT row_number() OVER (ORDER BY ol.id)::int AS n, ol.id AS line_id, ol.order_id, ol.bars, oi.created_at, oi.shipped_at,
             (SELECT b.id FROM batches b
               WHERE b.product_id = ol.product_id AND b.location = 'Rack B' AND b.ready_date <= oi.created_at::date
               ORDER BY b.ready_date DESC LIMIT 1) AS batch_id
        FROM order_lines ol JOIN order_ids oi ON oi.id = ol.order_id
       WHERE oi.status = 'shipped';
    UPDATE batches b SET bars_cut = a.bars + 18, bars_kept_back = 6
      FROM (SELECT batch_id, sum(bars)::int AS bars FROM plan_alloc GROUP BY batch_id) a
     WHERE b.id = a.batch_id;
    UPDATE batches SET bars_cut = 18, bars_kept_back = 6 WHERE location = 'Rack B' AND bars_cut = 0;
    INSERT INTO stock_moves (batch_id, kind, bars, free_delta, reserved_delta, user_id, created_at)
    SELECT b.id, 'made', b.bars_cut - b.bars_kept_back, b.bars_cut - b.bars_kept_back, 0,
           (SELECT id FROM users WHERE role = 'owner' ORDER BY id LIMIT 1), b.pour_date::timestamptz
      FROM batches b WHERE b.location IN ('Rack B', 'Rack H')
     ORDER BY b.id;
    INSERT INTO allocations (order_line_id, batch_id, bars, created_at)
    SELECT line_id, batch_id, bars, created_at FROM plan_alloc ORDER BY line_id`,
  },
  {
    // The invoice of each shipped order, numbered by ship date within its year (gapless), its lines
    // copied from the order; nine in ten paid in full a few weeks later.
    name: 'shipments, invoices and payments',
    sql: `
    INSERT INTO shipments (order_id, carrier, tracking_number, ship_date, cartons, weight_g, created_by, created_at)
    SELECT o.id, 'UPS', '1ZBENCH' || o.id, (o.shipped_at AT TIME ZONE 'UTC')::date, o.cartons, o.packed_weight_g,
           o.packer_id, o.shipped_at
      FROM orders o JOIN order_ids oi ON oi.id = o.id WHERE o.status = 'shipped';
    INSERT INTO invoices (number, year, seq, kind, order_id, shop_id, issue_date, due_date, terms, po_number, bill_to,
                          subtotal_cents, shipping_cents, tax_cents, total_cents, tax_rate_pct, tax_exempt, created_by, created_at)
    SELECT 'LC-' || n.year || '-' || lpad(n.seq::text, 6, '0'), n.year, n.seq, 'invoice', o.id, o.shop_id,
           n.issue, n.issue + CASE s.payment_terms WHEN 'net_30' THEN 30 WHEN 'net_15' THEN 15 ELSE 0 END,
           s.payment_terms, o.po_number,
           jsonb_build_object('legalName', s.legal_name, 'tradingName', s.trading_name, 'contactName', s.contact_name,
                              'contactEmail', s.contact_email, 'taxId', s.tax_id,
                              'lines', jsonb_build_array(s.billing_address->>'line1',
                                       (s.billing_address->>'city') || ', ' || (s.billing_address->>'region') || ' ' ||
                                       (s.billing_address->>'postalCode'), s.billing_address->>'country')),
           o.subtotal_cents, o.shipping_cents, o.tax_cents, o.total_cents, 0, false, o.packer_id, o.shipped_at
      FROM (SELECT o.id, (o.shipped_at AT TIME ZONE 'UTC')::date AS issue,
                   extract(year FROM o.shipped_at AT TIME ZONE 'UTC')::int AS year,
                   row_number() OVER (PARTITION BY extract(year FROM o.shipped_at AT TIME ZONE 'UTC')
                                      ORDER BY o.shipped_at, o.id)::int AS seq
              FROM orders o JOIN order_ids oi ON oi.id = o.id WHERE o.status = 'shipped') n
      JOIN orders o ON o.id = n.id JOIN shops s ON s.id = o.shop_id
     ORDER BY n.year, n.seq;
    INSERT INTO invoice_sequences (year, last)
      SELECT year, max(seq) FROM invoices WHERE year IN (2024, 2025) GROUP BY year
      ON CONFLICT (year) DO UPDATE SET last = EXCLUDED.last;
    INSERT INTO invoice_lines (invoice_id, order_line_id, sku, description, cases, case_pack, bars,
                               unit_price_cents, line_total_cents, sort_order)
    SELECT i.id, l.id, l.sku, l.name, l.cases, l.case_pack, l.bars, l.unit_price_cents, l.line_total_cents, l.sort_order
      FROM invoices i JOIN order_ids oi ON oi.id = i.order_id JOIN order_lines l ON l.order_id = i.order_id
     ORDER BY i.id, l.sort_order;
    INSERT INTO payments (invoice_id, method, amount_cents, received_on, reference, recorded_by, created_at)
    SELECT i.id, 'bank_transfer', i.total_cents, i.issue_date + 20, 'ACH ' || i.number, i.created_by, i.created_at
      FROM invoices i JOIN order_ids oi ON oi.id = i.order_id
     WHERE oi.g % 10 <> 3
     ORDER BY i.id`,
  },
]

/**
 * The reserved and then the shipped move of every allocation, a few thousand a transaction: the
 * ledger's trigger updates the batch's balance row once per move, and within one transaction those
 * row versions pile up (they cannot be pruned before commit), which makes one huge statement slow.
 */
const MOVES_SQL = `
  INSERT INTO stock_moves (batch_id, kind, bars, free_delta, reserved_delta, order_id, order_line_id, user_id, created_at)
  SELECT batch_id, $3::text, bars, CASE WHEN $3::text = 'reserved' THEN -bars ELSE 0 END,
         CASE WHEN $3::text = 'reserved' THEN bars ELSE -bars END, order_id, line_id,
         (SELECT id FROM users WHERE role = CASE WHEN $3::text = 'reserved' THEN 'owner' ELSE 'packer' END ORDER BY id LIMIT 1),
         CASE WHEN $3::text = 'reserved' THEN created_at ELSE shipped_at END
    FROM plan_alloc WHERE n BETWEEN $1 AND $2 ORDER BY n`
const MOVES_CHUNK = 4000

/** Loads the scenario through a superuser-free connection to the app's database; returns what the runs need. */
export async function loadScenario(url: string, log: (l: string) => void): Promise<ScenarioFacts> {
  const started = Date.now()
  const client = new pg.Client({ connectionString: url })
  await client.connect()
  const hash = bcrypt.hashSync(DEMO_PASSWORDS.buyer, 4)
  const params: Record<string, unknown> = {
    products: SCENARIO.products,
    shops: SCENARIO.shops,
    hash,
    hotProducts: SCENARIO.hotProducts,
    hotBars: SCENARIO.hotBatchBars,
    pastOrders: SCENARIO.pastOrders,
  }
  try {
    await client.query("SET work_mem = '64MB'")
    for (const step of STEPS) {
      const t0 = Date.now()
      await client.query('BEGIN')
      await runStep(client, step.sql, params)
      await client.query('COMMIT')
      log(`  ${step.name}: ${((Date.now() - t0) / 1000).toFixed(1)} s`)
      if (step.name === 'allocations') {
        const t1 = Date.now()
        const { rows } = await client.query('SELECT count(*)::int AS n FROM plan_alloc')
        for (const kind of ['reserved', 'shipped']) {
          for (let lo = 1; lo <= rows[0].n; lo += MOVES_CHUNK) {
            await client.query(MOVES_SQL, [lo, lo + MOVES_CHUNK - 1, kind])
          }
        }
        log(`  reserved and shipped moves: ${((Date.now() - t1) / 1000).toFixed(1)} s`)
      }
    }
    // As autovacuum would leave a table of this age: statistics and the visibility map up to date.
    await client.query('VACUUM ANALYZE')
    return await facts(client, (Date.now() - started) / 1000)
  } catch (err) {
    await client.query('ROLLBACK').catch(() => {})
    throw err
  } finally {
    await client.end()
  }
}

/** A step may hold several statements; each runs on its own with the `@@name` parameters it uses. */
async function runStep(client: pg.Client, sql: string, params: Record<string, unknown>) {
  const statements = sql
    .split(/;\s*\n/)
    .map((s) => s.trim())
    .filter(Boolean)
  for (const s of statements) {
    const names: string[] = []
    const text = s.replace(/@@(\w+)/g, (_m, name: string) => {
      if (!(name in params)) throw new Error(`no parameter @@${name}`)
      if (!names.includes(name)) names.push(name)
      return `$${names.indexOf(name) + 1}`
    })
    await client.query(
      text,
      names.map((n) => params[n]),
    )
  }
}

async function facts(client: pg.Client, loadSeconds: number): Promise<ScenarioFacts> {
  const one = async <T>(sql: string) => (await client.query(sql)).rows[0] as T
  const history = await one<{ shop_id: number; email: string }>(
    `SELECT o.shop_id, u.email FROM orders o JOIN users u ON u.shop_id = o.shop_id
      GROUP BY o.shop_id, u.email ORDER BY count(*) DESC LIMIT 1`,
  )
  const buyers = (
    await client.query(
      `SELECT u.email, u.id AS "userId", s.id AS "shopId" FROM users u JOIN shops s ON s.id = u.shop_id
        WHERE s.contact_email LIKE '%@benchshops.test' AND s.payment_terms <> 'prepay' AND s.id <> $1
        ORDER BY s.id LIMIT 60`,
      [history.shop_id],
    )
  ).rows as ScenarioFacts['buyers']
  const hot = (
    await client.query(`SELECT DISTINCT product_id FROM batches WHERE location = 'Rack H' ORDER BY 1`)
  ).rows.map((r: { product_id: number }) => r.product_id)
  const inv = await one<{ id: number }>(
    `SELECT i.id FROM invoices i JOIN orders o ON o.id = i.order_id WHERE o.po_number = 'BENCH-40'`,
  )
  const owner = await one<{ email: string }>(
    `SELECT email FROM users WHERE role = 'owner' ORDER BY id LIMIT 1`,
  )
  const counts = await one<Record<string, number>>(
    `SELECT (SELECT count(*)::int FROM products) AS products, (SELECT count(*)::int FROM batches) AS batches,
            (SELECT count(*)::int FROM shops) AS shops, (SELECT count(*)::int FROM orders) AS orders,
            (SELECT count(*)::int FROM order_lines) AS "orderLines", (SELECT count(*)::int FROM invoices) AS invoices,
            (SELECT count(*)::int FROM stock_moves) AS "stockMoves", (SELECT count(*)::int FROM payments) AS payments,
            (SELECT count(*)::int FROM orders WHERE shop_id = ${history.shop_id}) AS "historyShopOrders"`,
  )
  return {
    historyShopId: history.shop_id,
    historyBuyerEmail: history.email,
    buyers,
    hotProductIds: hot,
    invoice40Id: inv.id,
    ownerEmail: owner.email,
    password: { buyer: DEMO_PASSWORDS.buyer, owner: DEMO_PASSWORDS.owner },
    counts,
    loadSeconds,
  }
}
