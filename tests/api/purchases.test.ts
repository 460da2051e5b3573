import { randomBytes } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import { beforeAll, describe, expect, it, vi } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import type { ApiClient } from '@tests/factories/api-client'
import { clientAs } from '@tests/factories/api-client'
import { addDays, isoToday } from '@shared/domain/dates/dates'
import { toCsv } from '@shared/domain/csv/csv'
import type { ImportPreview, IngredientRow, PurchaseDetail, PurchaseRow } from '@shared/schemas/ingredients'

const app = createApp({ pruneSessions: false })

let owner: ApiClient
let packer: ApiClient
let buyer: ApiClient
let anon: ApiClient

beforeAll(async () => {
  ;[owner, packer, buyer, anon] = await Promise.all([
    clientAs(app, 'owner'),
    clientAs(app, 'packer'),
    clientAs(app, 'buyerB'),
    clientAs(app, 'anon'),
  ])
})

const tag = () => randomBytes(3).toString('hex')
const lotCount = async () => {
  const [r] = await sequelize.query<{ n: number }>('SELECT count(*)::int AS n FROM ingredient_lots', {
    type: QueryTypes.SELECT,
  })
  return r!.n
}
const fields = (body: { error: { details?: { field: string }[] } }) =>
  (body.error.details ?? []).map((d) => d.field)
const today = isoToday()

async function ingredient(kind: string, extra: Record<string, unknown> = {}) {
  const r = await owner.post('/api/ingredients', {
    name: `${kind} ${tag()}`,
    kind,
    ...(kind === 'oil' ? { sapKoh: 190 } : {}),
    ...extra,
  })
  expect(r.status).toBe(201)
  return r.body.ingredient as IngredientRow
}

function purchaseBody(ingredientId: number, extra: Record<string, unknown> = {}) {
  return {
    ingredientId,
    supplier: 'Greenfield Oil Traders',
    supplierLotCode: `GOT-${tag()}`,
    receivedOn: '2026-11-02',
    quantity: 20,
    unit: 'kg',
    costCents: 16800,
    freightCents: 1200,
    ...extra,
  }
}

async function record(ingredientId: number, extra: Record<string, unknown> = {}) {
  const r = await owner.post('/api/purchases', purchaseBody(ingredientId, extra))
  expect(r.status).toBe(201)
  return r.body.purchase as PurchaseRow
}

/** A poured batch that used `grams` of the lot, written as the batches module would. */
async function useInBatch(lotId: number, grams: number) {
  const t = tag().toUpperCase()
  const q = async (sql: string, bind: unknown[]) =>
    (await sequelize.query<{ id: number }>(sql, { bind, type: QueryTypes.SELECT }))[0]!.id
  const recipe = await q(
    `INSERT INTO recipes (name, superfat_pct, water_mode, lye_concentration_pct, bar_weight_g, bars_per_mould, mould_oil_weight_g)
     VALUES ($1, 5, 'concentration', 33, 130, 12, 1100) RETURNING id`,
    [`Trace recipe ${t}`],
  )
  const product = await q(
    `INSERT INTO products (sku, name, recipe_id, net_weight_g, cut_weight_g, case_pack, msrp_cents)
     VALUES ($1, $2, $3, 113, 130, 12, 1000) RETURNING id`,
    [`TR${t}`, `Trace bar ${t}`, recipe],
  )
  const batch = await q(
    `INSERT INTO batches (product_id, recipe_id, recipe_snapshot, lot_code, pour_date, cure_days, ready_date, oil_weight_g, bars_cut)
     VALUES ($1, $2, '{}', $3, '2026-11-10', 28, '2026-12-08', 1100, 12) RETURNING id`,
    [product, recipe, `TR-${t}`],
  )
  await sequelize.query(
    'INSERT INTO batch_lots (batch_id, ingredient_lot_id, quantity, cost_cents) VALUES ($1, $2, $3, 0)',
    {
      bind: [batch, lotId, grams],
    },
  )
  await sequelize.query('UPDATE ingredient_lots SET remaining = remaining - $2 WHERE id = $1', {
    bind: [lotId, grams],
  })
  return { batchId: batch, lotCode: `TR-${t}`, productName: `Trace bar ${t}` }
}

const routes: [method: 'get' | 'post' | 'patch', url: string, body?: unknown][] = [
  ['get', '/api/purchases'],
  [
    'post',
    '/api/purchases',
    { ingredientId: 1, supplier: 'X', receivedOn: '2026-11-01', quantity: 1, unit: 'kg', costCents: 100 },
  ],
  ['get', '/api/purchases/1'],
  ['patch', '/api/purchases/1', { supplier: 'Y' }],
  [
    'post',
    '/api/purchases/import/preview',
    { csv: 'ingredient,supplier,received_on,quantity,unit,cost\r\nOlive oil,X,2026-11-01,1,kg,1.00' },
  ],
  [
    'post',
    '/api/purchases/import/confirm',
    { csv: 'ingredient,supplier,received_on,quantity,unit,cost\r\nOlive oil,X,2026-11-01,1,kg,1.00' },
  ],
]

describe('who may use /api/purchases', () => {
  it.each(routes)('%s %s answers 401 when signed out', async (method, url, body) => {
    const before = await lotCount()
    const r = method === 'get' ? await anon.get(url) : await anon[method](url, body)
    expect(r.status).toBe(401)
    expect(await lotCount()).toBe(before)
  })

  it.each(routes)('%s %s answers 403 to the packer and to a shop buyer', async (method, url, body) => {
    const before = await lotCount()
    for (const who of [packer, buyer]) {
      const r = method === 'get' ? await who.get(url) : await who[method](url, body)
      expect(r.status).toBe(403)
      expect(r.body.error.code).toBe('forbidden')
    }
    expect(await lotCount()).toBe(before)
  })
})

describe('POST /api/purchases', () => {
  it('records a purchase in pounds, storing what was entered and the grams (NIST Handbook 44 App. C)', async () => {
    const shea = await ingredient('oil')
    const r = await owner.post(
      '/api/purchases',
      purchaseBody(shea.id, { quantity: 11, unit: 'lb', costCents: 6450, freightCents: 550 }),
    )
    expect(r.status).toBe(201)
    const p = r.body.purchase as PurchaseRow
    // 11 lb × 453.59237 g = 4989.51607 g, stored to 0.1 mg
    expect(p).toMatchObject({
      ingredientId: shea.id,
      ingredientName: shea.name,
      enteredQuantity: 11,
      enteredUnit: 'lb',
      unit: 'g',
      costCents: 6450,
      freightCents: 550,
      totalCents: 7000,
      inUse: false,
    })
    expect(p.quantity).toBeCloseTo(4989.5161, 4)
    expect(p.remaining).toBe(p.quantity)
    // (6450 + 550) ¢ ÷ 4989.5161 g = 1.402940… ¢/g (hand calculation)
    expect(p.unitCost).toBeCloseTo(7000 / 4989.5161, 10)
    const after = (await owner.get(`/api/ingredients/${shea.id}`).expect(200)).body
      .ingredient as IngredientRow
    expect(after.onHand).toBeCloseTo(4989.5161, 4)
    expect(after.currentUnitCost).toBeCloseTo(7000 / 4989.5161, 10)
  })

  it.each([
    // 16 oz = 1 lb = 453.59237 g exactly (NIST Handbook 44 App. C)
    ['oz', 16, 453.59237],
    ['kg', 2.5, 2500],
    ['g', 500, 500],
  ] as const)('converts %s to grams (NIST Handbook 44 App. C; SI)', async (unit, quantity, grams) => {
    const oil = await ingredient('fragrance')
    const p = await record(oil.id, { unit, quantity, costCents: 2000, freightCents: 0 })
    expect(p.quantity).toBeCloseTo(grams, 4)
    expect(p.unitCost).toBeCloseTo(2000 / grams, 6)
  })

  it('records packaging in items with a fractional-cent unit cost (hand calculation)', async () => {
    const labels = await ingredient('packaging')
    const p = await record(labels.id, { quantity: 2000, unit: 'each', costCents: 5000, freightCents: 0 })
    expect(p).toMatchObject({ unit: 'each', quantity: 2000, remaining: 2000, enteredUnit: 'each' })
    expect(p.unitCost).toBeCloseTo(2.5, 10)
  })

  it('accepts a purchase received today', async () => {
    const oil = await ingredient('oil')
    const p = await record(oil.id, { receivedOn: today, freightCents: undefined })
    expect(p).toMatchObject({ receivedOn: today, freightCents: 0 })
  })

  it.each<[string, Record<string, unknown>, string]>([
    ['a negative quantity', { quantity: -5 }, 'quantity'],
    ['a zero quantity', { quantity: 0 }, 'quantity'],
    ['a quantity that is not a number', { quantity: 'twenty' }, 'quantity'],
    ['a quantity with four decimals', { quantity: 1.2345 }, 'quantity'],
    ['an unknown unit', { unit: 'stone' }, 'unit'],
    ['a date in the future', { receivedOn: addDays(today, 3) }, 'receivedOn'],
    ['a date that does not exist', { receivedOn: '2026-02-30' }, 'receivedOn'],
    ['a date in another format', { receivedOn: '11/02/2026' }, 'receivedOn'],
    ['a negative cost', { costCents: -1 }, 'costCents'],
    ['a cost in fractions of a cent', { costCents: 12.5 }, 'costCents'],
    ['a cost sent as text', { costCents: '168.00' }, 'costCents'],
    ['a negative freight', { freightCents: -100 }, 'freightCents'],
    ['no supplier', { supplier: ' ' }, 'supplier'],
    ['a lot code over 60 characters', { supplierLotCode: 'L'.repeat(61) }, 'supplierLotCode'],
    ['no ingredient', { ingredientId: null }, 'ingredientId'],
  ])('answers 400 to %s, naming %s, and writes nothing', async (_label, extra, field) => {
    const oil = await ingredient('oil')
    const before = await lotCount()
    const r = await owner.post('/api/purchases', purchaseBody(oil.id, extra))
    expect(r.status).toBe(400)
    expect(r.body.error.code).toBe('invalid_input')
    expect(fields(r.body)).toEqual([field])
    expect(await lotCount()).toBe(before)
  })

  it.each<[string, string, Record<string, unknown>, string]>([
    ['"each" for an oil', 'oil', { unit: 'each', quantity: 3 }, 'unit'],
    ['"kg" for packaging', 'packaging', { unit: 'kg' }, 'unit'],
    ['half a box', 'packaging', { unit: 'each', quantity: 10.5 }, 'quantity'],
  ])('answers 400 to %s, naming %s, and writes nothing', async (_label, kind, extra, field) => {
    const item = await ingredient(kind)
    const before = await lotCount()
    const r = await owner.post('/api/purchases', purchaseBody(item.id, extra))
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual([field])
    expect(await lotCount()).toBe(before)
  })

  it('answers 400 on ingredientId for an unknown or archived ingredient', async () => {
    const oil = await ingredient('oil')
    await owner.post(`/api/ingredients/${oil.id}/archive`).then((r) => expect(r.status).toBe(200))
    const before = await lotCount()
    for (const id of [999999, oil.id]) {
      const r = await owner.post('/api/purchases', purchaseBody(id))
      expect(r.status).toBe(400)
      expect(fields(r.body)).toEqual(['ingredientId'])
    }
    expect(await lotCount()).toBe(before)
  })

  it('answers 400 on supplierLotCode to the same delivery recorded twice', async () => {
    const oil = await ingredient('oil')
    const first = await record(oil.id)
    const before = await lotCount()
    const r = await owner.post(
      '/api/purchases',
      purchaseBody(oil.id, { supplierLotCode: first.supplierLotCode!.toLowerCase() }),
    )
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['supplierLotCode'])
    expect(await lotCount()).toBe(before)
    // the same supplier lot delivered on another day is a new purchase
    await record(oil.id, { supplierLotCode: first.supplierLotCode, receivedOn: '2026-11-20' })
  })
})

describe('GET /api/purchases', () => {
  it('lists lots with ingredient name, quantity, unit cost and remaining, newest first', async () => {
    const r = await owner.get('/api/purchases').expect(200)
    const items = r.body.items as PurchaseRow[]
    expect(items.length).toBeGreaterThanOrEqual(22)
    const dates = items.map((p) => p.receivedOn)
    expect([...dates].sort().reverse()).toEqual(dates)
    const box = items.find((p) => p.supplierLotCode === 'FP-KB-26-09')!
    expect(box).toMatchObject({
      ingredientName: 'Kraft bar box',
      enteredQuantity: 1000,
      enteredUnit: 'each',
      quantity: 1000,
      unit: 'each',
    })
    expect(box.unitCost).toBeCloseTo(21, 10)
  })

  it('filters by ingredient and by received date', async () => {
    const oil = await ingredient('oil')
    const a = await record(oil.id, { receivedOn: '2026-09-10' })
    const b = await record(oil.id, { receivedOn: '2026-10-10' })
    const mine = (await owner.get(`/api/purchases?ingredientId=${oil.id}`).expect(200)).body
      .items as PurchaseRow[]
    expect(mine.map((p) => p.id)).toEqual([b.id, a.id])
    const october = (
      await owner.get(`/api/purchases?ingredientId=${oil.id}&from=2026-10-01&to=2026-10-31`).expect(200)
    ).body.items as PurchaseRow[]
    expect(october.map((p) => p.id)).toEqual([b.id])
    const all = (await owner.get('/api/purchases?from=2026-09-10&to=2026-09-10').expect(200)).body
      .items as PurchaseRow[]
    expect(all.every((p) => p.receivedOn === '2026-09-10')).toBe(true)
    expect(all.some((p) => p.id === a.id)).toBe(true)
  })

  it.each([
    ['?from=2026-11-01&to=2026-10-01', 'query.to'],
    ['?from=yesterday', 'query.from'],
    ['?ingredientId=olive', 'query.ingredientId'],
  ])('answers 400 to %s with the field %s', async (qs, field) => {
    const r = await owner.get(`/api/purchases${qs}`)
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual([field])
  })
})

describe('GET /api/purchases/:id', () => {
  it('gives the lot with the batches that used it', async () => {
    const oil = await ingredient('oil')
    const lot = await record(oil.id)
    let r = await owner.get(`/api/purchases/${lot.id}`).expect(200)
    expect((r.body.purchase as PurchaseDetail).batches).toEqual([])
    const batch = await useInBatch(lot.id, 770)
    r = await owner.get(`/api/purchases/${lot.id}`).expect(200)
    const p = r.body.purchase as PurchaseDetail
    expect(p.inUse).toBe(true)
    expect(p.remaining).toBeCloseTo(20000 - 770, 6)
    expect(p.batches).toEqual([
      {
        batchId: batch.batchId,
        lotCode: batch.lotCode,
        pourDate: '2026-11-10',
        productName: batch.productName,
        quantity: 770,
        costCents: 0,
      },
    ])
  })

  it('answers 404 to an unknown id and 400 to a bad one', async () => {
    expect((await owner.get('/api/purchases/999999')).status).toBe(404)
    const r = await owner.get('/api/purchases/-3')
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['params.id'])
  })
})

describe('PATCH /api/purchases/:id', () => {
  it('corrects an unused purchase and recomputes the grams and remaining', async () => {
    const oil = await ingredient('oil')
    const lot = await record(oil.id)
    const r = await owner.patch(`/api/purchases/${lot.id}`, {
      quantity: 44,
      unit: 'lb',
      costCents: 17000,
      supplier: 'Northway Soap Supply',
    })
    expect(r.status).toBe(200)
    const p = r.body.purchase as PurchaseRow
    // 44 lb × 453.59237 = 19958.06428 g (NIST Handbook 44 App. C)
    expect(p).toMatchObject({
      enteredQuantity: 44,
      enteredUnit: 'lb',
      supplier: 'Northway Soap Supply',
      costCents: 17000,
      freightCents: 1200,
    })
    expect(p.quantity).toBeCloseTo(19958.0643, 4)
    expect(p.remaining).toBe(p.quantity)
  })

  it('moves an unused purchase to another ingredient when the unit fits it', async () => {
    const oil = await ingredient('oil')
    const box = await ingredient('packaging')
    const lot = await record(oil.id)
    const bad = await owner.patch(`/api/purchases/${lot.id}`, { ingredientId: box.id })
    expect(bad.status).toBe(400)
    expect(fields(bad.body)).toEqual(['unit'])
    const ok = await owner.patch(`/api/purchases/${lot.id}`, {
      ingredientId: box.id,
      unit: 'each',
      quantity: 500,
    })
    expect(ok.status).toBe(200)
    expect(ok.body.purchase).toMatchObject({ ingredientId: box.id, unit: 'each', quantity: 500 })
  })

  it('answers 409 lot_in_use once part of it went into a batch, and changes nothing', async () => {
    const oil = await ingredient('oil')
    const lot = await record(oil.id)
    await useInBatch(lot.id, 1000)
    const r = await owner.patch(`/api/purchases/${lot.id}`, { costCents: 1 })
    expect(r.status).toBe(409)
    expect(r.body.error.code).toBe('lot_in_use')
    expect((await owner.get(`/api/purchases/${lot.id}`)).body.purchase.costCents).toBe(16800)
  })

  it.each<[string, Record<string, unknown>, string]>([
    ['a negative quantity', { quantity: -1 }, 'quantity'],
    ['a future date', { receivedOn: addDays(today, 1) }, 'receivedOn'],
    ['"each" for an oil', { unit: 'each' }, 'unit'],
    ['an unknown unit', { unit: 'gallon' }, 'unit'],
    ['nothing to change', {}, '(body)'],
  ])('answers 400 to %s, naming %s, and changes nothing', async (_label, patch, field) => {
    const oil = await ingredient('oil')
    const lot = await record(oil.id)
    const r = await owner.patch(`/api/purchases/${lot.id}`, patch)
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual([field])
    const after = (await owner.get(`/api/purchases/${lot.id}`)).body.purchase as PurchaseRow
    expect(after).toMatchObject({ enteredQuantity: 20, enteredUnit: 'kg', receivedOn: '2026-11-02' })
  })

  it('answers 404 to an unknown id', async () => {
    expect((await owner.patch('/api/purchases/999999', { supplier: 'X' })).status).toBe(404)
  })
})

describe('CSV import', () => {
  const HEADER = ['ingredient', 'supplier', 'lot_code', 'received_on', 'quantity', 'unit', 'cost', 'freight']
  async function names() {
    const oil = await ingredient('oil')
    const box = await ingredient('packaging')
    return { oil, box }
  }

  it('previews rows with quoted commas, CRLF and a header in any case, writing nothing', async () => {
    const { oil, box } = await names()
    const csv = toCsv([
      HEADER.map((h) => h.toUpperCase()),
      [
        oil.name.toUpperCase(),
        'Greenfield Oil Traders, Ltd.',
        `A-${tag()}`,
        '2026-10-20',
        '1,000',
        'lb',
        '$1,234.56',
        '40',
      ],
      [box.name, 'Foldline "Packaging"', '', '2026-10-21', '500', 'EACH', '105.00', ''],
    ])
    expect(csv).toContain('"Greenfield Oil Traders, Ltd."')
    expect(csv).toContain('\r\n')
    const before = await lotCount()
    const r = await owner.post('/api/purchases/import/preview', { csv })
    expect(r.status).toBe(200)
    const preview = r.body as ImportPreview
    expect(preview).toMatchObject({ validCount: 2, errorCount: 0 })
    expect(preview.rows.map((row) => row.line)).toEqual([2, 3])
    expect(preview.rows[0]!.values).toMatchObject({
      supplier: 'Greenfield Oil Traders, Ltd.',
      cost: '$1,234.56',
      quantity: '1,000',
    })
    expect(preview.rows[1]!.values.supplier).toBe('Foldline "Packaging"')
    expect(preview.rows.every((row) => row.errors.length === 0)).toBe(true)
    expect(await lotCount()).toBe(before)
  })

  it('takes the CSV as an uploaded file too', async () => {
    const { oil } = await names()
    const csv = `ingredient,supplier,received_on,quantity,unit,cost\n${oil.name},Northway,2026-10-01,2,kg,12.00\n`
    const token = await owner.token()
    const r = await owner.agent
      .post('/api/purchases/import/preview')
      .set('X-CSRF-Token', token)
      .attach('file', Buffer.from(`\uFEFF${csv}`, 'utf8'), {
        filename: 'purchases.csv',
        contentType: 'text/csv',
      })
    expect(r.status).toBe(200)
    expect(r.body).toMatchObject({ validCount: 1, errorCount: 0 })
  })

  it.each([
    [
      'a wrong header',
      'ingredient,vendor,received_on,quantity,unit,price\r\nOlive oil,X,2026-10-01,1,kg,1',
      /missing supplier, cost; unknown “vendor”, “price”/,
    ],
    [
      'a repeated column',
      'ingredient,supplier,received_on,quantity,unit,cost,cost\r\nOlive oil,X,2026-10-01,1,kg,1,1',
      /repeated cost/,
    ],
    ['no CSV text at all', '', /Choose a CSV file/],
    ['a header and no rows', 'ingredient,supplier,received_on,quantity,unit,cost\r\n', /no purchases/],
    [
      'a quote left open',
      'ingredient,supplier,received_on,quantity,unit,cost\r\n"Olive oil,X,2026-10-01,1,kg,1',
      /Line 2: a quoted field is not closed/,
    ],
  ])(
    'answers 400 on field file to %s, for preview and confirm, writing nothing',
    async (_label, csv, message) => {
      const before = await lotCount()
      for (const step of ['preview', 'confirm']) {
        const r = await owner.post(`/api/purchases/import/${step}`, { csv })
        expect(r.status).toBe(400)
        expect(fields(r.body)).toEqual(['file'])
        expect(r.body.error.details[0].message).toMatch(message)
      }
      expect(await lotCount()).toBe(before)
    },
  )

  it.each([
    ['a spreadsheet workbook', Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0, 0, 0]), /spreadsheet workbook/],
    ['a PDF', Buffer.from('%PDF-1.4\n%âãÏÓ\n', 'latin1'), /a PDF/],
    ['text that is not UTF-8', Buffer.from([0x69, 0x6e, 0x67, 0x72, 0xe9, 0x0a]), /not UTF-8/],
    ['an empty file', Buffer.alloc(0), /The file is empty/],
    ['a file of blank lines', Buffer.from('\r\n\r\n'), /The CSV is empty/],
  ])(
    'answers 400 on field file to %s uploaded as CSV (sniffed from the bytes)',
    async (_label, bytes, message) => {
      const token = await owner.token()
      const r = await owner.agent
        .post('/api/purchases/import/preview')
        .set('X-CSRF-Token', token)
        .attach('file', bytes, { filename: 'purchases.csv', contentType: 'text/csv' })
      expect(r.status).toBe(400)
      expect(fields(r.body)).toEqual(['file'])
      expect(r.body.error.details[0].message).toMatch(message)
    },
  )

  it('answers 413 to a file over 1 MB and 400 on file to a request with no CSV', async () => {
    const token = await owner.token()
    const big = await owner.agent
      .post('/api/purchases/import/preview')
      .set('X-CSRF-Token', token)
      .attach('file', Buffer.alloc(1024 * 1024 + 1, 0x61), { filename: 'big.csv', contentType: 'text/csv' })
    expect(big.status).toBe(413)
    expect(fields(big.body)).toEqual(['file'])
    const none = await owner.post('/api/purchases/import/preview', {})
    expect(none.status).toBe(400)
    expect(fields(none.body)).toEqual(['file'])
    const huge = await owner.post('/api/purchases/import/preview', { csv: 'a'.repeat(1024 * 1024 + 1) })
    expect(huge.status).toBe(400)
    expect(fields(huge.body)).toEqual(['csv'])
  })

  it('marks every bad value with its row and column in the preview', async () => {
    const { oil, box } = await names()
    const csv = toCsv([
      HEADER,
      [oil.name, 'Greenfield', 'L-1', '2026-10-01', 'twenty', 'kg', '12.00', ''],
      [oil.name, 'Greenfield', 'L-2', '2026-10-01', '-5', 'kg', '-12.00', '1.234'],
      [oil.name, 'Greenfield', 'L-3', addDays(today, 5), '2', 'stone', '12', ''],
      [box.name, 'Foldline', 'L-4', '2026-10-01', '2', 'kg', '12', ''],
      [oil.name, 'Greenfield', 'L-5', '2026-10-01', '3', 'each', '12', ''],
      ['Moon dust', '', 'L-6', '2026-13-01', '1', 'g', '', ''],
      [oil.name, 'Greenfield', 'L-7', '2026-10-01', '3', 'kg', '30.00', '2.00'],
    ])
    const before = await lotCount()
    const r = await owner.post('/api/purchases/import/preview', { csv })
    expect(r.status).toBe(200)
    const preview = r.body as ImportPreview
    const byLine = Object.fromEntries(preview.rows.map((row) => [row.line, row.errors.map((e) => e.field)]))
    expect(byLine).toEqual({
      2: ['quantity'],
      3: ['quantity', 'cost', 'freight'],
      4: ['received_on', 'unit'],
      5: ['unit'],
      6: ['unit'],
      7: ['ingredient', 'supplier', 'received_on', 'cost'],
      8: [],
    })
    expect(preview).toMatchObject({ validCount: 1, errorCount: 6 })
    expect(preview.rows[5]!.errors[0]!.message).toMatch(/No active ingredient is named “Moon dust”/)
    expect(await lotCount()).toBe(before)
  })

  it('flags a row whose values do not match the header, and the same delivery twice in one file', async () => {
    const { oil } = await names()
    const csv = toCsv([
      HEADER,
      [oil.name, 'Greenfield', 'DUP-1', '2026-10-01', '3', 'kg', '30.00', '0'],
      [oil.name, 'Greenfield', 'DUP-1', '2026-10-01', '3', 'kg', '30.00', '0'],
      [oil.name, 'Greenfield', 'X-2', '2026-10-01', '3', 'kg', '30.00'],
    ])
    const preview = (await owner.post('/api/purchases/import/preview', { csv })).body as ImportPreview
    expect(preview.rows.map((row) => row.errors.map((e) => e.field))).toEqual([[], ['lot_code'], ['line']])
  })

  it('checks a whole file against recorded purchases in one query, naming each duplicate', async () => {
    const { oil } = await names()
    const recorded: number[] = []
    for (const code of ['REC-1', 'REC-2']) {
      const r = await owner.post(
        '/api/purchases',
        purchaseBody(oil.id, { supplierLotCode: code, receivedOn: '2026-10-05' }),
      )
      expect(r.status).toBe(201)
      recorded.push(r.body.purchase.id)
    }
    const rows = Array.from({ length: 40 }, (_, i) => [
      oil.name,
      // Case aside, the same delivery.
      i === 7 ? 'greenfield oil traders' : 'Greenfield Oil Traders',
      i === 7 ? 'rec-1' : i === 21 ? 'REC-2' : `NEW-${i}`,
      '2026-10-05',
      '3',
      'kg',
      '30.00',
      '',
    ])
    // Recorded and again within the file: the recorded purchase is named.
    rows.push([oil.name, 'Greenfield Oil Traders', 'REC-2', '2026-10-05', '3', 'kg', '30.00', ''])
    const csv = toCsv([HEADER, ...rows])
    const queries: string[] = []
    const query = sequelize.query.bind(sequelize)
    const spy = vi.spyOn(sequelize, 'query').mockImplementation(((sql: unknown, ...rest: unknown[]) => {
      queries.push(String(sql))
      return (query as (...a: unknown[]) => unknown)(sql, ...rest)
    }) as typeof sequelize.query)
    let preview: ImportPreview
    try {
      preview = (await owner.post('/api/purchases/import/preview', { csv })).body as ImportPreview
    } finally {
      spy.mockRestore()
    }
    expect(queries.filter((q) => q.includes('ingredient_lots'))).toHaveLength(1)
    const flagged = preview.rows.filter((r) => r.errors.length > 0)
    expect(flagged.map((r) => [r.line, r.errors])).toEqual([
      [9, [{ field: 'lot_code', message: expect.stringContaining(`purchase #${recorded[0]}:`) }]],
      [23, [{ field: 'lot_code', message: expect.stringContaining(`purchase #${recorded[1]}:`) }]],
      [42, [{ field: 'lot_code', message: expect.stringContaining(`purchase #${recorded[1]}:`) }]],
    ])
    expect(preview).toMatchObject({ validCount: 38, errorCount: 3 })
  })

  it('confirms a good file in one go and the rows appear in the list', async () => {
    const { oil, box } = await names()
    const code = `IMP-${tag()}`
    const csv = toCsv([
      HEADER,
      [oil.name, 'Greenfield Oil Traders', code, '2026-10-20', '20', 'kg', '168.00', '12.00'],
      [oil.name, 'Greenfield Oil Traders', `${code}-B`, '2026-10-25', '11', 'lb', '64.50', ''],
      [box.name, 'Foldline Packaging', '', '2026-10-21', '1000', 'each', '210.00', ''],
    ])
    const before = await lotCount()
    const r = await owner.post('/api/purchases/import/confirm', { csv })
    expect(r.status).toBe(201)
    expect(r.body.count).toBe(3)
    expect(await lotCount()).toBe(before + 3)
    const listed = (await owner.get(`/api/purchases?ingredientId=${oil.id}`).expect(200)).body
      .items as PurchaseRow[]
    expect(listed.map((p) => p.supplierLotCode)).toEqual([`${code}-B`, code])
    // (16800 + 1200) ¢ ÷ 20 000 g = 0.9 ¢/g; 11 lb = 4989.51607 g (NIST Handbook 44 App. C)
    expect(listed[1]!.unitCost).toBeCloseTo(0.9, 10)
    expect(listed[0]!.quantity).toBeCloseTo(4989.5161, 4)
    const boxes = (await owner.get(`/api/purchases?ingredientId=${box.id}`).expect(200)).body
      .items as PurchaseRow[]
    expect(boxes[0]).toMatchObject({ quantity: 1000, unit: 'each', costCents: 21000 })
    // importing the same file again is caught as the same deliveries
    const again = await owner.post('/api/purchases/import/confirm', { csv })
    expect(again.status).toBe(422)
    expect(await lotCount()).toBe(before + 3)
  })

  it('refuses a file with one bad row with 422 import_invalid, writing none of its rows', async () => {
    const { oil } = await names()
    const csv = toCsv([
      HEADER,
      [oil.name, 'Greenfield', `OK-${tag()}`, '2026-10-01', '5', 'kg', '40.00', ''],
      [oil.name, 'Greenfield', `OK-${tag()}`, '2026-10-02', '5', 'kg', '40.00', ''],
      [oil.name, 'Greenfield', `BAD-${tag()}`, '2026-10-03', '5', 'kg', 'forty', ''],
    ])
    const before = await lotCount()
    const r = await owner.post('/api/purchases/import/confirm', { csv })
    expect(r.status).toBe(422)
    expect(r.body.error.code).toBe('import_invalid')
    expect(r.body.error.details).toEqual([
      { line: 4, field: 'cost', message: expect.stringContaining('“forty” is not an amount') },
    ])
    expect(await lotCount()).toBe(before)
    expect((await owner.get(`/api/purchases?ingredientId=${oil.id}`)).body.items).toEqual([])
  })
})
