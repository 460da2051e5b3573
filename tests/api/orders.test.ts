/**
 * Case orders against cured stock: placing (the DESIGN.md contract), idempotency, stock and the
 * ledger, minimums, tax, pre-orders, the list and detail per role, the order's life (confirm,
 * cancel, line edits), reorder, the CSV export and the order e-mails. Every route: success, 400
 * with the field at fault, 401, 403 for a wrong role, 404 for another shop's order.
 */
import { randomUUID } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import { beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { updateSettings } from '@server/modules/settings/settings.service'
import { drainMail } from '@server/modules/invoices/mail-queue'
import { allocateDuePreorders } from '@server/modules/orders/preorders.service'
import { clientAs } from '@tests/factories/api-client'
import type { ApiClient } from '@tests/factories/api-client'
import { allMail, waitForMail } from '@tests/factories/mail'
import {
  addBatch,
  balances,
  makeProduct,
  resetShop,
  setMinimums,
  shopId,
  studioDay,
  SHOP_OF,
} from '@tests/factories/orders'

const app = createApp({ pruneSessions: false })

let owner: ApiClient
let packer: ApiClient
let buyerA: ApiClient
let buyerB: ApiClient
let buyerC: ApiClient
let anon: ApiClient

type Order = {
  id: number
  number: string
  status: string
  shopId: number
  lines: {
    id: number
    productId: number
    cases: number
    bars: number
    unitPriceCents: number
    lineTotalCents: number
    preorder: boolean
    promisedDate: string | null
    allocations: { batchId: number; lotCode: string; bars: number }[]
  }[]
  subtotalCents: number
  shippingCents: number
  taxCents: number
  totalCents: number
  taxExempt: boolean
}

const key = () => ({ 'Idempotency-Key': randomUUID() })

async function rows<T>(sql: string, bind: unknown[] = []) {
  return sequelize.query<T & object>(sql, { bind, type: QueryTypes.SELECT }) as Promise<T[]>
}

function fields(r: { body: { error?: { details?: { field: string }[] } } }) {
  return (r.body.error?.details ?? []).map((d) => d.field)
}

/** Places an order as a buyer and insists on 201. */
async function place(
  c: ApiClient,
  lines: { productId: number; cases: number; preorder?: boolean }[],
  extra: Record<string, unknown> = {},
): Promise<Order> {
  const r = await c.post('/api/orders', { lines, ...extra }, key())
  if (r.status !== 201) throw new Error(`placing answered ${r.status}: ${JSON.stringify(r.body)}`)
  return r.body.order as Order
}

/** A product with one 60-bar ready batch (10 cases of 6), priced 700/650/600 at the three tiers. */
const plenty = () => makeProduct({ batches: [{ readyInDays: -10, bars: 60 }] })

beforeAll(async () => {
  ;[owner, packer, buyerA, buyerB, buyerC, anon] = await Promise.all([
    clientAs(app, 'owner'),
    clientAs(app, 'packer'),
    clientAs(app, 'buyerA'),
    clientAs(app, 'buyerB'),
    clientAs(app, 'buyerC'),
    clientAs(app, 'anon'),
  ])
})

beforeEach(async () => {
  await setMinimums(0, 0)
  await updateSettings({ taxRatePct: 0, autoConfirmGoodStanding: false })
  for (const who of ['buyerA', 'buyerB', 'buyerC'] as const) await resetShop(who)
})

describe('POST /api/orders', () => {
  it('places an order: frozen prices, oldest ready batch first, one reserved move per allocation (201)', async () => {
    const p = await makeProduct({
      prices: {
        Preferred: [
          [1, 650],
          [5, 610],
        ],
      },
      batches: [
        { readyInDays: -3, bars: 24 },
        { readyInDays: -30, bars: 18 },
        { readyInDays: 8, bars: 60 },
      ],
    })
    const [newer, older, curing] = p.batchIds
    const r = await buyerA.post(
      '/api/orders',
      {
        lines: [{ productId: p.productId, cases: 5 }],
        poNumber: ' JV-2291 ',
        note: 'Before the fair, please.',
      },
      key(),
    )
    expect(r.status).toBe(201)
    const order = r.body.order
    expect(order).toMatchObject({
      number: expect.stringMatching(/^O\d{2}-\d{5}$/),
      status: 'placed',
      shopId: await shopId('buyerA'),
      poNumber: 'JV-2291',
      note: 'Before the fair, please.',
      // 5 cases × 6 = 30 bars at the 5-case break of 610 (hand calculation)
      subtotalCents: 18300,
      taxCents: 0,
      taxExempt: true,
    })
    expect(order.lines).toEqual([
      expect.objectContaining({
        productId: p.productId,
        sku: p.sku,
        cases: 5,
        bars: 30,
        unitPriceCents: 610,
        lineTotalCents: 18300,
      }),
    ])
    expect(order.totalCents).toBe(order.subtotalCents + order.shippingCents + order.taxCents)
    // 18 bars from the batch ready 30 days ago, then 12 from the one ready 3 days ago; none curing.
    expect(
      order.lines[0].allocations.map((a: { batchId: number; bars: number }) => [a.batchId, a.bars]),
    ).toEqual([
      [older, 18],
      [newer, 12],
    ])
    const moves = await rows<{
      batch_id: number
      kind: string
      bars: number
      free_delta: number
      reserved_delta: number
      order_id: number
      order_line_id: number
      user_id: number
    }>(
      'SELECT batch_id, kind, bars, free_delta, reserved_delta, order_id, order_line_id, user_id FROM stock_moves WHERE order_id = $1 ORDER BY id',
      [order.id],
    )
    const [buyerUser] = await rows<{ id: number }>('SELECT id FROM users WHERE email = $1', [
      SHOP_OF.buyerA.buyer.email,
    ])
    expect(moves).toEqual([
      {
        batch_id: older,
        kind: 'reserved',
        bars: 18,
        free_delta: -18,
        reserved_delta: 18,
        order_id: order.id,
        order_line_id: order.lines[0].id,
        user_id: buyerUser!.id,
      },
      {
        batch_id: newer,
        kind: 'reserved',
        bars: 12,
        free_delta: -12,
        reserved_delta: 12,
        order_id: order.id,
        order_line_id: order.lines[0].id,
        user_id: buyerUser!.id,
      },
    ])
    const stock = await balances([newer!, older!, curing!])
    expect(stock.map((s) => [s.free, s.reserved])).toEqual([
      [12, 12],
      [0, 18],
      [60, 0],
    ])
    for (const s of stock) expect([s.free, s.reserved]).toEqual([s.movesFree, s.movesReserved])
  })

  it('numbers orders from the yearly sequence, one after another', async () => {
    const p = await plenty()
    const a = await place(buyerA, [{ productId: p.productId, cases: 1 }])
    const b = await place(buyerB, [{ productId: p.productId, cases: 1 }])
    const seq = (n: string) => Number(n.split('-')[1])
    expect(seq(b.number)).toBe(seq(a.number) + 1)
    const [row] = await rows<{ last: number }>('SELECT last FROM order_sequences WHERE year = $1', [
      Number(`20${a.number.slice(1, 3)}`),
    ])
    expect(row!.last).toBe(seq(b.number))
  })

  it('clears the ordered products from the cart and leaves the rest', async () => {
    const ordered = await plenty()
    const waiting = await plenty()
    await buyerA.put(`/api/cart/lines/${ordered.productId}`, { cases: 2 })
    await buyerA.put(`/api/cart/lines/${waiting.productId}`, { cases: 1 })
    await place(buyerA, [{ productId: ordered.productId, cases: 2 }])
    const cart = await buyerA.get('/api/cart').expect(200)
    expect(cart.body.cart.lines.map((l: { productId: number }) => l.productId)).toEqual([waiting.productId])
  })

  it('marks the opening order and applies the opening minimum, then the reorder minimum', async () => {
    await setMinimums(10000, 5000)
    const id = await resetShop('buyerC', { openingOrderDone: false })
    const p = await makeProduct({
      prices: { Distributor: [[1, 500]] },
      batches: [{ readyInDays: -5, bars: 120 }],
    })
    // 3 cases × 6 × 500 = 9 000 < 10 000 opening minimum (hand calculation)
    const low = await buyerC.post('/api/orders', { lines: [{ productId: p.productId, cases: 3 }] }, key())
    expect(low.status).toBe(422)
    expect(low.body.error.code).toBe('below_minimum')
    expect(low.body.error.details).toMatchObject({
      minimumCents: 10000,
      subtotalCents: 9000,
      belowMinimumByCents: 1000,
    })
    const first = await place(buyerC, [{ productId: p.productId, cases: 4 }])
    expect(first).toMatchObject({ isOpeningOrder: true, subtotalCents: 12000 })
    const [shop] = await rows<{ opening_order_done: boolean }>(
      'SELECT opening_order_done FROM shops WHERE id = $1',
      [id],
    )
    expect(shop!.opening_order_done).toBe(true)
    // Now the 5 000 reorder minimum: 2 cases = 6 000 passes (hand calculation)
    const second = await place(buyerC, [{ productId: p.productId, cases: 2 }])
    expect(second).toMatchObject({ isOpeningOrder: false, subtotalCents: 6000 })
    const tooSmall = await buyerC.post(
      '/api/orders',
      { lines: [{ productId: p.productId, cases: 1 }] },
      key(),
    )
    expect(tooSmall.body.error.details).toMatchObject({ minimumCents: 5000, subtotalCents: 3000 })
  })

  it('charges tax without a valid certificate, and none with one (common practice: resale exemption)', async () => {
    await updateSettings({ taxRatePct: 8.875 })
    const p = await plenty()
    // buyerB (Standard, no certificate): 2 cases × 6 × 700 = 8 400; 8.875 % = 745.5 → 746 (half up)
    const taxed = await place(buyerB, [{ productId: p.productId, cases: 2 }])
    expect(taxed).toMatchObject({ subtotalCents: 8400, taxCents: 746, taxExempt: false })
    // buyerA has a certificate on file until 2027-06-30
    const exempt = await place(buyerA, [{ productId: p.productId, cases: 2 }])
    expect(exempt).toMatchObject({ taxCents: 0, taxExempt: true })
    // An expired certificate exempts nothing.
    const a = await shopId('buyerA')
    const [was] = await rows<{ certificate_expires_on: string }>(
      'SELECT certificate_expires_on FROM shops WHERE id = $1',
      [a],
    )
    await sequelize.query('UPDATE shops SET certificate_expires_on = $2 WHERE id = $1', {
      bind: [a, await studioDay(-1)],
    })
    try {
      const expired = await place(buyerA, [{ productId: p.productId, cases: 2 }])
      // Preferred 650 × 12 = 7 800; 8.875 % = 692.25 → 692
      expect(expired).toMatchObject({ subtotalCents: 7800, taxCents: 692, taxExempt: false })
    } finally {
      await sequelize.query('UPDATE shops SET certificate_expires_on = $2 WHERE id = $1', {
        bind: [a, was!.certificate_expires_on],
      })
    }
  })

  it('charges shipping by the weight band of the order (settings bands, inclusive upper bound)', async () => {
    await updateSettings({
      shippingBands: [
        { maxWeightG: 3600, rateCents: 1100 },
        { maxWeightG: null, rateCents: 2500 },
      ],
    })
    try {
      const p = await makeProduct({ casePack: 6, netWeightG: 100, batches: [{ readyInDays: -4, bars: 120 }] })
      // 6 cases × 6 × 100 g = 3 600 g: the first band exactly (product rule: a band includes its max)
      expect((await place(buyerB, [{ productId: p.productId, cases: 6 }])).shippingCents).toBe(1100)
      expect((await place(buyerB, [{ productId: p.productId, cases: 7 }])).shippingCents).toBe(2500)
    } finally {
      await updateSettings({
        shippingBands: [
          { maxWeightG: 5000, rateCents: 1500 },
          { maxWeightG: 15000, rateCents: 2800 },
          { maxWeightG: 30000, rateCents: 4500 },
          { maxWeightG: null, rateCents: 6500 },
        ],
      })
    }
  })

  it('refuses what ready stock cannot cover with the shortfall per product (409), writing nothing', async () => {
    const short = await makeProduct({
      batches: [
        { readyInDays: -2, bars: 14 },
        { readyInDays: 5, bars: 100 },
      ],
    })
    const fine = await plenty()
    const before = await balances([...short.batchIds, ...fine.batchIds])
    const [{ n: ordersBefore }] = (await rows<{ n: number }>('SELECT count(*)::int AS n FROM orders')) as [
      { n: number },
    ]
    const r = await buyerA.post(
      '/api/orders',
      {
        lines: [
          { productId: fine.productId, cases: 1 },
          { productId: short.productId, cases: 3 },
        ],
      },
      key(),
    )
    expect(r.status).toBe(409)
    expect(r.body.error.code).toBe('insufficient_stock')
    // 3 cases × 6 = 18 bars asked; 14 ready (the curing 100 do not count)
    expect(r.body.error.details).toEqual([{ productId: short.productId, requestedBars: 18, readyBars: 14 }])
    expect(await balances([...short.batchIds, ...fine.batchIds])).toEqual(before)
    const [{ n: ordersAfter }] = (await rows<{ n: number }>('SELECT count(*)::int AS n FROM orders')) as [
      { n: number },
    ]
    expect(ordersAfter).toBe(ordersBefore)
  })

  it('answers 400 with the field for every bad line, and nothing is written', async () => {
    const p = await plenty()
    const inactive = await makeProduct({ active: false, batches: [{ readyInDays: -2, bars: 60 }] })
    const otherTier = await makeProduct({
      prices: { Standard: [[1, 700]] },
      batches: [{ readyInDays: -2, bars: 60 }],
    })
    const cases: [string, unknown, string[]][] = [
      ['no lines', { lines: [] }, ['lines']],
      ['whole cases only', { lines: [{ productId: p.productId, cases: 1.5 }] }, ['lines.0.cases']],
      ['zero cases', { lines: [{ productId: p.productId, cases: 0 }] }, ['lines.0.cases']],
      ['cases as text', { lines: [{ productId: p.productId, cases: '2' }] }, ['lines.0.cases']],
      [
        'a product twice',
        {
          lines: [
            { productId: p.productId, cases: 1 },
            { productId: p.productId, cases: 2 },
          ],
        },
        ['lines.1.productId'],
      ],
      [
        'a PO over 40 characters',
        { lines: [{ productId: p.productId, cases: 1 }], poNumber: 'P'.repeat(41) },
        ['poNumber'],
      ],
      ['an unknown product', { lines: [{ productId: 99999999, cases: 1 }] }, ['lines.0.productId']],
      [
        'an inactive product',
        {
          lines: [
            { productId: p.productId, cases: 1 },
            { productId: inactive.productId, cases: 1 },
          ],
        },
        ['lines.1.productId'],
      ],
      [
        'a product not priced at the shop’s tier',
        { lines: [{ productId: otherTier.productId, cases: 1 }] },
        ['lines.0.productId'],
      ],
      [
        'a past ship date',
        { lines: [{ productId: p.productId, cases: 1 }], requestedShipDate: '2020-01-01' },
        ['requestedShipDate'],
      ],
    ]
    const before = await balances(p.batchIds)
    for (const [what, body, expected] of cases) {
      const r = await buyerA.post('/api/orders', body, key())
      expect(r.status, what).toBe(400)
      expect(r.body.error.code, what).toBe('invalid_input')
      expect(fields(r), what).toEqual(expected)
    }
    const dup = await buyerA.post(
      '/api/orders',
      {
        lines: [
          { productId: p.productId, cases: 1 },
          { productId: p.productId, cases: 2 },
        ],
      },
      key(),
    )
    expect(dup.body.error.details[0].message).toMatch(/duplicate/)
    expect(await balances(p.batchIds)).toEqual(before)
  })

  it('requires the Idempotency-Key header (400 on the header field)', async () => {
    const p = await plenty()
    const r = await buyerA.post('/api/orders', { lines: [{ productId: p.productId, cases: 1 }] })
    expect(r.status).toBe(400)
    expect(fields(r)).toEqual(['Idempotency-Key'])
    const long = await buyerA.post(
      '/api/orders',
      { lines: [{ productId: p.productId, cases: 1 }] },
      { 'Idempotency-Key': 'k'.repeat(201) },
    )
    expect(fields(long)).toEqual(['Idempotency-Key'])
  })

  it('answers the same order again for the same key and body (200), refuses the key with another body (422)', async () => {
    const p = await plenty()
    const headers = key()
    const body = { lines: [{ productId: p.productId, cases: 2 }], poNumber: 'SAME-1' }
    const first = await buyerA.post('/api/orders', body, headers)
    expect(first.status).toBe(201)
    const stock = await balances(p.batchIds)
    const again = await buyerA.post('/api/orders', body, headers)
    expect(again.status).toBe(200)
    expect(again.body.order.id).toBe(first.body.order.id)
    expect(again.body.order.number).toBe(first.body.order.number)
    expect(await balances(p.batchIds)).toEqual(stock)
    const other = await buyerA.post(
      '/api/orders',
      { ...body, lines: [{ productId: p.productId, cases: 3 }] },
      headers,
    )
    expect(other.status).toBe(422)
    expect(other.body.error.code).toBe('idempotency_key_reused')
    // A key belongs to its shop: another shop may use the same one.
    expect((await buyerB.post('/api/orders', body, headers)).status).toBe(201)
  })

  it('refuses a shop that is not orderable (422 account_on_hold)', async () => {
    const p = await plenty()
    await resetShop('buyerB', { status: 'on_hold' })
    try {
      const r = await buyerB.post('/api/orders', { lines: [{ productId: p.productId, cases: 1 }] }, key())
      expect(r.status).toBe(422)
      expect(r.body.error.code).toBe('account_on_hold')
      expect((await buyerB.get('/api/cart')).body.cart).toMatchObject({
        accountOrderable: false,
        canPlace: false,
      })
    } finally {
      await resetShop('buyerB')
    }
  })

  it('answers 401 signed out and 403 to the packer and the owner', async () => {
    const p = await plenty()
    const body = { lines: [{ productId: p.productId, cases: 1 }] }
    expect((await anon.post('/api/orders', body, key())).status).toBe(401)
    expect((await packer.post('/api/orders', body, key())).status).toBe(403)
    expect((await owner.post('/api/orders', body, key())).status).toBe(403)
  })

  it('e-mails the buyer and the owner that the order is placed', async () => {
    const p = await plenty()
    const order = await place(buyerB, [{ productId: p.productId, cases: 1 }], { poNumber: 'HL-MAIL-7' })
    const toBuyer = await waitForMail(SHOP_OF.buyerB.buyer.email, new RegExp(`Order ${order.number} placed`))
    expect(toBuyer.text).toContain('HL-MAIL-7')
    expect(toBuyer.text).toContain(`/shop/orders/${order.id}`)
    const toOwner = await waitForMail(
      'maren@brindlewick.test',
      new RegExp(`Order ${order.number} placed by Harbor Lane General`),
    )
    expect(toOwner.text).toContain(`/studio/orders/${order.id}`)
  })

  it('confirms at once when the studio auto-confirms shops in good standing, but not with an overdue invoice', async () => {
    await updateSettings({ autoConfirmGoodStanding: true })
    const p = await plenty()
    const po = `AUTO-${randomUUID().slice(0, 8)}`
    const good = await place(buyerC, [{ productId: p.productId, cases: 1 }], { poNumber: po })
    expect(good.status).toBe('confirmed')
    // One e-mail says both: placed and confirmed (no second 'confirmed' message the same second).
    const placedMail = await waitForMail(
      SHOP_OF.buyerC.buyer.email,
      new RegExp(`Order ${good.number} placed with .+ and confirmed`),
    )
    expect(placedMail.text).toContain('The studio has confirmed it already')
    await drainMail()
    const forGood = (await allMail()).filter(
      (m) => m.to.some((t) => t.address === SHOP_OF.buyerC.buyer.email) && m.text.includes(po),
    )
    expect(forGood.map((m) => m.subject)).toEqual([placedMail.subject])
    // An invoice of the shop, due yesterday and unpaid.
    const c = await shopId('buyerC')
    const issued = await studioDay(-16)
    await sequelize.query(
      `INSERT INTO invoices (number, year, seq, order_id, shop_id, issue_date, due_date, terms, bill_to, subtotal_cents, total_cents)
       VALUES ($1, extract(year FROM $2::date), $3, $4, $5, $2::date, $6::date, 'net_15', '{}'::jsonb, 3900, 3900)`,
      {
        bind: [
          `T-${randomUUID().slice(0, 8)}`,
          issued,
          900000 + Math.floor(Math.random() * 99999),
          good.id,
          c,
          await studioDay(-1),
        ],
      },
    )
    const held = await place(buyerC, [{ productId: p.productId, cases: 1 }])
    expect(held.status).toBe('placed')
  })
})

describe('pre-orders', () => {
  it('promises the ready date that covers the pre-order, queueing pre-orders in the order placed', async () => {
    const p = await makeProduct({
      batches: [
        { readyInDays: -1, bars: 6 },
        { readyInDays: 9, bars: 24 },
        { readyInDays: 23, bars: 36 },
      ],
    })
    // 3 cases = 18 bars: covered by the 24 curing bars ready in 9 days
    const first = await place(buyerA, [{ productId: p.productId, cases: 3, preorder: true }])
    expect(first.lines[0]).toMatchObject({
      preorder: true,
      promisedDate: await studioDay(9),
      allocations: [],
    })
    expect(first).toMatchObject({ waitingForStock: true })
    // 2 more cases = 12 bars: 18 + 12 = 30 > 24, so the batch in 23 days
    const second = await place(buyerB, [{ productId: p.productId, cases: 2, preorder: true }])
    expect(second.lines[0]!.promisedDate).toBe(await studioDay(23))
    // Nothing is reserved while the bars cure.
    expect((await balances(p.batchIds)).map((b) => b.reserved)).toEqual([0, 0, 0])
    // 24 + 36 − 30 = 30 curing bars unpromised: 6 cases (36 bars) is too many
    const tooMany = await buyerC.post(
      '/api/orders',
      { lines: [{ productId: p.productId, cases: 6, preorder: true }] },
      key(),
    )
    expect(tooMany.status).toBe(409)
    expect(tooMany.body.error.details).toEqual([
      { productId: p.productId, requestedBars: 36, readyBars: 6, preorder: true, curingBars: 30 },
    ])
  })

  it('sets the bars aside when the batch is ready, first placed first served, and e-mails the buyer', async () => {
    const p = await makeProduct({ batches: [{ readyInDays: 4, bars: 30 }] })
    const early = await place(buyerA, [{ productId: p.productId, cases: 3, preorder: true }])
    const late = await place(buyerB, [{ productId: p.productId, cases: 2, preorder: true }])
    const today = await studioDay(0)
    // Nothing is ready yet: the run leaves both waiting.
    const none = await allocateDuePreorders(today)
    expect(none.allocated.filter((a) => a.productId === p.productId)).toEqual([])
    // The cure ends today (the batch's dates move, as they would by the calendar)
    await sequelize.query(
      `UPDATE batches SET pour_date = $2::date - 28, ready_date = $2::date WHERE id = $1`,
      {
        bind: [p.batchIds[0], today],
      },
    )
    // Meanwhile someone took 6 ready bars: 24 left, enough for the first (18) but not both (30).
    await place(buyerC, [{ productId: p.productId, cases: 1 }])
    const run = await allocateDuePreorders(today)
    expect(run.allocated.filter((a) => a.productId === p.productId)).toEqual([
      {
        orderId: early.id,
        number: early.number,
        lineId: early.lines[0]!.id,
        productId: p.productId,
        bars: 18,
      },
    ])
    const afterEarly = (await buyerA.get(`/api/orders/${early.id}`)).body.order
    expect(afterEarly.lines[0].allocations).toEqual([
      expect.objectContaining({ batchId: p.batchIds[0], bars: 18 }),
    ])
    expect(afterEarly.waitingForStock).toBe(false)
    await waitForMail(
      SHOP_OF.buyerA.buyer.email,
      new RegExp(`Pre-order bars set aside for order ${early.number}`),
    )
    const stillWaiting = (await buyerB.get(`/api/orders/${late.id}`)).body.order
    expect(stillWaiting.lines[0].allocations).toEqual([])
    const [stock] = await balances(p.batchIds)
    expect(stock).toMatchObject({ free: 6, reserved: 24, movesFree: 6, movesReserved: 24 })
    // A second run the same day changes nothing.
    const again = await allocateDuePreorders(today)
    expect(again.allocated.filter((a) => a.productId === p.productId)).toEqual([])
  })

  it('the owner can run it on demand (POST /api/orders/preorders/allocate); nobody else', async () => {
    const p = await makeProduct({ batches: [{ readyInDays: 3, bars: 12 }] })
    const order = await place(buyerA, [{ productId: p.productId, cases: 2, preorder: true }])
    await sequelize.query(
      `UPDATE batches SET pour_date = $2::date - 28, ready_date = $2::date WHERE id = $1`,
      {
        bind: [p.batchIds[0], await studioDay(0)],
      },
    )
    const r = await owner.post('/api/orders/preorders/allocate')
    expect(r.status).toBe(200)
    expect(r.body.allocated).toContainEqual(expect.objectContaining({ orderId: order.id, bars: 12 }))
    expect((await buyerA.post('/api/orders/preorders/allocate')).status).toBe(403)
    expect((await packer.post('/api/orders/preorders/allocate')).status).toBe(403)
    expect((await anon.post('/api/orders/preorders/allocate')).status).toBe(401)
  })
})

describe('GET /api/orders and GET /api/orders/:id', () => {
  let mine: Order
  let theirs: Order
  let confirmed: Order

  beforeAll(async () => {
    await setMinimums(0, 0)
    const p = await makeProduct({ batches: [{ readyInDays: -6, bars: 300 }] })
    mine = await place(buyerA, [{ productId: p.productId, cases: 1 }], { poNumber: 'LIST-A-1' })
    theirs = await place(buyerB, [{ productId: p.productId, cases: 2 }], { poNumber: 'LIST-B-1' })
    confirmed = await place(buyerB, [{ productId: p.productId, cases: 3 }], { poNumber: 'LIST-B-2' })
    expect((await owner.post(`/api/orders/${confirmed.id}/confirm`)).status).toBe(200)
  })

  it('gives a buyer their shop’s orders only, newest first, paged', async () => {
    const r = await buyerB.get('/api/orders?pageSize=100').expect(200)
    expect(Object.keys(r.body).sort()).toEqual(['items', 'page', 'pageSize', 'total'])
    const ids = r.body.items.map((o: Order) => o.id)
    expect(ids).toContain(theirs.id)
    expect(ids).not.toContain(mine.id)
    expect(r.body.items.every((o: Order) => o.shopId === theirs.shopId)).toBe(true)
    expect(ids.indexOf(confirmed.id)).toBeLessThan(ids.indexOf(theirs.id))
    // A buyer's shopId filter cannot widen the scope.
    const sneaky = await buyerB.get(`/api/orders?shopId=${mine.shopId}&pageSize=100`).expect(200)
    expect(sneaky.body.items.map((o: Order) => o.id)).not.toContain(mine.id)
  })

  it('pages: page, pageSize and total', async () => {
    const all = await owner.get('/api/orders?pageSize=100').expect(200)
    const page1 = await owner.get('/api/orders?pageSize=2&page=1').expect(200)
    const page2 = await owner.get('/api/orders?pageSize=2&page=2').expect(200)
    expect(page1.body).toMatchObject({ page: 1, pageSize: 2, total: all.body.total })
    expect(page1.body.items.map((o: Order) => o.id)).toEqual(
      all.body.items.slice(0, 2).map((o: Order) => o.id),
    )
    expect(page2.body.items.map((o: Order) => o.id)).toEqual(
      all.body.items.slice(2, 4).map((o: Order) => o.id),
    )
    expect((await owner.get('/api/orders')).body.pageSize).toBe(25)
  })

  it('lets the owner filter by status, shop, placed date and number or PO', async () => {
    const byStatus = await owner.get('/api/orders?status=confirmed&pageSize=100').expect(200)
    expect(byStatus.body.items.map((o: Order) => o.id)).toContain(confirmed.id)
    expect(byStatus.body.items.every((o: Order) => o.status === 'confirmed')).toBe(true)
    const two = await owner.get('/api/orders?status=placed,confirmed&pageSize=100').expect(200)
    expect(two.body.items.map((o: Order) => o.id)).toEqual(expect.arrayContaining([mine.id, confirmed.id]))
    const byShop = await owner.get(`/api/orders?shopId=${mine.shopId}&pageSize=100`).expect(200)
    expect(byShop.body.items.every((o: Order) => o.shopId === mine.shopId)).toBe(true)
    const byPo = await owner.get('/api/orders?q=list-b-2').expect(200)
    expect(byPo.body.items.map((o: Order) => o.id)).toEqual([confirmed.id])
    const byNumber = await owner.get(`/api/orders?q=${mine.number}`).expect(200)
    expect(byNumber.body.items.map((o: Order) => o.id)).toEqual([mine.id])
    const today = await studioDay(0)
    const inRange = await owner.get(`/api/orders?from=${today}&to=${today}&pageSize=100`).expect(200)
    expect(inRange.body.items.map((o: Order) => o.id)).toContain(mine.id)
    const before = await owner.get(`/api/orders?to=${await studioDay(-1)}&pageSize=100`).expect(200)
    expect(before.body.items.map((o: Order) => o.id)).not.toContain(mine.id)
  })

  it('gives a packer only orders to pack, without a single price field', async () => {
    const r = await packer.get('/api/orders?pageSize=100').expect(200)
    const ids = r.body.items.map((o: Order) => o.id)
    expect(ids).toContain(confirmed.id)
    expect(ids).not.toContain(mine.id)
    expect(r.body.items.every((o: Order) => ['confirmed', 'packing', 'packed'].includes(o.status))).toBe(true)
    const priceKeys = /price|cents|total|tax|shipping|cost|margin/i
    const keys = JSON.stringify(r.body.items).match(/"[A-Za-z]+":/g) ?? []
    expect(keys.filter((k) => priceKeys.test(k))).toEqual([])
    const one = await packer.get(`/api/orders/${confirmed.id}`).expect(200)
    expect(one.body.order).not.toHaveProperty('totalCents')
    expect(one.body.order.lines[0]).not.toHaveProperty('unitPriceCents')
    expect((await packer.get(`/api/orders/${mine.id}`)).status).toBe(404)
  })

  it('answers the detail to the shop and the owner, 404 to another shop, 400 for a bad id, 401 signed out', async () => {
    const own = await buyerA.get(`/api/orders/${mine.id}`).expect(200)
    expect(Object.keys(own.body)).toEqual(['order'])
    expect(own.body.order).toMatchObject({
      id: mine.id,
      poNumber: 'LIST-A-1',
      shopName: SHOP_OF.buyerA.tradingName,
    })
    expect((await owner.get(`/api/orders/${mine.id}`)).status).toBe(200)
    const other = await buyerB.get(`/api/orders/${mine.id}`)
    expect(other.status).toBe(404)
    expect(other.body.error.code).toBe('not_found')
    expect((await buyerA.get('/api/orders/99999999')).status).toBe(404)
    expect(fields(await buyerA.get('/api/orders/abc'))).toEqual(['params.id'])
    expect((await anon.get(`/api/orders/${mine.id}`)).status).toBe(401)
    expect((await anon.get('/api/orders')).status).toBe(401)
  })

  it('answers 400 for bad filters, with the field', async () => {
    expect(fields(await owner.get('/api/orders?pageSize=101'))).toEqual(['query.pageSize'])
    expect(fields(await owner.get('/api/orders?page=0'))).toEqual(['query.page'])
    expect(fields(await owner.get('/api/orders?status=lost'))).toEqual(['query.status.0'])
    expect(fields(await owner.get('/api/orders?from=2026-13-01'))).toEqual(['query.from'])
    expect(fields(await owner.get('/api/orders?from=2026-12-10&to=2026-12-01'))).toEqual(['query.to'])
  })
})

describe('the order’s life: confirm and cancel', () => {
  it('the owner confirms a placed order (e-mail to the buyer); twice is a wrong transition (409)', async () => {
    const p = await plenty()
    const order = await place(buyerA, [{ productId: p.productId, cases: 1 }])
    expect((await buyerA.post(`/api/orders/${order.id}/confirm`)).status).toBe(403)
    expect((await packer.post(`/api/orders/${order.id}/confirm`)).status).toBe(403)
    expect((await anon.post(`/api/orders/${order.id}/confirm`)).status).toBe(401)
    const r = await owner.post(`/api/orders/${order.id}/confirm`)
    expect(r.status).toBe(200)
    expect(r.body.order).toMatchObject({ status: 'confirmed', confirmedAt: expect.any(String) })
    await waitForMail(SHOP_OF.buyerA.buyer.email, new RegExp(`Order ${order.number} confirmed`))
    const twice = await owner.post(`/api/orders/${order.id}/confirm`)
    expect(twice.status).toBe(409)
    expect(twice.body.error.code).toBe('invalid_transition')
    expect((await owner.post('/api/orders/99999999/confirm')).status).toBe(404)
    expect(fields(await owner.post('/api/orders/x/confirm'))).toEqual(['params.id'])
  })

  it('a buyer cancels while placed: every reserved bar goes back, batch stock as it was', async () => {
    const p = await makeProduct({
      batches: [
        { readyInDays: -20, bars: 10 },
        { readyInDays: -5, bars: 40 },
      ],
    })
    const before = await balances(p.batchIds)
    const order = await place(buyerB, [{ productId: p.productId, cases: 4 }])
    expect(order.lines[0]!.allocations.map((a) => a.bars)).toEqual([10, 14])
    const r = await buyerB.post(`/api/orders/${order.id}/cancel`, { reason: 'Ordered twice by mistake.' })
    expect(r.status).toBe(200)
    expect(r.body.order).toMatchObject({ status: 'cancelled', cancelReason: 'Ordered twice by mistake.' })
    const after = await balances(p.batchIds)
    expect(after.map((b) => [b.free, b.reserved])).toEqual(before.map((b) => [b.free, b.reserved]))
    for (const b of after) expect([b.free, b.reserved]).toEqual([b.movesFree, b.movesReserved])
    const moves = await rows<{ kind: string; bars: number }>(
      'SELECT kind, bars FROM stock_moves WHERE order_id = $1 ORDER BY id',
      [order.id],
    )
    expect(moves).toEqual([
      { kind: 'reserved', bars: 10 },
      { kind: 'reserved', bars: 14 },
      { kind: 'released', bars: 10 },
      { kind: 'released', bars: 14 },
    ])
    await waitForMail(SHOP_OF.buyerB.buyer.email, new RegExp(`Order ${order.number} cancelled`))
    await waitForMail('maren@brindlewick.test', new RegExp(`Order ${order.number} cancelled`))
    const again = await buyerB.post(`/api/orders/${order.id}/cancel`, {})
    expect(again.status).toBe(409)
    expect(again.body.error.code).toBe('invalid_transition')
  })

  it('a buyer cannot cancel once confirmed (409); the owner can until it ships', async () => {
    const p = await plenty()
    const order = await place(buyerA, [{ productId: p.productId, cases: 2 }])
    expect((await owner.post(`/api/orders/${order.id}/confirm`)).status).toBe(200)
    const byBuyer = await buyerA.post(`/api/orders/${order.id}/cancel`, {})
    expect(byBuyer.status).toBe(409)
    expect(byBuyer.body.error.code).toBe('invalid_transition')
    const byOwner = await owner.post(`/api/orders/${order.id}/cancel`, { reason: 'Out of season.' })
    expect(byOwner.status).toBe(200)
    expect(byOwner.body.order.status).toBe('cancelled')
    expect((await balances(p.batchIds))[0]).toMatchObject({ free: 60, reserved: 0 })
  })

  it('cancel: 404 for another shop, 403 for the packer, 401 signed out, 400 for a long reason', async () => {
    const p = await plenty()
    const order = await place(buyerA, [{ productId: p.productId, cases: 1 }])
    expect((await buyerB.post(`/api/orders/${order.id}/cancel`, {})).status).toBe(404)
    expect((await packer.post(`/api/orders/${order.id}/cancel`, {})).status).toBe(403)
    expect((await anon.post(`/api/orders/${order.id}/cancel`, {})).status).toBe(401)
    expect(fields(await buyerA.post(`/api/orders/${order.id}/cancel`, { reason: 'r'.repeat(501) }))).toEqual([
      'reason',
    ])
    expect((await buyerA.get(`/api/orders/${order.id}`)).body.order.status).toBe('placed')
  })
})

describe('PATCH /api/orders/:id/lines', () => {
  it('replaces the lines: stock rechecked, allocations and ledger adjusted, totals priced again', async () => {
    const a = await makeProduct({ batches: [{ readyInDays: -9, bars: 30 }] })
    const b = await makeProduct({ batches: [{ readyInDays: -9, bars: 30 }] })
    const c = await makeProduct({ batches: [{ readyInDays: -9, bars: 30 }] })
    const order = await place(buyerA, [
      { productId: a.productId, cases: 2 },
      { productId: b.productId, cases: 1 },
    ])
    const r = await owner.patch(`/api/orders/${order.id}/lines`, {
      lines: [
        { productId: a.productId, cases: 4 },
        { productId: c.productId, cases: 1 },
      ],
    })
    expect(r.status).toBe(200)
    const edited = r.body.order as Order
    expect(edited.lines.map((l) => [l.productId, l.cases, l.bars])).toEqual([
      [a.productId, 4, 24],
      [c.productId, 1, 6],
    ])
    // Preferred 650 a bar: (24 + 6) × 650 = 19 500 (hand calculation)
    expect(edited.subtotalCents).toBe(19500)
    expect(edited.totalCents).toBe(edited.subtotalCents + edited.shippingCents + edited.taxCents)
    const stock = await balances([...a.batchIds, ...b.batchIds, ...c.batchIds])
    expect(stock.map((s) => [s.free, s.reserved])).toEqual([
      [6, 24],
      [30, 0],
      [24, 6],
    ])
    for (const s of stock) expect([s.free, s.reserved]).toEqual([s.movesFree, s.movesReserved])
    // The line taken off stays as a removed row (its moves point at it); it is nowhere in the order.
    const removed = await rows<{ removed_at: Date | null }>(
      'SELECT removed_at FROM order_lines WHERE order_id = $1 AND product_id = $2',
      [order.id, b.productId],
    )
    expect(removed[0]!.removed_at).not.toBeNull()
  })

  it('keeps an unchanged line’s frozen price when today’s price has moved', async () => {
    const a = await plenty()
    const b = await plenty()
    const order = await place(buyerA, [{ productId: a.productId, cases: 1 }])
    await sequelize.query(`UPDATE price_breaks SET unit_price_cents = 999 WHERE product_id = $1`, {
      bind: [a.productId],
    })
    const r = await owner.patch(`/api/orders/${order.id}/lines`, {
      lines: [
        { productId: a.productId, cases: 1 },
        { productId: b.productId, cases: 1 },
      ],
    })
    expect(r.status).toBe(200)
    expect(r.body.order.lines.map((l: { unitPriceCents: number }) => l.unitPriceCents)).toEqual([650, 650])
  })

  it('refuses an edit that stock cannot cover (409) and changes nothing', async () => {
    const a = await makeProduct({ batches: [{ readyInDays: -9, bars: 18 }] })
    const order = await place(buyerA, [{ productId: a.productId, cases: 2 }])
    const before = await balances(a.batchIds)
    const r = await owner.patch(`/api/orders/${order.id}/lines`, {
      lines: [{ productId: a.productId, cases: 4 }],
    })
    expect(r.status).toBe(409)
    expect(r.body.error.code).toBe('insufficient_stock')
    // Its own 12 reserved bars count as available to it: 6 free + 12 = 18 < 24 (hand calculation)
    expect(r.body.error.details).toEqual([{ productId: a.productId, requestedBars: 24, readyBars: 18 }])
    expect(await balances(a.batchIds)).toEqual(before)
    const still = (await owner.get(`/api/orders/${order.id}`)).body.order
    expect(still.lines.map((l: { cases: number }) => l.cases)).toEqual([2])
    // 3 cases fit exactly: 18 bars.
    expect(
      (await owner.patch(`/api/orders/${order.id}/lines`, { lines: [{ productId: a.productId, cases: 3 }] }))
        .status,
    ).toBe(200)
    expect((await balances(a.batchIds))[0]).toMatchObject({ free: 0, reserved: 18 })
  })

  it('only before packing: a packing order answers 409', async () => {
    const a = await plenty()
    const order = await place(buyerA, [{ productId: a.productId, cases: 1 }])
    expect((await owner.post(`/api/orders/${order.id}/confirm`)).status).toBe(200)
    await sequelize.query(`UPDATE orders SET status = 'packing' WHERE id = $1`, { bind: [order.id] })
    const r = await owner.patch(`/api/orders/${order.id}/lines`, {
      lines: [{ productId: a.productId, cases: 2 }],
    })
    expect(r.status).toBe(409)
    expect(r.body.error.code).toBe('invalid_transition')
  })

  it('400 with the field, 403 for the buyer and the packer, 404 unknown, 401 signed out', async () => {
    const a = await plenty()
    const inactive = await makeProduct({ active: false })
    const order = await place(buyerA, [{ productId: a.productId, cases: 1 }])
    expect(fields(await owner.patch(`/api/orders/${order.id}/lines`, { lines: [] }))).toEqual(['lines'])
    expect(
      fields(
        await owner.patch(`/api/orders/${order.id}/lines`, {
          lines: [
            { productId: a.productId, cases: 1 },
            { productId: a.productId, cases: 2 },
          ],
        }),
      ),
    ).toEqual(['lines.1.productId'])
    expect(
      fields(
        await owner.patch(`/api/orders/${order.id}/lines`, {
          lines: [{ productId: inactive.productId, cases: 1 }],
        }),
      ),
    ).toEqual(['lines.0.productId'])
    const body = { lines: [{ productId: a.productId, cases: 2 }] }
    expect((await buyerA.patch(`/api/orders/${order.id}/lines`, body)).status).toBe(403)
    expect((await packer.patch(`/api/orders/${order.id}/lines`, body)).status).toBe(403)
    expect((await anon.patch(`/api/orders/${order.id}/lines`, body)).status).toBe(401)
    expect((await owner.patch('/api/orders/99999999/lines', body)).status).toBe(404)
  })
})

describe('GET /api/orders/:id/product-options', () => {
  it('gives the owner the order’s shop catalogue at its tier, with stock; nobody else', async () => {
    const p = await makeProduct({
      prices: { Standard: [[1, 710]], Preferred: [[1, 660]] },
      batches: [{ readyInDays: -3, bars: 30 }],
    })
    const order = await place(buyerB, [{ productId: p.productId, cases: 1 }])
    const r = await owner.get(`/api/orders/${order.id}/product-options`)
    expect(r.status).toBe(200)
    const item = r.body.items.find((i: { productId: number }) => i.productId === p.productId)
    // Harbor Lane General is on the Standard tier; 30 − 6 reserved = 24 bars ready
    expect(item).toMatchObject({
      priceBreaks: [{ minCases: 1, unitPriceCents: 710 }],
      readyBars: 24,
      readyCases: 4,
    })
    expect((await buyerB.get(`/api/orders/${order.id}/product-options`)).status).toBe(403)
    expect((await packer.get(`/api/orders/${order.id}/product-options`)).status).toBe(403)
    expect((await anon.get(`/api/orders/${order.id}/product-options`)).status).toBe(401)
    expect((await owner.get('/api/orders/99999999/product-options')).status).toBe(404)
    expect(fields(await owner.get('/api/orders/x/product-options'))).toEqual(['params.id'])
  })
})

describe('POST /api/orders/:id/reorder', () => {
  it('puts the order’s lines in the cart at today’s prices and says what stock cannot cover', async () => {
    const roomy = await makeProduct({ batches: [{ readyInDays: -5, bars: 60 }] })
    const tight = await makeProduct({ batches: [{ readyInDays: -5, bars: 24 }] })
    const order = await place(buyerA, [
      { productId: roomy.productId, cases: 2 },
      { productId: tight.productId, cases: 3 },
    ])
    await sequelize.query(`UPDATE price_breaks SET unit_price_cents = 675 WHERE product_id = $1`, {
      bind: [roomy.productId],
    })
    const r = await buyerA.post(`/api/orders/${order.id}/reorder`)
    expect(r.status).toBe(200)
    const lines = r.body.cart.lines as {
      productId: number
      cases: number
      unitPriceCents: number
      stock: string
    }[]
    expect(lines.find((l) => l.productId === roomy.productId)).toMatchObject({
      cases: 2,
      unitPriceCents: 675,
      stock: 'ready',
    })
    // 24 − 18 reserved = 6 bars ready: 1 case, 3 asked
    expect(r.body.short).toEqual([
      { productId: tight.productId, sku: tight.sku, name: tight.name, cases: 3, readyCases: 1 },
    ])
    expect(r.body.skipped).toEqual([])
  })

  it('leaves out products no longer on sale', async () => {
    const gone = await plenty()
    const order = await place(buyerA, [{ productId: gone.productId, cases: 1 }])
    await sequelize.query('UPDATE products SET active = false WHERE id = $1', { bind: [gone.productId] })
    const r = await buyerA.post(`/api/orders/${order.id}/reorder`)
    expect(r.status).toBe(200)
    expect(r.body.skipped).toEqual([{ productId: gone.productId, sku: gone.sku, name: gone.name }])
    expect(r.body.cart.lines.map((l: { productId: number }) => l.productId)).not.toContain(gone.productId)
  })

  it('404 for another shop’s order, 403 for the owner and the packer, 401 signed out, 400 bad id', async () => {
    const p = await plenty()
    const order = await place(buyerA, [{ productId: p.productId, cases: 1 }])
    expect((await buyerB.post(`/api/orders/${order.id}/reorder`)).status).toBe(404)
    expect((await owner.post(`/api/orders/${order.id}/reorder`)).status).toBe(403)
    expect((await packer.post(`/api/orders/${order.id}/reorder`)).status).toBe(403)
    expect((await anon.post(`/api/orders/${order.id}/reorder`)).status).toBe(401)
    expect(fields(await buyerA.post('/api/orders/0/reorder'))).toEqual(['params.id'])
  })
})

describe('GET /api/orders.csv', () => {
  it('gives a buyer their own orders as a CSV attachment, one row per line', async () => {
    const p = await plenty()
    const mine = await place(buyerC, [{ productId: p.productId, cases: 2 }], { poNumber: '=CSV-C-1' })
    const other = await place(buyerA, [{ productId: p.productId, cases: 1 }], { poNumber: 'CSV-A-1' })
    const r = await buyerC.get('/api/orders.csv').expect(200)
    expect(r.headers['content-type']).toMatch(/^text\/csv/)
    expect(r.headers['content-disposition']).toMatch(/^attachment; filename="orders-\d{4}-\d{2}-\d{2}\.csv"$/)
    const lines = r.text.trim().split('\r\n')
    expect(lines[0]).toBe(
      'Order,Placed on,Status,Shop,PO number,SKU,Product,Cases,Bars,Pre-order promised for,Unit price,Line total,Order merchandise,Order shipping,Order tax,Order total',
    )
    const row = lines.find((l) => l.startsWith(mine.number))!
    // A PO typed as a formula is written as text (OWASP CSV injection); 12 bars × 6.00 = 72.00
    expect(row).toContain(`,'=CSV-C-1,${p.sku},`)
    expect(row).toContain(',2,12,,6.00,72.00,72.00,')
    expect(r.text).not.toContain(other.number)
  })

  it('gives the owner every shop, with the list’s filters; 403 for the packer, 401 signed out, 400 bad filter', async () => {
    const p = await plenty()
    const a = await place(buyerA, [{ productId: p.productId, cases: 1 }])
    const b = await place(buyerB, [{ productId: p.productId, cases: 1 }])
    const all = await owner.get('/api/orders.csv').expect(200)
    expect(all.text).toContain(a.number)
    expect(all.text).toContain(b.number)
    const onlyB = await owner.get(`/api/orders.csv?shopId=${b.shopId}`).expect(200)
    expect(onlyB.text).toContain(b.number)
    expect(onlyB.text).not.toContain(a.number)
    expect((await packer.get('/api/orders.csv')).status).toBe(403)
    expect((await anon.get('/api/orders.csv')).status).toBe(401)
    expect(fields(await owner.get('/api/orders.csv?status=lost'))).toEqual(['query.status.0'])
  })
})

describe('the cart', () => {
  it('keeps the lines on the server with the break applied, totals, the minimum and today’s stock', async () => {
    await setMinimums(30000, 15000)
    await resetShop('buyerB', { openingOrderDone: false })
    const p = await makeProduct({
      prices: {
        Standard: [
          [1, 700],
          [3, 640],
        ],
      },
      batches: [
        { readyInDays: -4, bars: 24 },
        { readyInDays: 11, bars: 48 },
      ],
    })
    const put = await buyerB.put(`/api/cart/lines/${p.productId}`, { cases: 3 })
    expect(put.status).toBe(200)
    const cart = put.body.cart
    expect(cart.lines).toEqual([
      expect.objectContaining({
        productId: p.productId,
        cases: 3,
        bars: 18,
        priceBreak: { minCases: 3, unitPriceCents: 640 },
        nextBreak: null,
        unitPriceCents: 640,
        // 18 × 640 (hand calculation)
        lineTotalCents: 11520,
        readyBars: 24,
        readyCases: 4,
        stock: 'ready',
      }),
    ])
    expect(cart).toMatchObject({
      subtotalCents: 11520,
      minimumKind: 'opening',
      minimumCents: 30000,
      belowMinimumByCents: 18480,
      taxExempt: false,
      canPlace: false,
    })
    // 5 cases = 30 bars > 24 ready: short, and a pre-order would be promised for the curing batch
    const short = (await buyerB.put(`/api/cart/lines/${p.productId}`, { cases: 5 })).body.cart.lines[0]
    expect(short).toMatchObject({ stock: 'short', promisedDate: await studioDay(11) })
    const pre = (await buyerB.put(`/api/cart/lines/${p.productId}`, { cases: 5, preorder: true })).body.cart
    expect(pre.lines).toHaveLength(1)
    expect(pre.lines[0]).toMatchObject({
      preorder: true,
      stock: 'preorder',
      promisedDate: await studioDay(11),
    })
  })

  it('removes a line and empties the cart', async () => {
    const a = await plenty()
    const b = await plenty()
    await buyerA.put(`/api/cart/lines/${a.productId}`, { cases: 1 })
    await buyerA.put(`/api/cart/lines/${b.productId}`, { cases: 1 })
    const removed = await buyerA.delete(`/api/cart/lines/${a.productId}`)
    expect(removed.status).toBe(200)
    expect(removed.body.cart.lines.map((l: { productId: number }) => l.productId)).toEqual([b.productId])
    expect((await buyerA.delete(`/api/cart/lines/${a.productId}`)).status).toBe(404)
    const cleared = await buyerA.delete('/api/cart')
    expect(cleared.status).toBe(200)
    expect(cleared.body.cart).toMatchObject({ lines: [], subtotalCents: 0, totalCents: 0, canPlace: false })
  })

  it('keeps each shop’s cart apart', async () => {
    const p = await plenty()
    await buyerA.put(`/api/cart/lines/${p.productId}`, { cases: 2 })
    expect(
      (await buyerB.get('/api/cart')).body.cart.lines.map((l: { productId: number }) => l.productId),
    ).not.toContain(p.productId)
  })

  it('marks a line whose product went off sale as unavailable, outside the totals', async () => {
    const p = await plenty()
    await buyerA.put(`/api/cart/lines/${p.productId}`, { cases: 2 })
    await sequelize.query('UPDATE products SET active = false WHERE id = $1', { bind: [p.productId] })
    const cart = (await buyerA.get('/api/cart')).body.cart
    expect(cart.lines[0]).toMatchObject({ stock: 'unavailable', lineTotalCents: 0 })
    expect(cart).toMatchObject({ subtotalCents: 0, canPlace: false })
  })

  it('400 with the field, 404 for a product outside the catalogue, 403 for staff, 401 signed out', async () => {
    const p = await plenty()
    const otherTier = await makeProduct({ prices: { Standard: [[1, 700]] } })
    expect(fields(await buyerA.put(`/api/cart/lines/${p.productId}`, { cases: 0 }))).toEqual(['cases'])
    expect(fields(await buyerA.put(`/api/cart/lines/${p.productId}`, { cases: 2.5 }))).toEqual(['cases'])
    expect(fields(await buyerA.put(`/api/cart/lines/${p.productId}`, { cases: 1, preorder: 'yes' }))).toEqual(
      ['preorder'],
    )
    expect(fields(await buyerA.put('/api/cart/lines/abc', { cases: 1 }))).toEqual(['params.productId'])
    expect((await buyerA.put(`/api/cart/lines/${otherTier.productId}`, { cases: 1 })).status).toBe(404)
    expect((await buyerA.put('/api/cart/lines/99999999', { cases: 1 })).status).toBe(404)
    for (const c of [owner, packer]) {
      expect((await c.get('/api/cart')).status).toBe(403)
      expect((await c.put(`/api/cart/lines/${p.productId}`, { cases: 1 })).status).toBe(403)
    }
    expect((await anon.get('/api/cart')).status).toBe(401)
    expect((await anon.delete('/api/cart')).status).toBe(401)
  })

  it('a new pour shows in the cart at once (stock is read live)', async () => {
    const p = await makeProduct({ batches: [{ readyInDays: -3, bars: 6 }] })
    await buyerA.put(`/api/cart/lines/${p.productId}`, { cases: 2 })
    expect((await buyerA.get('/api/cart')).body.cart.lines[0].stock).toBe('short')
    await addBatch(p, { readyInDays: -1, bars: 6 })
    expect((await buyerA.get('/api/cart')).body.cart.lines[0].stock).toBe('ready')
  })
})
