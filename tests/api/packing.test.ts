/**
 * The packing bench: the queue, claiming, pick lists (JSON and PDF), packing slips and recording
 * an order as packed. Packers never receive a price or a cost; refused requests write nothing.
 */
import bcrypt from 'bcryptjs'
import { QueryTypes } from 'sequelize'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { clientAs } from '@tests/factories/api-client'
import { binary, expectStatus, keepPdf, pdfText } from '@tests/factories/responses'
import type { ApiClient } from '@tests/factories/api-client'
import {
  allKeys,
  makeOrder,
  makeSellable,
  orderStatus,
  pourMore,
  snapshot,
} from '@tests/factories/fulfilment'
import type { Sellable } from '@tests/factories/fulfilment'

const app = createApp({ pruneSessions: false })
let owner: ApiClient
let packer: ApiClient
let buyer: ApiClient
let anon: ApiClient
let lavender: Sellable
let cedar: Sellable

/** Field names that would carry money or cost; none may reach a packer. */
const PRICE_KEY = /price|cost|cents|margin|tax|amount|^total$|^subtotal$/i

beforeAll(async () => {
  ;[owner, packer, buyer, anon] = await Promise.all([
    clientAs(app, 'owner'),
    clientAs(app, 'packer'),
    clientAs(app, 'buyerA'),
    clientAs(app, 'anon'),
  ])
  lavender = await makeSellable(owner, { bars: 300, location: 'Rack A, shelf 1' })
  cedar = await makeSellable(owner, { bars: 120, location: 'Rack D, bin 4' })
})

describe('GET /api/packing/queue', () => {
  it('lists confirmed and packing orders oldest first with the account and who packs what, and no prices', async () => {
    const placed = await makeOrder({
      shop: 'A',
      lines: [{ productId: lavender.productId, cases: 1 }],
      status: 'placed',
    })
    const first = await makeOrder({
      shop: 'A',
      lines: [{ productId: lavender.productId, cases: 1 }],
      status: 'confirmed',
    })
    const second = await makeOrder({
      shop: 'C',
      lines: [{ productId: cedar.productId, cases: 1 }],
      status: 'packing',
    })
    const packed = await makeOrder({
      shop: 'A',
      lines: [{ productId: lavender.productId, cases: 1 }],
      status: 'packed',
    })

    const r = await packer.get('/api/packing/queue').expect(200)
    const ids = r.body.items.map((i: { orderId: number }) => i.orderId)
    expect(ids).toContain(first.orderId)
    expect(ids).toContain(second.orderId)
    expect(ids).not.toContain(placed.orderId)
    expect(ids.indexOf(first.orderId)).toBeLessThan(ids.indexOf(second.orderId))
    expect(r.body.awaitingShipment.map((i: { orderId: number }) => i.orderId)).toContain(packed.orderId)

    const claimed = r.body.items.find((i: { orderId: number }) => i.orderId === second.orderId)
    expect(claimed).toMatchObject({
      status: 'packing',
      shopName: 'The Quiet Kettle',
      poNumber: second.poNumber,
      cases: 1,
      bars: 6,
      readyToPack: true,
      packer: { name: 'Teo Lindqvist' },
    })
    const open = r.body.items.find((i: { orderId: number }) => i.orderId === first.orderId)
    expect(open).toMatchObject({ status: 'confirmed', shopName: 'Juniper & Vine', packer: null })
    expect([...allKeys(r.body)].filter((k) => PRICE_KEY.test(k))).toEqual([])
  })

  it('is for packers and the owner only', async () => {
    await owner.get('/api/packing/queue').expect(200)
    await buyer.get('/api/packing/queue').expect(403)
    await anon.get('/api/packing/queue').expect(401)
  })
})

describe('POST /api/orders/:id/claim', () => {
  it('moves a confirmed order to packing with the packer on it; claiming it again changes nothing', async () => {
    const o = await makeOrder({
      shop: 'A',
      lines: [{ productId: lavender.productId, cases: 1 }],
      status: 'confirmed',
    })
    const r = expectStatus(await packer.post(`/api/orders/${o.orderId}/claim`, {}), 200)
    expect(r.body.order).toMatchObject({
      id: o.orderId,
      status: 'packing',
      packer: { name: 'Teo Lindqvist' },
    })
    expect([...allKeys(r.body)].filter((k) => PRICE_KEY.test(k))).toEqual([])
    const again = expectStatus(await packer.post(`/api/orders/${o.orderId}/claim`, {}), 200)
    expect(again.body.order.packingStartedAt).toBe(r.body.order.packingStartedAt)
  })

  it('answers 409 with who has it when someone else claimed the order; the owner may take it over', async () => {
    const o = await makeOrder({
      shop: 'C',
      lines: [{ productId: lavender.productId, cases: 1 }],
      status: 'packing',
    })
    const r = expectStatus(await owner.post(`/api/orders/${o.orderId}/claim`, {}), 409)
    expect(r.body.error.code).toBe('already_claimed')
    expect(r.body.error.message).toMatch(/Teo Lindqvist is packing/)
    expect(r.body.error.details[0]).toMatchObject({ packerName: 'Teo Lindqvist' })

    expectStatus(await packer.post(`/api/orders/${o.orderId}/claim`, { takeOver: true }), 403)
    const taken = expectStatus(await owner.post(`/api/orders/${o.orderId}/claim`, { takeOver: true }), 200)
    expect(taken.body.order.packer.name).toBe('Maren Oakes')
  })

  it('refuses an order that is not confirmed (409 invalid_transition) and writes nothing', async () => {
    const o = await makeOrder({
      shop: 'A',
      lines: [{ productId: lavender.productId, cases: 1 }],
      status: 'placed',
    })
    const before = await snapshot([lavender.batchId])
    const r = expectStatus(await packer.post(`/api/orders/${o.orderId}/claim`, {}), 409)
    expect(r.body.error).toMatchObject({ code: 'invalid_transition' })
    expect(r.body.error.details[0]).toMatchObject({ field: 'status', status: 'placed' })
    expect(await orderStatus(o.orderId)).toBe('placed')
    expect(await snapshot([lavender.batchId])).toEqual(before)
  })

  it('checks its input and its callers', async () => {
    const o = await makeOrder({
      shop: 'A',
      lines: [{ productId: lavender.productId, cases: 1 }],
      status: 'confirmed',
    })
    const bad = expectStatus(await packer.post('/api/orders/abc/claim', {}), 400)
    expect(bad.body.error.details[0].field).toBe('params.id')
    const badBody = expectStatus(
      await packer.post(`/api/orders/${o.orderId}/claim`, { takeOver: 'yes' }),
      400,
    )
    expect(badBody.body.error.details[0].field).toBe('takeOver')
    expectStatus(await packer.post('/api/orders/99999999/claim', {}), 404)
    expectStatus(await buyer.post(`/api/orders/${o.orderId}/claim`, {}), 403)
    expectStatus(await anon.post(`/api/orders/${o.orderId}/claim`, {}), 401)
    expect(await orderStatus(o.orderId)).toBe('confirmed')
  })
})

describe('GET /api/pick-list and /api/pick-list.pdf', () => {
  it('lists the bars to pull per product and per lot, oldest first as allocated, with locations and no prices', async () => {
    // A product whose first batch cannot cover the order alone: the order draws from two lots.
    const rose = await makeSellable(owner, { bars: 12, location: 'Rack E, shelf 3' })
    const later = await pourMore(owner, rose.productId, 30, 35, 'Rack F, shelf 1')
    const a = await makeOrder({
      shop: 'A',
      lines: [{ productId: rose.productId, cases: 3 }],
      status: 'confirmed',
    })
    const b = await makeOrder({
      shop: 'C',
      lines: [
        { productId: rose.productId, cases: 1 },
        { productId: cedar.productId, cases: 2 },
      ],
      status: 'packing',
    })
    const r = await packer.get(`/api/pick-list?orders=${a.orderId},${b.orderId}`).expect(200)
    expect(r.body.orders.map((o: { number: string }) => o.number)).toEqual([a.number, b.number])
    const roseRow = r.body.products.find((p: { sku: string }) => p.sku === rose.sku)
    expect(roseRow).toMatchObject({ bars: 24, cases: 4 })
    // 18 bars for order a: 12 from the older lot, 6 from the later one; order b's 6 from the later lot.
    expect(roseRow.lots).toEqual([
      expect.objectContaining({
        lotCode: rose.lotCode,
        location: 'Rack E, shelf 3',
        bars: 12,
        orders: [{ orderId: a.orderId, number: a.number, bars: 12 }],
      }),
      expect.objectContaining({
        lotCode: later.lotCode,
        location: 'Rack F, shelf 1',
        bars: 12,
        orders: [
          { orderId: a.orderId, number: a.number, bars: 6 },
          { orderId: b.orderId, number: b.number, bars: 6 },
        ],
      }),
    ])
    expect(r.body.products.find((p: { sku: string }) => p.sku === cedar.sku)).toMatchObject({
      bars: 12,
      cases: 2,
    })
    expect(r.body).toMatchObject({ totalBars: 36, totalCases: 6 })
    expect([...allKeys(r.body)].filter((k) => PRICE_KEY.test(k))).toEqual([])

    const pdf = await packer
      .get(`/api/pick-list.pdf?orders=${a.orderId},${b.orderId}`)
      .buffer(true)
      .parse(binary)
      .expect(200)
    expect(pdf.headers['content-type']).toMatch(/^application\/pdf/)
    keepPdf('pick-list.pdf', pdf.body as Buffer)
    const text = await pdfText(pdf.body as Buffer)
    for (const s of [
      a.number,
      b.number,
      rose.sku,
      rose.lotCode,
      later.lotCode,
      'Rack E, shelf 3',
      'Rack F, shelf 1',
      cedar.lotCode,
    ]) {
      expect(text).toContain(s)
    }
    expect(text).not.toMatch(/\$\s?\d/)
  })

  it('walks the shelves: by location (numbers by value), then SKU, then the older lot; no location last', async () => {
    const far = await makeSellable(owner, { bars: 60, location: 'Rack 10, shelf 1' })
    const near = await makeSellable(owner, { bars: 60, location: 'Rack 2, shelf 1' })
    const twoLots = await makeSellable(owner, { bars: 12, location: 'Rack 2, shelf 1' })
    const younger = await pourMore(owner, twoLots.productId, 30, 35, 'Rack 2, shelf 1')
    const nowhere = await makeSellable(owner, { bars: 60, location: 'Rack 1' })
    await sequelize.query('UPDATE batches SET location = NULL WHERE id = $1', { bind: [nowhere.batchId] })
    const o = await makeOrder({
      shop: 'A',
      lines: [
        { productId: nowhere.productId, cases: 1 },
        { productId: far.productId, cases: 1 },
        { productId: twoLots.productId, cases: 3 },
        { productId: near.productId, cases: 1 },
      ],
      status: 'confirmed',
    })
    const r = expectStatus(await packer.get(`/api/pick-list?orders=${o.orderId}`), 200)
    const stops = r.body.stops as { location: string | null; sku: string; lotCode: string; bars: number }[]
    expect(stops.map((x) => x.location)).toEqual([
      'Rack 2, shelf 1',
      'Rack 2, shelf 1',
      'Rack 2, shelf 1',
      'Rack 10, shelf 1',
      null,
    ])
    // On one shelf by SKU; the product with two lots there lists the older one (12 bars) first.
    const shelf = stops.slice(0, 3)
    const skus = shelf.map((x) => x.sku)
    expect(skus).toEqual([...skus].sort((a, b) => a.localeCompare(b, 'en', { numeric: true })))
    const both = shelf.filter((x) => x.sku === twoLots.sku)
    expect(both.map((x) => [x.lotCode, x.bars])).toEqual([
      [twoLots.lotCode, 12],
      [younger.lotCode, 6],
    ])
    expect(stops.slice(3).map((x) => x.lotCode)).toEqual([far.lotCode, nowhere.lotCode])
    // Every lot of the per-product view stands once on the walk.
    expect(r.body.stops).toHaveLength(
      r.body.products.reduce((n: number, p: { lots: unknown[] }) => n + p.lots.length, 0),
    )

    // The PDF lists the lots in the same order.
    const pdf = await packer
      .get(`/api/pick-list.pdf?orders=${o.orderId}`)
      .buffer(true)
      .parse(binary)
      .expect(200)
    keepPdf('pick-list-walk.pdf', pdf.body as Buffer)
    const text = await pdfText(pdf.body as Buffer)
    const at = stops.map((x) => text.indexOf(x.lotCode))
    expect(at.every((i) => i >= 0)).toBe(true)
    expect(at).toEqual([...at].sort((a, b) => a - b))
    expect(text).toContain('No location set')
    expect(text.indexOf('Rack 2, shelf 1')).toBeLessThan(text.indexOf('Rack 10, shelf 1'))
  })

  it('refuses malformed, unknown and unpickable orders', async () => {
    const shipped = await makeOrder({
      shop: 'A',
      lines: [{ productId: lavender.productId, cases: 1 }],
      status: 'shipped',
      notify: false,
    })
    const placed = await makeOrder({
      shop: 'A',
      lines: [{ productId: lavender.productId, cases: 1 }],
      status: 'placed',
    })
    const missing = await packer.get('/api/pick-list').expect(400)
    expect(missing.body.error.details[0].field).toBe('query.orders')
    expect((await packer.get('/api/pick-list?orders=1,abc').expect(400)).body.error.details[0].field).toMatch(
      /^query\.orders/,
    )
    expect(
      (await packer.get(`/api/pick-list?orders=${placed.orderId},${placed.orderId}`).expect(400)).body.error
        .details[0].field,
    ).toBe('query.orders')
    expect((await packer.get('/api/pick-list?orders=99999998').expect(404)).body.error.details[0].field).toBe(
      'orders',
    )
    const wrong = await packer.get(`/api/pick-list?orders=${shipped.orderId},${placed.orderId}`).expect(409)
    expect(wrong.body.error.code).toBe('not_pickable')
    expect(wrong.body.error.details).toHaveLength(2)
    await packer.get(`/api/pick-list.pdf?orders=${placed.orderId}`).expect(409)
    await buyer.get(`/api/pick-list?orders=${placed.orderId}`).expect(403)
    await anon.get(`/api/pick-list.pdf?orders=${placed.orderId}`).expect(401)
  })
})

describe('GET /api/orders/:id/packing-slip.pdf', () => {
  it('is a PDF with the studio, ship-to, order and PO numbers, lines, lots with bars, cartons, and no prices', async () => {
    const o = await makeOrder({
      shop: 'A',
      lines: [
        { productId: lavender.productId, cases: 2 },
        { productId: cedar.productId, cases: 1 },
      ],
      status: 'packed',
      poNumber: 'JV-SLIP-0042',
    })
    for (const who of [packer, owner]) {
      const r = await who
        .get(`/api/orders/${o.orderId}/packing-slip.pdf`)
        .buffer(true)
        .parse(binary)
        .expect(200)
      expect(r.headers['content-type']).toMatch(/^application\/pdf/)
      keepPdf('packing-slip.pdf', r.body as Buffer)
      const text = await pdfText(r.body as Buffer)
      for (const s of [
        'Brindlewick Soapery',
        'Packing slip',
        o.number,
        'JV-SLIP-0042',
        'Juniper & Vine',
        '220 Orchard Street',
        'Fairhaven, MA 02719',
        lavender.sku,
        cedar.sku,
        lavender.lotCode,
        cedar.lotCode,
        'Cartons',
      ]) {
        expect(text).toContain(s)
      }
      expect(text).toMatch(new RegExp(`${lavender.lotCode}\\s+× 12`))
      expect(text).not.toMatch(/\$\s?\d/)
      expect(text).not.toMatch(/price|subtotal|total\s+\$/i)
    }
  })

  it('answers 404 for unknown orders and for a packer asking for a placed one; 401/403 otherwise', async () => {
    const placed = await makeOrder({
      shop: 'A',
      lines: [{ productId: lavender.productId, cases: 1 }],
      status: 'placed',
    })
    await packer.get('/api/orders/99999997/packing-slip.pdf').expect(404)
    await packer.get(`/api/orders/${placed.orderId}/packing-slip.pdf`).expect(404)
    await owner.get(`/api/orders/${placed.orderId}/packing-slip.pdf`).expect(200)
    await packer.get('/api/orders/x/packing-slip.pdf').expect(400)
    await buyer.get(`/api/orders/${placed.orderId}/packing-slip.pdf`).expect(403)
    await anon.get(`/api/orders/${placed.orderId}/packing-slip.pdf`).expect(401)
  })
})

describe('POST /api/orders/:id/packed', () => {
  async function claimed() {
    const o = await makeOrder({
      shop: 'A',
      lines: [
        { productId: lavender.productId, cases: 1 },
        { productId: cedar.productId, cases: 1 },
      ],
      status: 'packing',
    })
    const view = await packer.get(`/api/packing/orders/${o.orderId}`).expect(200)
    return {
      o,
      lines: view.body.order.lines as { orderLineId: number; bars: number; allocatedBars: number }[],
    }
  }

  it('records the cartons, the weight and the bars that match the allocations', async () => {
    const { o, lines } = await claimed()
    const r = expectStatus(
      await packer.post(`/api/orders/${o.orderId}/packed`, {
        cartons: 2,
        weightG: 1840,
        lines: lines.map((l) => ({ orderLineId: l.orderLineId, bars: l.allocatedBars })),
      }),
      200,
    )
    expect(r.body.order).toMatchObject({ status: 'packed', cartons: 2, packedWeightG: 1840 })
    expect(r.body.order.packedAt).toBeTruthy()
    expect([...allKeys(r.body)].filter((k) => PRICE_KEY.test(k))).toEqual([])
  })

  it('answers 422 packed_mismatch naming every line at fault, and writes nothing', async () => {
    const { o, lines } = await claimed()
    const before = await snapshot([lavender.batchId, cedar.batchId])
    const r = expectStatus(
      await packer.post(`/api/orders/${o.orderId}/packed`, {
        cartons: 1,
        weightG: 900,
        lines: [
          { orderLineId: lines[0]!.orderLineId, bars: 5 },
          { orderLineId: 2147483000, bars: 6 },
        ],
      }),
      422,
    )
    expect(r.body.error.code).toBe('packed_mismatch')
    expect(r.body.error.details).toEqual([
      expect.objectContaining({
        field: 'lines.0.bars',
        orderLineId: lines[0]!.orderLineId,
        expectedBars: 6,
        packedBars: 5,
      }),
      expect.objectContaining({ field: 'lines.1.orderLineId', orderLineId: 2147483000 }),
      expect.objectContaining({
        field: 'lines',
        orderLineId: lines[1]!.orderLineId,
        expectedBars: 6,
        packedBars: null,
      }),
    ])
    expect(await orderStatus(o.orderId)).toBe('packing')
    expect(await snapshot([lavender.batchId, cedar.batchId])).toEqual(before)
    const [row] = await sequelize.query<{ cartons: number | null }>(
      'SELECT cartons FROM orders WHERE id = $1',
      {
        bind: [o.orderId],
        type: QueryTypes.SELECT,
      },
    )
    expect(row!.cartons).toBeNull()
  })

  it('refuses an order that is not being packed (409 invalid_transition)', async () => {
    const o = await makeOrder({
      shop: 'A',
      lines: [{ productId: lavender.productId, cases: 1 }],
      status: 'confirmed',
    })
    const view = await packer.get(`/api/packing/orders/${o.orderId}`).expect(200)
    const r = expectStatus(
      await packer.post(`/api/orders/${o.orderId}/packed`, {
        cartons: 1,
        weightG: 700,
        lines: view.body.order.lines.map((l: { orderLineId: number; bars: number }) => ({
          orderLineId: l.orderLineId,
          bars: l.bars,
        })),
      }),
      409,
    )
    expect(r.body.error.code).toBe('invalid_transition')
    expect(await orderStatus(o.orderId)).toBe('confirmed')
  })

  it('lets only the packer who claimed it (or the owner) record it', async () => {
    const { o, lines } = await claimed()
    const hash = await bcrypt.hash('second-packer-2026', 4)
    await sequelize.query(
      `INSERT INTO users (email, name, role, password_hash) VALUES ('ines.packer@brindlewick.test', 'Ines Mora', 'packer', $1)
       ON CONFLICT DO NOTHING`,
      { bind: [hash] },
    )
    const other = await clientAs(app, 'anon')
    await other.login('ines.packer@brindlewick.test', 'second-packer-2026')
    const body = {
      cartons: 1,
      weightG: 1000,
      lines: lines.map((l) => ({ orderLineId: l.orderLineId, bars: l.allocatedBars })),
    }
    const r = expectStatus(await other.post(`/api/orders/${o.orderId}/packed`, body), 409)
    expect(r.body.error).toMatchObject({ code: 'already_claimed' })
    expect(await orderStatus(o.orderId)).toBe('packing')
    expectStatus(await owner.post(`/api/orders/${o.orderId}/packed`, body), 200)
  })

  it('checks its input (400 with the field) and its callers', async () => {
    const { o, lines } = await claimed()
    const cases = [
      [{ cartons: 0, weightG: 100, lines: [{ orderLineId: lines[0]!.orderLineId, bars: 6 }] }, 'cartons'],
      [{ cartons: 1, weightG: -5, lines: [{ orderLineId: lines[0]!.orderLineId, bars: 6 }] }, 'weightG'],
      [{ cartons: 1, weightG: 100, lines: [] }, 'lines'],
      [
        { cartons: 1, weightG: 100, lines: [{ orderLineId: lines[0]!.orderLineId, bars: -1 }] },
        'lines.0.bars',
      ],
      [
        {
          cartons: 1,
          weightG: 100,
          lines: [
            { orderLineId: lines[0]!.orderLineId, bars: 6 },
            { orderLineId: lines[0]!.orderLineId, bars: 6 },
          ],
        },
        'lines.1.orderLineId',
      ],
    ] as const
    for (const [body, field] of cases) {
      const r = expectStatus(await packer.post(`/api/orders/${o.orderId}/packed`, body), 400)
      expect(r.body.error.details.map((d: { field: string }) => d.field)).toContain(field)
    }
    expectStatus(await buyer.post(`/api/orders/${o.orderId}/packed`, {}), 403)
    expectStatus(await anon.post(`/api/orders/${o.orderId}/packed`, {}), 401)
    expect(await orderStatus(o.orderId)).toBe('packing')
  })
})

describe('GET /api/packing/orders/:id', () => {
  it('shows the lines with their lots and locations and the ship-to, never a price', async () => {
    const o = await makeOrder({
      shop: 'C',
      lines: [{ productId: cedar.productId, cases: 1 }],
      status: 'confirmed',
    })
    const r = await packer.get(`/api/packing/orders/${o.orderId}`).expect(200)
    expect(r.body.order).toMatchObject({
      number: o.number,
      status: 'confirmed',
      shipTo: {
        name: 'The Quiet Kettle',
        lines: expect.arrayContaining(['4100 Commerce Park Dr', 'Ridgeview, NY 12601']),
      },
      readyToPack: true,
    })
    expect(r.body.order.lines[0]).toMatchObject({
      sku: cedar.sku,
      bars: 6,
      lots: [{ lotCode: cedar.lotCode, location: 'Rack D, bin 4', bars: 6 }],
    })
    expect([...allKeys(r.body)].filter((k) => PRICE_KEY.test(k))).toEqual([])
    await buyer.get(`/api/packing/orders/${o.orderId}`).expect(403)
    await anon.get(`/api/packing/orders/${o.orderId}`).expect(401)
    await packer.get('/api/packing/orders/99999996').expect(404)
  })
})
