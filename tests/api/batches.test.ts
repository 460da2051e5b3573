import { beforeAll, describe, expect, it } from 'vitest'
import { QueryTypes } from 'sequelize'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { readyBatchesForUpdate, readyStockByProduct } from '@server/modules/availability/availability.service'
import { getSettings } from '@server/modules/settings/settings.service'
import { DEFAULT_CURE_DAYS } from '@shared/domain/availability/availability'
import { addDays, daysBetween, isoToday } from '@shared/domain/dates/dates'
import { parseCsv } from '@shared/domain/csv/csv'
import { clientAs } from '@tests/factories/api-client'
import { DEMO_POURS } from '../../seeders/0005-batches'
import { DEMO_PRODUCTS } from '../../seeders/demo/catalogue'
import type { ApiClient } from '@tests/factories/api-client'
import {
  TEST_SAP,
  count,
  lotRemaining,
  makeLot,
  makePourable,
  makeShippedOrder,
} from '@tests/factories/production'
import type { Pourable } from '@tests/factories/production'
import { allowConsoleError } from '../setup/fail-on-console-error'

const app = createApp({ pruneSessions: false })
let owner: ApiClient
let packer: ApiClient
let buyer: ApiClient
let anon: ApiClient
let today: string
let labourRateCents: number

beforeAll(async () => {
  ;[owner, packer, buyer, anon] = await Promise.all([
    clientAs(app, 'owner'),
    clientAs(app, 'packer'),
    clientAs(app, 'buyerA'),
    clientAs(app, 'anon'),
  ])
  const settings = await getSettings()
  today = isoToday(new Date(), settings.timeZone)
  labourRateCents = settings.labourRateCents
})

const daysAgo = (n: number) => addDays(today, -n)

async function pour(p: Pourable, extra: Record<string, unknown> = {}) {
  const r = await owner.post('/api/batches', {
    productId: p.productId,
    pourDate: daysAgo(1),
    barsCut: 14,
    barsKeptBack: 2,
    ...extra,
  })
  if (r.status !== 201) throw new Error(`pour failed: ${r.status} ${JSON.stringify(r.body)}`)
  return r.body.batch as {
    id: number
    lotCode: string
    readyDate: string
    free: number
    costPerBarCents: number
  }
}

// The test recipe at 1000 g of oils (hand calculation from DESIGN.md's formulas):
// NaOH = Σ oil × SAP × (1 − superfat); water = lye × (1 − c) ÷ c at c = 33 %.
const naoh1000 = (700 * TEST_SAP.olive + 300 * TEST_SAP.coconut) * 0.95
const water1000 = (naoh1000 * 0.67) / 0.33

describe('GET /api/batches/products', () => {
  it('lists pourable products with their mould for the owner and the packer', async () => {
    const p = await makePourable()
    for (const c of [owner, packer]) {
      const r = await c.get('/api/batches/products').expect(200)
      expect(r.body.items).toContainEqual(
        expect.objectContaining({
          id: p.productId,
          sku: p.sku,
          mouldOilWeightG: 1000,
          cureDays: 28,
          barsPerMould: 14,
        }),
      )
    }
  })
  it('refuses buyers (403) and the signed-out (401)', async () => {
    expect((await buyer.get('/api/batches/products')).status).toBe(403)
    expect((await anon.get('/api/batches/products')).status).toBe(401)
  })
})

describe('GET /api/batches/suggest-lots', () => {
  it('gives every ingredient’s grams from the batch sheet and takes the oldest lot first', async () => {
    const p = await makePourable({
      oliveLots: [
        { receivedOn: '2024-03-01', quantity: 5_000, costCents: 2_500 },
        { receivedOn: '2024-02-01', quantity: 500, costCents: 200 },
        // arrives after the pour date below: not offered
        { receivedOn: daysAgo(0), quantity: 9_000, costCents: 3_600 },
      ],
    })
    const r = await owner
      .get(`/api/batches/suggest-lots?productId=${p.productId}&oilWeightG=1000&pourDate=${daysAgo(3)}`)
      .expect(200)
    const s = r.body.suggestion
    const line = (id: number) => s.lines.find((l: { ingredientId: number }) => l.ingredientId === id)
    expect(line(p.ingredients.olive).needed).toBe(700)
    expect(line(p.ingredients.coconut).needed).toBe(300)
    expect(line(p.ingredients.fragrance).needed).toBe(30)
    expect(line(p.ingredients.lye).needed).toBeCloseTo(naoh1000, 1)
    expect(line(p.ingredients.water).needed).toBeCloseTo(water1000, 1)
    // 1461 g of batch over 100 g bars: 14 cut, 2 end slices kept back, 12 boxes.
    expect(s).toMatchObject({ barsCut: 14, barsKeptBack: 2, sellableBars: 12, moulds: 1, cureDays: 28 })
    expect(line(p.ingredients.box)).toMatchObject({ needed: 12, unit: 'each' })
    // Oldest first: all 500 g of the February lot, then 200 g of the March lot.
    expect(
      line(p.ingredients.olive).takes.map((t: { ingredientLotId: number; quantity: number }) => [
        t.ingredientLotId,
        t.quantity,
      ]),
    ).toEqual([
      [p.lots.olive[1], 500],
      [p.lots.olive[0], 200],
    ])
    expect(line(p.ingredients.olive).lots.map((l: { ingredientLotId: number }) => l.ingredientLotId)).toEqual(
      [p.lots.olive[1], p.lots.olive[0]],
    )
    expect(s.shortfalls).toEqual([])
    expect(s.lotCode).toMatch(new RegExp(`^${daysAgo(3).slice(2).replaceAll('-', '')}-${p.sku}-01$`))
    expect(s.readyDate).toBe(addDays(daysAgo(3), 28))
  })

  it('names the shortfall per ingredient when the lots cannot cover the batch', async () => {
    const p = await makePourable({
      oliveLots: [{ receivedOn: '2024-01-02', quantity: 1_000, costCents: 400 }],
    })
    const r = await owner
      .get(`/api/batches/suggest-lots?productId=${p.productId}&oilWeightG=3000`)
      .expect(200)
    expect(r.body.suggestion.shortfalls).toEqual([
      expect.objectContaining({
        ingredientId: p.ingredients.olive,
        needed: 2100,
        available: 1000,
        shortBy: 1100,
      }),
    ])
    expect(r.body.suggestion.estimatedCostPerBarCents).toBeNull()
  })

  it('defaults the oil weight to the recipe’s mould', async () => {
    const p = await makePourable()
    const r = await owner.get(`/api/batches/suggest-lots?productId=${p.productId}`).expect(200)
    expect(r.body.suggestion.oilWeightG).toBe(1000)
  })

  it('answers 400 with the field at fault, 403 to the packer and buyer, 401 signed out', async () => {
    const bad = await owner.get('/api/batches/suggest-lots?oilWeightG=-5')
    expect(bad.status).toBe(400)
    expect(bad.body.error.details.map((d: { field: string }) => d.field).sort()).toEqual([
      'query.oilWeightG',
      'query.productId',
    ])
    const missing = await owner.get('/api/batches/suggest-lots?productId=999999')
    expect(missing.status).toBe(400)
    expect(missing.body.error.details[0].field).toBe('productId')
    expect((await packer.get('/api/batches/suggest-lots?productId=1')).status).toBe(403)
    expect((await buyer.get('/api/batches/suggest-lots?productId=1')).status).toBe(403)
    expect((await anon.get('/api/batches/suggest-lots?productId=1')).status).toBe(401)
  })
})

describe('POST /api/batches', () => {
  it('records a batch: lots drawn down, lot code, ready date, frozen cost per bar, and the made move', async () => {
    const p = await makePourable()
    const pourDate = daysAgo(2)
    const r = await owner.post('/api/batches', {
      productId: p.productId,
      pourDate,
      oilWeightG: 1000,
      barsCut: 14,
      barsKeptBack: 2,
      keptBackReason: 'End slices',
      location: 'Rack B, shelf 2',
    })
    expect(r.status).toBe(201)
    const b = r.body.batch
    // Lot code YYMMDD-SKU-NN (shared/domain/batches/lot-code.ts), first of the day.
    expect(b.lotCode).toBe(`${pourDate.slice(2).replaceAll('-', '')}-${p.sku}-01`)
    // Ready date = pour date + cure days; 28 days is the usual minimum cure (common practice).
    expect(b.cureDays).toBe(DEFAULT_CURE_DAYS)
    expect(b.readyDate).toBe(addDays(pourDate, 28))
    expect(b).toMatchObject({
      status: 'curing',
      free: 12,
      reserved: 0,
      sellableBars: 12,
      location: 'Rack B, shelf 2',
    })
    expect(b.keptBackReason).toBe('End slices')

    // Cost per sellable bar (DESIGN.md §3): (ingredients at the lots' unit costs + packaging + labour) ÷ sellable.
    // Unit costs (cost + freight) ÷ quantity: olive 0.4, coconut 0.6, lye 0.42, water 0.01, fragrance 5 ¢/g; box 20 ¢.
    const ingredients = 700 * 0.4 + 300 * 0.6 + naoh1000 * 0.42 + water1000 * 0.01 + 30 * 5
    const total = ingredients + 12 * 20 + (60 / 60) * labourRateCents
    expect(b.costPerBarCents).toBe(Math.round(total / 12))
    expect(b.ingredientCostCents).toBe(Math.round(ingredients))

    expect(await lotRemaining(p.lots.olive[0]!)).toBe(200_000 - 700)
    expect(await lotRemaining(p.lots.box)).toBe(5_000 - 12)
    expect(b.lots).toHaveLength(6)
    expect(b.moves).toEqual([
      expect.objectContaining({
        kind: 'made',
        bars: 12,
        freeDelta: 12,
        reservedDelta: 0,
        userName: 'Maren Oakes',
      }),
    ])
    const [snap] = await sequelize.query<{ s: { cureDays: number; oils: unknown[] } }>(
      'SELECT recipe_snapshot AS s FROM batches WHERE id = $1',
      {
        bind: [b.id],
        type: QueryTypes.SELECT,
      },
    )
    expect(snap!.s.cureDays).toBe(28)
    expect(snap!.s.oils).toHaveLength(2)

    const second = await pour(p, { pourDate })
    expect(second.lotCode).toBe(`${pourDate.slice(2).replaceAll('-', '')}-${p.sku}-02`)
  })

  it('takes the recipe’s own cure days for the ready date', async () => {
    const p = await makePourable({ cureDays: 42 })
    const b = await pour(p, { pourDate: daysAgo(5) })
    expect(b.readyDate).toBe(addDays(daysAgo(5), 42))
  })

  it('uses the lots the owner names, with the quantities weighed', async () => {
    const p = await makePourable({
      oliveLots: [
        { receivedOn: '2024-02-01', quantity: 1_000, costCents: 400 },
        { receivedOn: '2024-03-01', quantity: 1_000, costCents: 800 },
      ],
    })
    const r = await owner.post('/api/batches', {
      productId: p.productId,
      pourDate: daysAgo(1),
      barsCut: 14,
      barsKeptBack: 2,
      lots: [
        { ingredientLotId: p.lots.olive[1], quantity: 705 },
        { ingredientLotId: p.lots.olive[0], quantity: 0 },
        { ingredientLotId: p.lots.coconut, quantity: 300 },
        { ingredientLotId: p.lots.lye, quantity: 142.3 },
        { ingredientLotId: p.lots.water, quantity: 289 },
        { ingredientLotId: p.lots.fragrance, quantity: 30 },
        { ingredientLotId: p.lots.box, quantity: 12 },
      ],
    })
    expect(r.status).toBe(201)
    expect(await lotRemaining(p.lots.olive[1]!)).toBe(295)
    expect(await lotRemaining(p.lots.olive[0]!)).toBe(1_000)
    expect(
      r.body.batch.lots.find((l: { ingredientLotId: number }) => l.ingredientLotId === p.lots.olive[1]),
    ).toMatchObject({
      quantity: 705,
      costCents: 705 * 0.8,
    })
  })

  it('refuses a lot without enough left with 409 lot_insufficient and writes nothing', async () => {
    const p = await makePourable({ oliveLots: [{ receivedOn: '2024-02-01', quantity: 600, costCents: 240 }] })
    const before = await count('SELECT count(*) FROM batches')
    const r = await owner.post('/api/batches', {
      productId: p.productId,
      pourDate: daysAgo(1),
      barsCut: 14,
      barsKeptBack: 2,
      lots: [
        { ingredientLotId: p.lots.olive[0], quantity: 700 },
        { ingredientLotId: p.lots.coconut, quantity: 300 },
        { ingredientLotId: p.lots.lye, quantity: 142 },
        { ingredientLotId: p.lots.water, quantity: 289 },
        { ingredientLotId: p.lots.fragrance, quantity: 30 },
        { ingredientLotId: p.lots.box, quantity: 12 },
      ],
    })
    expect(r.status).toBe(409)
    expect(r.body.error.code).toBe('lot_insufficient')
    expect(r.body.error.details).toEqual([
      expect.objectContaining({
        field: 'lots.0.quantity',
        ingredientLotId: p.lots.olive[0],
        requested: 700,
        remaining: 600,
      }),
    ])
    expect(await count('SELECT count(*) FROM batches')).toBe(before)
    expect(await lotRemaining(p.lots.olive[0]!)).toBe(600)
    expect(await lotRemaining(p.lots.coconut)).toBe(100_000)
  })

  it('refuses with 409 when the oldest-first lots cannot cover the batch, naming each short ingredient', async () => {
    const p = await makePourable({ oliveLots: [{ receivedOn: '2024-02-01', quantity: 600, costCents: 240 }] })
    const r = await owner.post('/api/batches', {
      productId: p.productId,
      pourDate: daysAgo(1),
      barsCut: 14,
      barsKeptBack: 2,
    })
    expect(r.status).toBe(409)
    expect(r.body.error.code).toBe('lot_insufficient')
    expect(r.body.error.details).toEqual([
      expect.objectContaining({
        ingredientId: p.ingredients.olive,
        needed: 700,
        available: 600,
        shortBy: 100,
      }),
    ])
    expect(await count('SELECT count(*) FROM batches WHERE product_id = $1', [p.productId])).toBe(0)
    expect(await lotRemaining(p.lots.coconut)).toBe(100_000)
  })

  it('leaves nothing behind when the last step (the made move) fails', async () => {
    const p = await makePourable()
    await sequelize.query(`
      CREATE OR REPLACE FUNCTION test_fail_made() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN RAISE EXCEPTION 'forced failure on the made move'; END $$;
      CREATE TRIGGER test_fail_made BEFORE INSERT ON stock_moves FOR EACH ROW
        WHEN (NEW.kind = 'made' AND NEW.bars = 11) EXECUTE FUNCTION test_fail_made();`)
    try {
      const before = {
        batches: await count('SELECT count(*) FROM batches'),
        lots: await count('SELECT count(*) FROM batch_lots'),
        audit: await count(`SELECT count(*) FROM audit_events WHERE action = 'batch.recorded'`),
      }
      const r = await allowConsoleError(() =>
        owner.post('/api/batches', {
          productId: p.productId,
          pourDate: daysAgo(1),
          barsCut: 14,
          barsKeptBack: 3,
        }),
      )
      expect(r.status).toBe(500)
      expect(await count('SELECT count(*) FROM batches')).toBe(before.batches)
      expect(await count('SELECT count(*) FROM batch_lots')).toBe(before.lots)
      expect(await count(`SELECT count(*) FROM audit_events WHERE action = 'batch.recorded'`)).toBe(
        before.audit,
      )
      for (const lot of [p.lots.olive[0]!, p.lots.coconut, p.lots.lye, p.lots.box]) {
        const [row] = await sequelize.query<{ q: string; r: string }>(
          'SELECT quantity AS q, remaining AS r FROM ingredient_lots WHERE id = $1',
          {
            bind: [lot],
            type: QueryTypes.SELECT,
          },
        )
        expect(Number(row!.r)).toBe(Number(row!.q))
      }
    } finally {
      await sequelize.query('DROP TRIGGER test_fail_made ON stock_moves; DROP FUNCTION test_fail_made();')
    }
    // With the failure gone the same pour goes through and takes lot number 01.
    const ok = await pour(p, { barsKeptBack: 3 })
    expect(ok.lotCode.endsWith('-01')).toBe(true)
  })

  it('answers 400 with the fields at fault', async () => {
    const p = await makePourable()
    const cases: [Record<string, unknown>, string[]][] = [
      [{}, ['barsCut', 'pourDate', 'productId']],
      [{ productId: p.productId, pourDate: addDays(today, 3), barsCut: 14 }, ['pourDate']],
      [{ productId: p.productId, pourDate: '2026-02-30', barsCut: 14 }, ['pourDate']],
      [{ productId: p.productId, pourDate: daysAgo(1), barsCut: 10, barsKeptBack: 10 }, ['barsKeptBack']],
      [{ productId: p.productId, pourDate: daysAgo(1), barsCut: 10.5 }, ['barsCut']],
      [{ productId: p.productId, pourDate: daysAgo(1), barsCut: 10, oilWeightG: 0 }, ['oilWeightG']],
      [{ productId: p.productId, pourDate: daysAgo(1), barsCut: 10, location: 'x'.repeat(61) }, ['location']],
      [
        {
          productId: p.productId,
          pourDate: daysAgo(1),
          barsCut: 10,
          lots: [
            { ingredientLotId: p.lots.coconut, quantity: 1 },
            { ingredientLotId: p.lots.coconut, quantity: 2 },
          ],
        },
        ['lots.1.ingredientLotId'],
      ],
    ]
    for (const [input, fields] of cases) {
      const r = await owner.post('/api/batches', input)
      expect(r.status, JSON.stringify(input)).toBe(400)
      expect(r.body.error.details.map((d: { field: string }) => d.field).sort()).toEqual(fields)
    }
  })

  it('answers 400 for lots that are not of this recipe, arrived after the pour, or leave an ingredient out', async () => {
    const p = await makePourable()
    const other = await makePourable()
    const late = await makeLot(p.ingredients.olive, { receivedOn: today, quantity: 1000, costCents: 1 })
    const base = { productId: p.productId, pourDate: daysAgo(2), barsCut: 14, barsKeptBack: 2 }
    const all = [
      { ingredientLotId: p.lots.olive[0], quantity: 700 },
      { ingredientLotId: p.lots.coconut, quantity: 300 },
      { ingredientLotId: p.lots.lye, quantity: 142 },
      { ingredientLotId: p.lots.water, quantity: 289 },
      { ingredientLotId: p.lots.fragrance, quantity: 30 },
      { ingredientLotId: p.lots.box, quantity: 12 },
    ]
    const foreign = await owner.post('/api/batches', {
      ...base,
      lots: [...all, { ingredientLotId: other.lots.coconut, quantity: 5 }],
    })
    expect(foreign.status).toBe(400)
    expect(foreign.body.error.details).toEqual([expect.objectContaining({ field: 'lots.6.ingredientLotId' })])
    const after = await owner.post('/api/batches', {
      ...base,
      lots: [...all, { ingredientLotId: late, quantity: 5 }],
    })
    expect(after.status).toBe(400)
    expect(after.body.error.details[0]).toMatchObject({
      field: 'lots.6.ingredientLotId',
      message: expect.stringMatching(/after the pour date/),
    })
    const gap = await owner.post('/api/batches', { ...base, lots: all.slice(1) })
    expect(gap.status).toBe(400)
    expect(gap.body.error.details[0]).toMatchObject({
      field: 'lots',
      message: expect.stringMatching(/Test olive oil/),
    })
    const none = await owner.post('/api/batches', { ...base, productId: 2_000_000 })
    expect(none.status).toBe(400)
    expect(none.body.error.details[0].field).toBe('productId')
    expect(await count('SELECT count(*) FROM batches WHERE product_id = $1', [p.productId])).toBe(0)
  })

  it('refuses a fragrance over its certificate’s maximum with 422 and writes nothing', async () => {
    const p = await makePourable()
    // The recipe uses 3 % of oils; the supplier's IFRA certificate now allows 2 %.
    await sequelize.query('UPDATE ingredients SET max_usage_pct = 2 WHERE id = $1', {
      bind: [p.ingredients.fragrance],
    })
    const r = await owner.post('/api/batches', {
      productId: p.productId,
      pourDate: daysAgo(1),
      barsCut: 14,
      barsKeptBack: 2,
    })
    expect(r.status).toBe(422)
    expect(r.body.error.code).toBe('fragrance_over_max')
    expect(r.body.error.details[0].field).toBe('productId')
    expect(await count('SELECT count(*) FROM batches WHERE product_id = $1', [p.productId])).toBe(0)
  })

  it('is the owner’s: packer and buyer 403, signed out 401', async () => {
    const p = await makePourable()
    const input = { productId: p.productId, pourDate: daysAgo(1), barsCut: 14, barsKeptBack: 2 }
    expect((await packer.post('/api/batches', input)).status).toBe(403)
    expect((await buyer.post('/api/batches', input)).status).toBe(403)
    expect((await anon.post('/api/batches', input)).status).toBe(401)
    expect(await count('SELECT count(*) FROM batches WHERE product_id = $1', [p.productId])).toBe(0)
  })
})

describe('GET /api/batches', () => {
  it('groups by status from the calendar and the ledger, with filters', async () => {
    const p = await makePourable()
    const ready = await pour(p, { pourDate: daysAgo(40) })
    const curing = await pour(p, { pourDate: daysAgo(7) })
    const usedUp = await pour(p, { pourDate: daysAgo(50) })
    await owner
      .post(`/api/batches/${usedUp.id}/moves`, { kind: 'written_off', reason: 'damaged', bars: 12 })
      .then((r) => expect(r.status).toBe(201))

    const r = await owner.get(`/api/batches?productId=${p.productId}`).expect(200)
    const byId = new Map(r.body.items.map((b: { id: number }) => [b.id, b]))
    expect(byId.get(ready.id)).toMatchObject({
      status: 'ready',
      daysLeft: 0,
      progress: 1,
      free: 12,
      onHand: 12,
    })
    expect(byId.get(curing.id)).toMatchObject({ status: 'curing', daysLeft: 21, progress: 0.25 })
    expect(byId.get(usedUp.id)).toMatchObject({ status: 'used_up', free: 0, onHand: 0 })
    expect(r.body.items[0]).toHaveProperty('costPerBarCents')

    const only = async (qs: string) =>
      (await owner.get(`/api/batches?productId=${p.productId}&${qs}`).expect(200)).body.items.map(
        (b: { id: number }) => b.id,
      )
    expect(await only('status=curing')).toEqual([curing.id])
    expect(await only('status=ready')).toEqual([ready.id])
    expect(await only('status=used_up')).toEqual([usedUp.id])
    expect(await only(`pouredFrom=${daysAgo(45)}&pouredTo=${daysAgo(30)}`)).toEqual([ready.id])
  })

  it('shows the packer the same batches without any cost field', async () => {
    const p = await makePourable()
    await pour(p)
    const r = await packer.get(`/api/batches?productId=${p.productId}`).expect(200)
    expect(r.body.items).toHaveLength(1)
    expect(JSON.stringify(r.body)).not.toMatch(/cost/i)
  })

  it('answers 400 for bad filters, 403 to buyers, 401 signed out', async () => {
    const r = await owner.get('/api/batches?status=sold&pouredFrom=2026-13-01')
    expect(r.status).toBe(400)
    expect(r.body.error.details.map((d: { field: string }) => d.field).sort()).toEqual([
      'query.pouredFrom',
      'query.status',
    ])
    const range = await owner.get('/api/batches?pouredFrom=2026-05-01&pouredTo=2026-04-01')
    expect(range.body.error.details[0].field).toBe('query.pouredTo')
    expect((await buyer.get('/api/batches')).status).toBe(403)
    expect((await anon.get('/api/batches')).status).toBe(401)
  })
})

describe('GET /api/batches/:id', () => {
  it('has the consumed lots with supplier and lot code, the ledger with user and reason, and the shops', async () => {
    const p = await makePourable()
    const b = await pour(p, { pourDate: daysAgo(35) })
    await packer.post(`/api/batches/${b.id}/moves`, {
      kind: 'written_off',
      reason: 'sweating',
      bars: 2,
      note: 'Left by the window',
    })
    const shipped = await makeShippedOrder(b.id, p.productId, 6)

    const r = await owner.get(`/api/batches/${b.id}`).expect(200)
    const batch = r.body.batch
    expect(batch.lots).toContainEqual(
      expect.objectContaining({
        ingredientLotId: p.lots.coconut,
        supplier: 'Test Supply Co',
        supplierLotCode: expect.any(String),
        quantity: 300,
      }),
    )
    expect(batch.moves.map((m: { kind: string }) => m.kind)).toEqual([
      'made',
      'written_off',
      'reserved',
      'shipped',
    ])
    expect(batch.moves[1]).toMatchObject({
      reason: 'sweating',
      note: 'Left by the window',
      userName: 'Teo Lindqvist',
      bars: 2,
    })
    expect(batch).toMatchObject({ free: 4, reserved: 0, onHand: 4, status: 'ready' })
    expect(batch.shipments).toEqual([
      {
        shopId: shipped.shopId,
        shopName: shipped.shopName,
        orderId: shipped.orderId,
        orderNumber: shipped.orderNumber,
        bars: 6,
        shippedOn: expect.any(String),
      },
    ])
    expect(batch.recipeSnapshot).toMatchObject({ cureDays: 28 })
  })

  it('gives the packer the batch without costs or the recipe', async () => {
    const p = await makePourable()
    const b = await pour(p)
    const r = await packer.get(`/api/batches/${b.id}`).expect(200)
    expect(r.body.batch.lots).toHaveLength(6)
    expect(JSON.stringify(r.body)).not.toMatch(/cost|recipeSnapshot/i)
  })

  it('answers 404 for an unknown batch, 400 for a bad id, 403 to buyers, 401 signed out', async () => {
    expect((await owner.get('/api/batches/99999999')).status).toBe(404)
    const bad = await owner.get('/api/batches/abc')
    expect(bad.status).toBe(400)
    expect(bad.body.error.details[0].field).toBe('params.id')
    expect((await buyer.get('/api/batches/1')).status).toBe(403)
    expect((await anon.get('/api/batches/1')).status).toBe(401)
  })
})

describe('PATCH /api/batches/:id', () => {
  it('changes the location and notes only', async () => {
    const p = await makePourable()
    const b = await pour(p)
    const r = await owner.patch(`/api/batches/${b.id}`, {
      location: 'Curing rack 3',
      notes: 'Slight ash on top',
      barsCut: 99,
    })
    expect(r.status).toBe(200)
    expect(r.body.batch).toMatchObject({ location: 'Curing rack 3', notes: 'Slight ash on top', barsCut: 14 })
    const cleared = await owner.patch(`/api/batches/${b.id}`, { location: null })
    expect(cleared.body.batch).toMatchObject({ location: null, notes: 'Slight ash on top' })
  })

  it('answers 400 for nothing to change or a long location, 404 unknown, 403 packer and buyer', async () => {
    const p = await makePourable()
    const b = await pour(p)
    const empty = await owner.patch(`/api/batches/${b.id}`, {})
    expect(empty.status).toBe(400)
    const long = await owner.patch(`/api/batches/${b.id}`, { location: 'x'.repeat(61) })
    expect(long.body.error.details[0].field).toBe('location')
    expect((await owner.patch('/api/batches/99999999', { notes: 'x' })).status).toBe(404)
    expect((await packer.patch(`/api/batches/${b.id}`, { notes: 'x' })).status).toBe(403)
    expect((await buyer.patch(`/api/batches/${b.id}`, { notes: 'x' })).status).toBe(403)
  })
})

describe('POST /api/batches/:id/moves', () => {
  it('lets the packer write off bars with a reason and correct a count', async () => {
    const p = await makePourable()
    const b = await pour(p)
    const off = await packer.post(`/api/batches/${b.id}/moves`, {
      kind: 'written_off',
      reason: 'damaged',
      bars: 2,
      note: 'Dropped',
    })
    expect(off.status).toBe(201)
    expect(off.body).toMatchObject({
      move: { kind: 'written_off', bars: 2, freeDelta: -2, reason: 'damaged' },
      stock: { free: 10, reserved: 0, onHand: 10 },
    })
    const up = await owner.post(`/api/batches/${b.id}/moves`, {
      kind: 'adjusted',
      reason: 'recount',
      bars: 1,
    })
    expect(up.body.stock.free).toBe(11)
    const down = await owner.post(`/api/batches/${b.id}/moves`, {
      kind: 'adjusted',
      reason: 'recount',
      bars: -3,
    })
    expect(down.body.stock.free).toBe(8)
  })

  it('never goes below zero: 409 stock_negative on the field bars', async () => {
    const p = await makePourable()
    const b = await pour(p)
    const r = await packer.post(`/api/batches/${b.id}/moves`, {
      kind: 'written_off',
      reason: 'spots',
      bars: 13,
    })
    expect(r.status).toBe(409)
    expect(r.body.error.code).toBe('stock_negative')
    expect(r.body.error.details[0]).toMatchObject({ field: 'bars', free: 12 })
    const recount = await owner.post(`/api/batches/${b.id}/moves`, {
      kind: 'adjusted',
      reason: 'recount',
      bars: -13,
    })
    expect(recount.status).toBe(409)
    expect(await count('SELECT free FROM batch_stock WHERE batch_id = $1', [b.id])).toBe(12)
  })

  it('answers 400 for moves that make no sense, 404 unknown batch, 403 buyer, 401 signed out', async () => {
    const p = await makePourable()
    const b = await pour(p)
    const cases: [Record<string, unknown>, string[]][] = [
      [{}, ['bars', 'kind', 'reason']],
      [{ kind: 'written_off', reason: 'damaged', bars: -2 }, ['bars']],
      [{ kind: 'written_off', reason: 'recount', bars: 2 }, ['reason']],
      [{ kind: 'adjusted', reason: 'recount', bars: 0 }, ['bars']],
      [{ kind: 'adjusted', reason: 'damaged', bars: 2 }, ['reason']],
      [{ kind: 'made', reason: 'damaged', bars: 2 }, ['kind']],
      [{ kind: 'written_off', reason: 'melted', bars: 2 }, ['reason']],
      [{ kind: 'written_off', reason: 'damaged', bars: 1.5 }, ['bars']],
    ]
    for (const [input, fields] of cases) {
      const r = await packer.post(`/api/batches/${b.id}/moves`, input)
      expect(r.status, JSON.stringify(input)).toBe(400)
      expect(r.body.error.details.map((d: { field: string }) => d.field).sort()).toEqual(fields)
    }
    expect(
      (await packer.post('/api/batches/99999999/moves', { kind: 'written_off', reason: 'damaged', bars: 1 }))
        .status,
    ).toBe(404)
    expect(
      (await buyer.post(`/api/batches/${b.id}/moves`, { kind: 'written_off', reason: 'damaged', bars: 1 }))
        .status,
    ).toBe(403)
    expect((await anon.get(`/api/batches/${b.id}`)).status).toBe(401)
    expect(await count('SELECT count(*) FROM stock_moves WHERE batch_id = $1', [b.id])).toBe(1)
  })
})

describe('availability', () => {
  it('counts ready bars from ready batches and the next ready date from curing ones', async () => {
    const p = await makePourable()
    await pour(p, { pourDate: daysAgo(60) }) // ready
    const ready2 = await pour(p, { pourDate: daysAgo(30) }) // ready
    await owner.post(`/api/batches/${ready2.id}/moves`, { kind: 'written_off', reason: 'sample', bars: 5 })
    await pour(p, { pourDate: daysAgo(10) }) // ready in 18 days
    await pour(p, { pourDate: daysAgo(10), barsCut: 14, barsKeptBack: 4 }) // same day: 10 more
    await pour(p, { pourDate: daysAgo(3) }) // later still
    const other = await makePourable()
    const soldOut = await pour(other, { pourDate: daysAgo(40) })
    await owner.post(`/api/batches/${soldOut.id}/moves`, { kind: 'written_off', reason: 'damaged', bars: 12 })
    const never = await makePourable()

    const map = await readyStockByProduct([p.productId, other.productId, never.productId])
    // 12 + (12 − 5) ready; next: 12 + 10 from the two batches ready on the same day.
    expect(map.get(p.productId)).toEqual({
      readyBars: 19,
      nextReady: { date: addDays(daysAgo(10), 28), bars: 22 },
    })
    expect(map.get(other.productId)).toEqual({ readyBars: 0, nextReady: null })
    expect(map.get(never.productId)).toEqual({ readyBars: 0, nextReady: null })
    const everything = await readyStockByProduct()
    expect(everything.get(p.productId)?.readyBars).toBe(19)
    expect(everything.has(never.productId)).toBe(true)
  })

  it('hands out ready batches oldest ready first, locked until the transaction ends', async () => {
    const p = await makePourable()
    const younger = await pour(p, { pourDate: daysAgo(30) })
    const older = await pour(p, { pourDate: daysAgo(50) })
    await pour(p, { pourDate: daysAgo(5) }) // curing: never offered
    const emptied = await pour(p, { pourDate: daysAgo(60) })
    await owner.post(`/api/batches/${emptied.id}/moves`, { kind: 'written_off', reason: 'damaged', bars: 12 })

    await sequelize.transaction(async (t) => {
      const batches = await readyBatchesForUpdate([p.productId], t)
      expect(batches.map((b) => [b.batchId, b.freeBars])).toEqual([
        [older.id, 12],
        [younger.id, 12],
      ])
      expect(batches[0]).toMatchObject({
        productId: p.productId,
        readyDate: addDays(daysAgo(50), 28),
        lotCode: older.lotCode,
      })
      // Another transaction cannot take the same rows meanwhile.
      await expect(
        sequelize.transaction((t2) =>
          sequelize.query('SELECT 1 FROM batch_stock WHERE batch_id = $1 FOR UPDATE NOWAIT', {
            bind: [older.id],
            transaction: t2,
          }),
        ),
      ).rejects.toThrow(/could not obtain lock/)
    })
  })
})

describe('GET /api/trace/ingredient-lots/:lotId', () => {
  it('follows a lot to its batches and the shops that received their bars', async () => {
    const p = await makePourable()
    const a = await pour(p, { pourDate: daysAgo(40) })
    const b = await pour(p, { pourDate: daysAgo(20) })
    const order = await makeShippedOrder(a.id, p.productId, 6)
    const r = await owner.get(`/api/trace/ingredient-lots/${p.lots.coconut}`).expect(200)
    expect(r.body.trace.lot).toMatchObject({ id: p.lots.coconut, batches: 2, remaining: 100_000 - 600 })
    expect(r.body.trace.batches.map((x: { batchId: number }) => x.batchId)).toEqual([a.id, b.id])
    expect(r.body.trace.batches[0].shipments[0]).toMatchObject({ orderNumber: order.orderNumber, bars: 6 })

    const list = await owner
      .get(`/api/trace/ingredient-lots?q=${encodeURIComponent('Test coconut')}`)
      .expect(200)
    expect(list.body.items).toContainEqual(expect.objectContaining({ id: p.lots.coconut, batches: 2 }))
  })

  it('downloads the trace as CSV with every column', async () => {
    const p = await makePourable()
    const a = await pour(p, { pourDate: daysAgo(40) })
    const b = await pour(p, { pourDate: daysAgo(20) })
    const order = await makeShippedOrder(a.id, p.productId, 6)
    const r = await owner.get(`/api/trace/ingredient-lots/${p.lots.fragrance}.csv`).expect(200)
    expect(r.headers['content-type']).toMatch(/^text\/csv/)
    expect(r.headers['content-disposition']).toMatch(
      /^attachment; filename="?trace-lot-\d+-T-[0-9A-F]+\.csv"?$/,
    )
    const rows = parseCsv(r.text).map((x) => x.fields)
    expect(rows[0]).toEqual([
      'lot',
      'ingredient',
      'supplier lot code',
      'batch lot code',
      'pour date',
      'product SKU',
      'shop',
      'order number',
      'bars',
      'ship date',
    ])
    const [lot] = await sequelize.query<{ code: string; name: string }>(
      'SELECT l.supplier_lot_code AS code, i.name FROM ingredient_lots l JOIN ingredients i ON i.id = l.ingredient_id WHERE l.id = $1',
      { bind: [p.lots.fragrance], type: QueryTypes.SELECT },
    )
    expect(rows.slice(1)).toEqual([
      [
        String(p.lots.fragrance),
        lot!.name,
        lot!.code,
        a.lotCode,
        daysAgo(40),
        p.sku,
        order.shopName,
        order.orderNumber,
        '6',
        expect.stringMatching(/^\d{4}-\d{2}-\d{2}$/),
      ],
      [String(p.lots.fragrance), lot!.name, lot!.code, b.lotCode, daysAgo(20), p.sku, '', '', '12', ''],
    ])
  })

  it('is the owner’s: 404 unknown lot, 400 bad id, 403 packer and buyer, 401 signed out', async () => {
    expect((await owner.get('/api/trace/ingredient-lots/99999999')).status).toBe(404)
    expect((await owner.get('/api/trace/ingredient-lots/99999999.csv')).status).toBe(404)
    const bad = await owner.get('/api/trace/ingredient-lots/lot-one')
    expect(bad.status).toBe(400)
    expect(bad.body.error.details[0].field).toBe('params.lotId')
    for (const url of [
      '/api/trace/ingredient-lots',
      '/api/trace/ingredient-lots/1',
      '/api/trace/ingredient-lots/1.csv',
    ]) {
      expect((await packer.get(url)).status).toBe(403)
      expect((await buyer.get(url)).status).toBe(403)
      expect((await anon.get(url)).status).toBe(401)
    }
  })
})

describe('the demo pours (seeders/0005-batches.ts)', () => {
  type Row = {
    id: number
    sku: string
    status: string
    pourDate: string
    readyDate: string
    free: number
    daysLeft: number
    location: string | null
  }
  it('has ready stock for most products, batches curing over the next weeks, and Rose Clay Glow sold out', async () => {
    const items = (await owner.get('/api/batches').expect(200)).body.items as Row[]
    // This seeder's pours (later demo seeders pour more for their orders, on other racks).
    const demo = items.filter((b) => DEMO_POURS.some((p) => p.sku === b.sku && p.location === b.location))
    expect(demo).toHaveLength(DEMO_POURS.length)
    // Every demo product was poured at least once.
    expect(new Set(demo.map((b) => b.sku))).toEqual(new Set(DEMO_PRODUCTS.map((p) => p.sku)))
    const ready = demo.filter((b) => b.status === 'ready')
    expect(new Set(ready.map((b) => b.sku)).size).toBeGreaterThanOrEqual(8)
    for (const b of ready) {
      const age = daysBetween(b.pourDate, today)
      expect(age).toBeGreaterThanOrEqual(40)
      expect(age).toBeLessThanOrEqual(70)
    }
    const curing = demo.filter((b) => b.status === 'curing')
    expect(curing.length).toBeGreaterThanOrEqual(4)
    for (const b of curing) {
      expect(b.daysLeft).toBeGreaterThanOrEqual(1)
      expect(b.daysLeft).toBeLessThanOrEqual(35)
    }

    const ids = await sequelize.query<{ id: number; sku: string }>(
      'SELECT id, sku FROM products WHERE sku = ANY($1::text[])',
      {
        bind: [DEMO_PRODUCTS.map((p) => p.sku)],
        type: QueryTypes.SELECT,
      },
    )
    const stock = await readyStockByProduct(ids.map((p) => p.id))
    const rsc = ids.find((p) => p.sku === 'RSC')!
    expect(stock.get(rsc.id)!.readyBars).toBe(0)
    const next = stock.get(rsc.id)!.nextReady!
    expect(daysBetween(today, next.date)).toBeGreaterThanOrEqual(14)
    expect(daysBetween(today, next.date)).toBeLessThanOrEqual(28)
    const written = demo.find((b) => b.sku === 'RSC' && b.status === 'used_up')!
    const detail = (await owner.get(`/api/batches/${written.id}`).expect(200)).body.batch
    expect(detail.moves.map((m: { kind: string; reason: string | null }) => [m.kind, m.reason])).toEqual([
      ['made', null],
      ['written_off', 'damaged'],
    ])
    expect(detail.createdByName).toBe('Maren Oakes')
  })

  it('keeps every balance equal to the sum of its moves, and drew the lots down by what the batches used', async () => {
    expect(
      await count(`SELECT count(*) FROM batch_stock s
                     LEFT JOIN (SELECT batch_id, SUM(free_delta) AS f, SUM(reserved_delta) AS r FROM stock_moves GROUP BY batch_id) m
                       ON m.batch_id = s.batch_id
                    WHERE s.free <> COALESCE(m.f, 0) OR s.reserved <> COALESCE(m.r, 0)`),
    ).toBe(0)
    expect(
      await count(`SELECT count(*) FROM ingredient_lots l
                    WHERE l.quantity - l.remaining <> (SELECT COALESCE(SUM(quantity), 0) FROM batch_lots bl WHERE bl.ingredient_lot_id = l.id)`),
    ).toBe(0)
  })
})
