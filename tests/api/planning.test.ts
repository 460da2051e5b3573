import { beforeAll, describe, expect, it } from 'vitest'
import { QueryTypes } from 'sequelize'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { updateSettings } from '@server/modules/settings/settings.service'
import { DEFAULT_CURE_DAYS } from '@shared/domain/availability/availability'
import { parseCsv } from '@shared/domain/csv/csv'
import { addDays, compareIso } from '@shared/domain/dates/dates'
import type { PlannedPour, PlanProduct, PourPlan } from '@shared/schemas/planning'
import type { SalesReport } from '@shared/schemas/sales'
import type { TodayDto } from '@shared/schemas/home'
import { clientAs } from '@tests/factories/api-client'
import type { ApiClient } from '@tests/factories/api-client'
import { addBatch, shopId, studioDay } from '@tests/factories/orders'
import { count, makePourable } from '@tests/factories/production'
import type { Pourable } from '@tests/factories/production'

// The test products are poured from makePourable's recipe: a 1000 g mould cuts 14 bars of 100 g,
// 2 end slices kept back, so a mould gives 12 bars to sell; 6 bars a case; a 28-day cure (the
// common practice minimum). The studio's pour lead time is the default 7 days.

const app = createApp({ pruneSessions: false })
let owner: ApiClient
let packer: ApiClient
let buyer: ApiClient
let anon: ApiClient
let today: string

let steady: Pourable // 60 ready, 48 bars ordered over 8 weeks
let idle: Pourable // 40 ready, never ordered
let preordered: Pourable // nothing poured, 18 bars pre-ordered
let unstocked: Pourable // its fragrance is used up, 12 bars pre-ordered

const q = <T extends object>(sql: string, bind: unknown[] = []) =>
  sequelize.query<T>(sql, { bind, type: QueryTypes.SELECT })

let seq = 0
/** A confirmed order placed `daysAgo` studio days back with one line (a pre-order still waiting, if asked). */
async function order(productId: number, bars: number, daysAgo: number, preorder = false) {
  seq += 1
  const shop = await shopId('buyerA')
  const [o] = await q<{ id: number }>(
    `INSERT INTO orders (number, year, seq, shop_id, status, subtotal_cents, total_cents, created_at)
     VALUES ($1, 2098, $2, $3, 'confirmed', $4, $4, now() - make_interval(days => $5)) RETURNING id`,
    [`PL-${process.pid}-${seq}`, 100_000 + seq, shop, bars * 500, daysAgo],
  )
  await sequelize.query(
    `INSERT INTO order_lines (order_id, product_id, sku, name, cases, case_pack, bars, unit_price_cents, line_total_cents,
                              preorder, promised_date)
     VALUES ($1, $2, 'X', 'X', $3, 6, $4, 500, $5, $6, $7)`,
    { bind: [o!.id, productId, bars / 6, bars, bars * 500, preorder, preorder ? addDays(today, 30) : null] },
  )
}

async function plan(qs = ''): Promise<PourPlan> {
  const r = await owner.get(`/api/planning/plan${qs}`)
  expect(r.status, JSON.stringify(r.body)).toBe(200)
  return r.body.plan as PourPlan
}
const row = (p: PourPlan, product: Pourable): PlanProduct =>
  p.products.find((x) => x.productId === product.productId)!

beforeAll(async () => {
  ;[owner, packer, buyer, anon] = await Promise.all([
    clientAs(app, 'owner'),
    clientAs(app, 'packer'),
    clientAs(app, 'buyerA'),
    clientAs(app, 'anon'),
  ])
  today = await studioDay()
  await updateSettings({ pourLeadTimeDays: 7 })
  steady = await makePourable()
  idle = await makePourable()
  preordered = await makePourable()
  unstocked = await makePourable()
  await addBatch(steady, { readyInDays: -10, bars: 60 })
  await addBatch(idle, { readyInDays: -10, bars: 40 })
  for (const d of [5, 15, 25, 35]) await order(steady.productId, 12, d)
  // Outside an 8-week window (56 days), and a cancelled order inside it: neither is demand.
  await order(steady.productId, 60, 70)
  await order(steady.productId, 60, 3)
  await q(`UPDATE orders SET status = 'cancelled' WHERE number = $1`, [`PL-${process.pid}-${seq}`])
  await order(preordered.productId, 18, 2, true)
  await sequelize.query('UPDATE ingredient_lots SET remaining = 0 WHERE ingredient_id = $1', {
    bind: [unstocked.ingredients.fragrance],
  })
  await order(unstocked.productId, 12, 1, true)
})

describe('GET /api/planning/plan', () => {
  it('gives the run-out date, latest pour date and suggested pour from the order history', async () => {
    const p = row(await plan(), steady)
    // 48 bars in 56 days = 6 a week; 60 ready bars last 70 days; 70 − 28 − 7 = 35 (hand calculation).
    expect(p).toMatchObject({
      readyBars: 60,
      curingBars: 0,
      orderedBars: 48,
      weeklyDemandBars: 6,
      weeklyDemandCases: 1,
      preorderBars: 0,
      cureDays: DEFAULT_CURE_DAYS,
      sellableBarsPerMould: 12,
      runOutDate: addDays(today, 70),
      latestPourDate: addDays(today, 35),
    })
    // 4 weeks × 6 bars = 24 → 2 moulds of 12.
    expect(p.suggestion).toEqual({
      pourBy: addDays(today, 35),
      late: false,
      moulds: 2,
      bars: 24,
      oilWeightG: 2000,
    })
    expect(p.outlook[0]).toEqual({ weekStart: today, readyBars: 60, curingBars: 0 })
  })

  it('takes the window the owner chooses (4 weeks: 36 bars in 28 days = 9 a week)', async () => {
    const p = await plan('?windowWeeks=4')
    expect(p.windowStart).toBe(addDays(today, -27))
    expect(row(p, steady).weeklyDemandBars).toBe(9)
  })

  it('a product with no orders in the window never runs out and gets no suggestion', async () => {
    const p = row(await plan(), idle)
    expect(p).toMatchObject({ weeklyDemandBars: 0, runOutDate: null, latestPourDate: null, suggestion: null })
  })

  it('a product with only pre-orders is short today and gets a late pour for them', async () => {
    const p = row(await plan(), preordered)
    expect(p).toMatchObject({
      weeklyDemandBars: 0,
      orderedBars: 0,
      preorderBars: 18,
      uncoveredPreorderBars: 18,
      runOutDate: today,
      latestPourDate: addDays(today, -35),
    })
    expect(p.suggestion).toMatchObject({ pourBy: today, late: true, moulds: 2, bars: 24 })
    const week = (await plan()).weeks.find((w) => w.pours.some((x) => x.productId === preordered.productId))
    expect(week).toBeDefined()
    expect(compareIso(week!.weekStart, today)).toBeLessThanOrEqual(0)
  })

  it('names an ingredient the recipe needs and the shelves lack, and what to buy', async () => {
    const p = await plan()
    const fragrance = p.ingredients.find((i) => i.ingredientId === unstocked.ingredients.fragrance)!
    // 3 % of 1000 g of oils for one mould (the recipe's own rule).
    expect(fragrance).toMatchObject({ needed: 30, onHand: 0, toBuy: 30, unit: 'g' })
    expect(row(p, unstocked).shortIngredients).toEqual([fragrance.name])
    expect(row(p, steady).shortIngredients).toEqual([])
  })

  it('adds up, per ingredient, exactly what the batch sheet of each suggested pour needs', async () => {
    const p = await plan()
    const totals = new Map<number, number>()
    for (const product of p.products) {
      if (!product.suggestion) continue
      const r = await owner.get(
        `/api/batches/suggest-lots?productId=${product.productId}&oilWeightG=${product.suggestion.oilWeightG}`,
      )
      expect(r.status, JSON.stringify(r.body)).toBe(200)
      expect(r.body.suggestion.barsCut - r.body.suggestion.barsKeptBack).toBe(product.suggestion.bars)
      for (const line of r.body.suggestion.lines as { ingredientId: number; needed: number }[]) {
        totals.set(line.ingredientId, (totals.get(line.ingredientId) ?? 0) + line.needed)
      }
    }
    expect(p.planned).toEqual([])
    expect(new Set(p.ingredients.map((i) => i.ingredientId))).toEqual(new Set(totals.keys()))
    for (const i of p.ingredients) expect(i.needed).toBeCloseTo(totals.get(i.ingredientId)!, 1)
    // The steady product's two moulds: 1400 g olive, 600 g coconut, 60 g fragrance, 24 boxes.
    const mine = (id: number) => p.ingredients.find((i) => i.ingredientId === id)!.needed
    expect(mine(steady.ingredients.olive)).toBe(1400)
    expect(mine(steady.ingredients.box)).toBe(24)
  })

  it('refuses bad query values with the field named', async () => {
    for (const [qs, field] of [
      ['?windowWeeks=0', 'query.windowWeeks'],
      ['?coverWeeks=abc', 'query.coverWeeks'],
      ['?horizonWeeks=27', 'query.horizonWeeks'],
    ]) {
      const r = await owner.get(`/api/planning/plan${qs}`)
      expect(r.status).toBe(400)
      expect(r.body.error.code).toBe('invalid_input')
      expect(r.body.error.details.map((d: { field: string }) => d.field)).toContain(field)
    }
  })
})

describe('planned pours', () => {
  let planned: PlannedPour

  it('turns a suggestion into a planned batch that the plan counts as supply', async () => {
    const r = await owner.post('/api/planning/pours', {
      productId: steady.productId,
      pourDate: today,
      moulds: 2,
    })
    expect(r.status, JSON.stringify(r.body)).toBe(201)
    planned = r.body.plannedPour
    expect(planned).toMatchObject({
      productId: steady.productId,
      pourDate: today,
      moulds: 2,
      oilWeightG: 2000,
      expectedBars: 24,
      readyDate: addDays(today, 28),
      status: 'planned',
      batchId: null,
    })
    const p = await plan()
    const s = row(p, steady)
    expect(s.plannedBars).toBe(24)
    // 36 left on day 28 + 24 → 60 bars, 70 more days (hand calculation); its latest pour is past the horizon.
    expect(s.runOutDate).toBe(addDays(today, 98))
    expect(s.suggestion).toBeNull()
    expect(p.planned.map((x) => x.id)).toContain(planned.id)
    expect((await owner.get(`/api/planning/pours/${planned.id}`)).body.plannedPour).toEqual(planned)
  })

  it('pouring it through the batch form marks it poured, once', async () => {
    const batch = {
      productId: steady.productId,
      pourDate: today,
      oilWeightG: 2000,
      barsCut: 28,
      barsKeptBack: 4,
      plannedPourId: planned.id,
    }
    const r = await owner.post('/api/batches', batch)
    expect(r.status, JSON.stringify(r.body)).toBe(201)
    const after = (await owner.get(`/api/planning/pours/${planned.id}`)).body.plannedPour
    expect(after).toMatchObject({ status: 'poured', batchId: r.body.batch.id })
    const s = row(await plan(), steady)
    expect(s).toMatchObject({ plannedBars: 0, curingBars: 24 })

    const batches = await count('SELECT count(*) FROM batches')
    const again = await owner.post('/api/batches', batch)
    expect(again.status).toBe(409)
    expect(again.body.error.code).toBe('plan_closed')
    expect(again.body.error.details[0].field).toBe('plannedPourId')
    expect(await count('SELECT count(*) FROM batches')).toBe(batches)
  })

  it('refuses a batch naming a planned pour that is not one, writing nothing', async () => {
    const batches = await count('SELECT count(*) FROM batches')
    for (const [plannedPourId, status] of [
      [0, 400],
      ['soon', 400],
      [99_999_999, 400],
    ] as [unknown, number][]) {
      const r = await owner.post('/api/batches', {
        productId: steady.productId,
        pourDate: today,
        barsCut: 14,
        barsKeptBack: 2,
        plannedPourId,
      })
      expect(r.status).toBe(status)
      expect(r.body.error.details.map((d: { field: string }) => d.field)).toContain('plannedPourId')
    }
    expect(await count('SELECT count(*) FROM batches')).toBe(batches)
  })

  it('refuses a batch of another product than the plan, writing nothing', async () => {
    const other = (
      await owner.post('/api/planning/pours', { productId: idle.productId, pourDate: today, moulds: 1 })
    ).body.plannedPour as PlannedPour
    const batches = await count('SELECT count(*) FROM batches')
    const lots = await count('SELECT sum(remaining)::int FROM ingredient_lots')
    const r = await owner.post('/api/batches', {
      productId: steady.productId,
      pourDate: today,
      barsCut: 14,
      barsKeptBack: 2,
      plannedPourId: other.id,
    })
    expect(r.status).toBe(422)
    expect(r.body.error.code).toBe('plan_product_mismatch')
    expect(await count('SELECT count(*) FROM batches')).toBe(batches)
    expect(await count('SELECT sum(remaining)::int FROM ingredient_lots')).toBe(lots)
    expect((await owner.get(`/api/planning/pours/${other.id}`)).body.plannedPour.status).toBe('planned')

    const dropped = await owner.delete(`/api/planning/pours/${other.id}`)
    expect(dropped.status).toBe(200)
    expect(dropped.body.plannedPour.status).toBe('dropped')
    expect(row(await plan(), idle).plannedBars).toBe(0)
    const twice = await owner.delete(`/api/planning/pours/${other.id}`)
    expect(twice.status).toBe(409)
    expect(twice.body.error.code).toBe('plan_closed')
  })

  it.each([
    [{}, ['productId', 'pourDate', 'moulds']],
    [{ productId: 1, pourDate: '2026-02-30', moulds: 1 }, ['pourDate']],
    [{ productId: 1, pourDate: '2030-01-01', moulds: 0 }, ['moulds']],
    [{ productId: 1, pourDate: '2030-01-01', moulds: 2.5 }, ['moulds']],
    [{ productId: 'x', pourDate: '2030-01-01', moulds: 1 }, ['productId']],
  ] as [Record<string, unknown>, string[]][])(
    'refuses %j naming %j, and writes nothing',
    async (input, fields) => {
      const before = await count('SELECT count(*) FROM planned_pours')
      const r = await owner.post('/api/planning/pours', input)
      expect(r.status).toBe(400)
      expect(r.body.error.code).toBe('invalid_input')
      expect(r.body.error.details.map((d: { field: string }) => d.field).sort()).toEqual([...fields].sort())
      expect(await count('SELECT count(*) FROM planned_pours')).toBe(before)
    },
  )

  it('refuses a day already past, an unknown product and an inactive one', async () => {
    const before = await count('SELECT count(*) FROM planned_pours')
    const past = await owner.post('/api/planning/pours', {
      productId: steady.productId,
      pourDate: addDays(today, -1),
      moulds: 1,
    })
    expect(past.status).toBe(400)
    expect(past.body.error.details[0].field).toBe('pourDate')
    const unknown = await owner.post('/api/planning/pours', {
      productId: 99_999_999,
      pourDate: today,
      moulds: 1,
    })
    expect(unknown.status).toBe(400)
    expect(unknown.body.error.details[0].field).toBe('productId')
    const inactive = await makePourable()
    await q('UPDATE products SET active = false WHERE id = $1', [inactive.productId])
    const r = await owner.post('/api/planning/pours', {
      productId: inactive.productId,
      pourDate: today,
      moulds: 1,
    })
    expect(r.status).toBe(422)
    expect(r.body.error.code).toBe('not_pourable')
    expect(r.body.error.details[0].field).toBe('productId')
    expect(await count('SELECT count(*) FROM planned_pours')).toBe(before)
  })

  it('answers 404 for a planned pour that does not exist and 400 for a bad id', async () => {
    expect((await owner.get('/api/planning/pours/99999999')).status).toBe(404)
    expect((await owner.delete('/api/planning/pours/99999999')).status).toBe(404)
    const bad = await owner.get('/api/planning/pours/abc')
    expect(bad.status).toBe(400)
    expect(bad.body.error.details[0].field).toBe('params.id')
  })
})

describe('PUT /api/settings/planning', () => {
  it('moves every latest pour date by the change in lead time', async () => {
    const r = await owner.put('/api/settings/planning', { pourLeadTimeDays: 14 })
    expect(r.status, JSON.stringify(r.body)).toBe(200)
    expect(r.body.settings.pourLeadTimeDays).toBe(14)
    const p = await plan()
    expect(p.leadTimeDays).toBe(14)
    expect(row(p, preordered).latestPourDate).toBe(addDays(today, -(28 + 14)))
    expect((await owner.put('/api/settings/planning', { pourLeadTimeDays: 7 })).status).toBe(200)
  })

  it.each([
    [{}],
    [{ pourLeadTimeDays: -1 }],
    [{ pourLeadTimeDays: 61 }],
    [{ pourLeadTimeDays: 'soon' }],
    [{ pourLeadTimeDays: 1.5 }],
  ])('refuses %j naming the field, and keeps the lead time', async (input) => {
    const r = await owner.put('/api/settings/planning', input)
    expect(r.status).toBe(400)
    expect(r.body.error.details[0].field).toBe('pourLeadTimeDays')
    expect((await owner.get('/api/settings')).body.settings.pourLeadTimeDays).toBe(7)
  })
})

describe('GET /api/sales', () => {
  const period = () => `from=${addDays(today, -60)}&to=${today}`

  it('adds up shipped lines, with the cost of the bars that left, the same in every grouping', async () => {
    const [expected] = await q<{ revenue: number; bars: number; cost: number; orders: number }>(
      `SELECT SUM(l.line_total_cents)::int AS revenue, SUM(l.bars)::int AS bars, COUNT(DISTINCT o.id)::int AS orders,
              (SELECT SUM(a.bars * b.cost_per_bar_cents)::int FROM allocations a JOIN batches b ON b.id = a.batch_id
                 JOIN order_lines l2 ON l2.id = a.order_line_id JOIN orders o2 ON o2.id = l2.order_id
                WHERE o2.status = 'shipped' AND o2.shipped_at >= now() - interval '60 days' AND l2.removed_at IS NULL) AS cost
         FROM order_lines l JOIN orders o ON o.id = l.order_id
        WHERE o.status = 'shipped' AND o.shipped_at >= now() - interval '60 days' AND l.removed_at IS NULL`,
    )
    expect(expected!.revenue).toBeGreaterThan(0)
    for (const by of ['product', 'tier', 'shop']) {
      const r = await owner.get(`/api/sales?${period()}&by=${by}`)
      expect(r.status, JSON.stringify(r.body)).toBe(200)
      const report = r.body.report as SalesReport
      expect(report.totals).toMatchObject({
        revenueCents: expected!.revenue,
        bars: expected!.bars,
        orders: expected!.orders,
        costCents: expected!.cost,
        marginCents: expected!.revenue - expected!.cost,
      })
      expect(report.rows.reduce((n, x) => n + x.revenueCents, 0)).toBe(expected!.revenue)
      for (const x of report.rows) expect(x.marginCents).toBe(x.revenueCents - x.costCents)
    }
    const tiers = (await owner.get(`/api/sales?${period()}&by=tier`)).body.report as SalesReport
    expect(tiers.rows.map((x) => x.label).sort()).toEqual(['Distributor', 'Preferred', 'Standard'])
  })

  it('exports the same rows as CSV with a total line', async () => {
    const report = (await owner.get(`/api/sales?${period()}&by=shop`)).body.report as SalesReport
    const r = await owner.get(`/api/sales.csv?${period()}&by=shop`)
    expect(r.status).toBe(200)
    expect(r.headers['content-type']).toMatch(/^text\/csv/)
    expect(r.headers['content-disposition']).toMatch(/attachment; filename="sales-by-shop-/)
    const rows = parseCsv(r.text)
    expect(rows.length).toBe(report.rows.length + 2)
    expect(rows[0]!.fields).toEqual([
      'Shop',
      'Orders',
      'Bars',
      'Revenue',
      'Cost of bars',
      'Margin',
      'Margin %',
    ])
    const total = rows.at(-1)!.fields
    expect(total[0]).toBe('Total')
    expect(total[3]).toBe((report.totals.revenueCents / 100).toFixed(2))
  })

  it('has nothing for a period without shipments', async () => {
    const r = await owner.get('/api/sales?from=2001-01-01&to=2001-12-31')
    expect(r.status).toBe(200)
    expect(r.body.report.rows).toEqual([])
    expect(r.body.report.totals).toMatchObject({ revenueCents: 0, marginPct: null })
  })

  it.each([
    ['from=2026-12-01&to=2026-11-01', 'query.to'],
    ['to=2026-11-01', 'query.from'],
    ['from=2026-11-01&to=2026-12-01&by=colour', 'query.by'],
    ['from=yesterday&to=2026-12-01', 'query.from'],
  ])('refuses %s naming %s', async (qs, field) => {
    for (const path of ['/api/sales', '/api/sales.csv']) {
      const r = await owner.get(`${path}?${qs}`)
      expect(r.status).toBe(400)
      expect(r.body.error.details.map((d: { field: string }) => d.field)).toContain(field)
    }
  })
})

describe('GET /api/home/today', () => {
  it('counts what waits for the owner, and names the pours and ingredients the plan needs', async () => {
    const r = await owner.get('/api/home/today')
    expect(r.status).toBe(200)
    const t = r.body.today as TodayDto
    expect(t.today).toBe(today)
    expect(t.ordersToConfirm).toBe(await count(`SELECT count(*) FROM orders WHERE status = 'placed'`))
    expect(t.packing.toPack).toBe(await count(`SELECT count(*) FROM orders WHERE status = 'confirmed'`))
    expect(t.applications).toBe(await count(`SELECT count(*) FROM shops WHERE status = 'applied'`))
    expect(t.invoices.overdue.count).toBe(
      await count(
        `SELECT count(*) FROM invoices WHERE kind = 'invoice' AND voided_at IS NULL AND paid_cents < total_cents AND due_date < $1`,
        [today],
      ),
    )
    expect(t.poursDue.find((p) => p.productId === preordered.productId)).toMatchObject({
      late: true,
      pourBy: today,
    })
    expect(t.lowIngredients.map((i) => i.ingredientId)).toContain(unstocked.ingredients.fragrance)
  })

  it('lists a certificate that expires within 30 days and a batch turning ready this week', async () => {
    const [shop] = await q<{ id: number }>(
      `SELECT id FROM shops WHERE status = 'active' AND certificate_upload_id IS NOT NULL ORDER BY id LIMIT 1`,
    )
    const [was] = await q<{ d: string }>(
      'SELECT certificate_expires_on::text AS d FROM shops WHERE id = $1',
      [shop!.id],
    )
    await q('UPDATE shops SET certificate_expires_on = $2 WHERE id = $1', [shop!.id, addDays(today, 10)])
    const batchId = await addBatch(idle, { readyInDays: 3, bars: 7 })
    try {
      const t = (await owner.get('/api/home/today')).body.today as TodayDto
      expect(t.certificates).toContainEqual(
        expect.objectContaining({ shopId: shop!.id, expiresOn: addDays(today, 10), status: 'expiring' }),
      )
      expect(t.batchesReady).toContainEqual(
        expect.objectContaining({ id: batchId, readyDate: addDays(today, 3), bars: 7 }),
      )
    } finally {
      await q('UPDATE shops SET certificate_expires_on = $2 WHERE id = $1', [shop!.id, was!.d])
    }
  })
})

describe('rights', () => {
  const reads = [
    '/api/planning/plan',
    '/api/planning/pours/1',
    '/api/home/today',
    '/api/sales?from=2026-01-01&to=2026-12-31',
    '/api/sales.csv?from=2026-01-01&to=2026-12-31',
  ]
  it('answers 403 to packers and buyers and 401 when signed out, writing nothing', async () => {
    const before = await count('SELECT count(*) FROM planned_pours')
    for (const [who, status] of [
      [packer, 403],
      [buyer, 403],
      [anon, 401],
    ] as [ApiClient, number][]) {
      for (const url of reads) expect((await who.get(url)).status, url).toBe(status)
      expect(
        (await who.post('/api/planning/pours', { productId: steady.productId, pourDate: today, moulds: 1 }))
          .status,
      ).toBe(status)
      expect((await who.delete('/api/planning/pours/1')).status).toBe(status)
      expect((await who.put('/api/settings/planning', { pourLeadTimeDays: 30 })).status).toBe(status)
    }
    expect(await count('SELECT count(*) FROM planned_pours')).toBe(before)
    expect((await owner.get('/api/settings')).body.settings.pourLeadTimeDays).toBe(7)
  })
})
