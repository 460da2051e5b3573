/**
 * The buyer's catalogue (DESIGN.md contract): the exact item shape, each shop's own tier's price
 * breaks only, ready stock in bars and whole cases, the next ready date. And a walk over every
 * response a buyer gets (catalogue, cart, orders list and detail, placing, reordering) that fails
 * on any cost or margin key and on any price of another tier.
 */
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { clientAs } from '@tests/factories/api-client'
import type { ApiClient } from '@tests/factories/api-client'
import { makeProduct, resetShop, setMinimums, studioDay } from '@tests/factories/orders'
import type { TestProduct } from '@tests/factories/orders'

const app = createApp({ pruneSessions: false })

type Item = Record<string, unknown> & { productId: number }

const CONTRACT_KEYS = [
  'productId',
  'sku',
  'name',
  'casePack',
  'netWeightG',
  'msrpCents',
  'priceBreaks',
  'readyBars',
  'readyCases',
  'nextReady',
]
/** The non-sensitive extras the catalogue screen needs. */
const EXTRA_KEYS = ['scentNotes', 'description', 'photoUrl']

let buyerA: ApiClient
let buyerB: ApiClient
let buyerC: ApiClient
/** Priced at every tier with two breaks, 14 bars ready in two batches and 30 curing. */
let tiered: TestProduct

async function itemOf(c: ApiClient, productId: number): Promise<Item | undefined> {
  const r = await c.get('/api/catalogue').expect(200)
  return (r.body.items as Item[]).find((i) => i.productId === productId)
}

beforeAll(async () => {
  ;[buyerA, buyerB, buyerC] = await Promise.all([
    clientAs(app, 'buyerA'),
    clientAs(app, 'buyerB'),
    clientAs(app, 'buyerC'),
  ])
  tiered = await makeProduct({
    casePack: 6,
    netWeightG: 113,
    prices: {
      Standard: [
        [1, 725],
        [5, 690],
      ],
      Preferred: [
        [1, 680],
        [5, 655],
      ],
      Distributor: [
        [1, 610],
        [10, 585],
      ],
    },
    batches: [
      { readyInDays: -20, bars: 8 },
      { readyInDays: -2, bars: 6 },
      { readyInDays: 12, bars: 30 },
    ],
  })
})

describe('GET /api/catalogue', () => {
  it('answers the contract shape exactly: the contract fields and the named extras, nothing else', async () => {
    const r = await buyerA.get('/api/catalogue').expect(200)
    expect(Object.keys(r.body)).toEqual(['items'])
    expect(r.body.items.length).toBeGreaterThan(0)
    for (const item of r.body.items as Item[]) {
      expect(Object.keys(item).sort()).toEqual([...CONTRACT_KEYS, ...EXTRA_KEYS].sort())
      for (const b of item.priceBreaks as Record<string, unknown>[]) {
        expect(Object.keys(b).sort()).toEqual(['minCases', 'unitPriceCents'])
      }
      if (item.nextReady !== null)
        expect(Object.keys(item.nextReady as object).sort()).toEqual(['bars', 'date'])
    }
    const item = (r.body.items as Item[]).find((i) => i.productId === tiered.productId)
    expect(item).toEqual({
      productId: tiered.productId,
      sku: tiered.sku,
      name: tiered.name,
      casePack: 6,
      netWeightG: 113,
      msrpCents: 1500,
      priceBreaks: [
        { minCases: 1, unitPriceCents: 680 },
        { minCases: 5, unitPriceCents: 655 },
      ],
      // 8 + 6 bars in two ready batches; whole cases of 6 only (product rule)
      readyBars: 14,
      readyCases: 2,
      nextReady: { date: await studioDay(12), bars: 30 },
      scentNotes: 'Test scent',
      description: 'A bar made for a test.',
      photoUrl: null,
    })
  })

  it.each([
    ['buyerA', 'Preferred', [680, 655]],
    ['buyerB', 'Standard', [725, 690]],
    ['buyerC', 'Distributor', [610, 585]],
  ] as const)("gives %s their own tier's breaks (%s) and no other", async (who, _tier, prices) => {
    const client = { buyerA, buyerB, buyerC }[who]
    const item = await itemOf(client, tiered.productId)
    expect((item!.priceBreaks as { unitPriceCents: number }[]).map((b) => b.unitPriceCents)).toEqual(prices)
  })

  it('lists only active products priced at the shop’s tier', async () => {
    const standardOnly = await makeProduct({
      prices: { Standard: [[1, 800]] },
      batches: [{ readyInDays: -5, bars: 12 }],
    })
    const inactive = await makeProduct({ active: false, batches: [{ readyInDays: -5, bars: 12 }] })
    expect(await itemOf(buyerB, standardOnly.productId)).toBeDefined()
    expect(await itemOf(buyerA, standardOnly.productId)).toBeUndefined()
    expect(await itemOf(buyerC, standardOnly.productId)).toBeUndefined()
    expect(await itemOf(buyerA, inactive.productId)).toBeUndefined()
    expect(await itemOf(buyerB, inactive.productId)).toBeUndefined()
  })

  it('shows a sold-out product with 0 ready and a curing-only product with its next ready date', async () => {
    const curing = await makeProduct({
      batches: [
        { readyInDays: 7, bars: 24 },
        { readyInDays: 7, bars: 12 },
        { readyInDays: 21, bars: 50 },
      ],
    })
    const never = await makeProduct()
    expect(await itemOf(buyerA, curing.productId)).toMatchObject({
      readyBars: 0,
      readyCases: 0,
      // both batches ready that day count (availability rule)
      nextReady: { date: await studioDay(7), bars: 36 },
    })
    expect(await itemOf(buyerA, never.productId)).toMatchObject({
      readyBars: 0,
      readyCases: 0,
      nextReady: null,
    })
  })

  it('counts only free bars: reserved ones are gone from ready stock', async () => {
    await setMinimums(0, 0)
    await resetShop('buyerB')
    const p = await makeProduct({ batches: [{ readyInDays: -3, bars: 18 }] })
    const r = await buyerB.post(
      '/api/orders',
      { lines: [{ productId: p.productId, cases: 2 }] },
      { 'Idempotency-Key': randomUUID() },
    )
    expect(r.status).toBe(201)
    expect(await itemOf(buyerA, p.productId)).toMatchObject({ readyBars: 6, readyCases: 1 })
  })

  it('answers 401 signed out and 403 to the owner and the packer', async () => {
    expect((await (await clientAs(app, 'anon')).get('/api/catalogue')).status).toBe(401)
    for (const who of ['owner', 'packer'] as const) {
      const r = await (await clientAs(app, who)).get('/api/catalogue')
      expect(r.status).toBe(403)
      expect(r.body.error.code).toBe('forbidden')
    }
  })

  it('answers in two queries, whatever the number of products', async () => {
    const queries: string[] = []
    const count = (sql: string) => {
      if (!/^(START|COMMIT|ROLLBACK|SET)/.test(sql)) queries.push(sql)
    }
    // Sequelize reads `options.logging` on every query; the typings leave the field out.
    const options = (sequelize as unknown as { options: { logging: unknown } }).options
    options.logging = count
    try {
      await buyerC.get('/api/catalogue').expect(200)
    } finally {
      options.logging = false
    }
    // The session's user look-up runs on the plain pg pool, not through Sequelize.
    expect(queries.filter((q) => /products|batch_stock/.test(q))).toHaveLength(2)
  })
})

/** Every key and every number anywhere in a JSON value. */
function walk(value: unknown, path: string, out: { keys: string[]; numbers: { path: string; n: number }[] }) {
  if (Array.isArray(value)) value.forEach((v, i) => walk(v, `${path}[${i}]`, out))
  else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      out.keys.push(`${path}.${k}`)
      walk(v, `${path}.${k}`, out)
    }
  } else if (typeof value === 'number') out.numbers.push({ path, n: value })
  return out
}

describe('what a buyer never sees', () => {
  it('no cost or margin key and no other tier’s price in any buyer-facing response', async () => {
    await setMinimums(0, 0)
    await resetShop('buyerA')
    // Prices no other figure in these answers can equal by chance: 9 013 and 9 031 would show a leak.
    const marked = await makeProduct({
      casePack: 4,
      prices: { Standard: [[1, 9013]], Preferred: [[1, 8887]], Distributor: [[1, 9031]] },
      batches: [
        { readyInDays: -10, bars: 40 },
        { readyInDays: 9, bars: 20 },
      ],
    })
    // A cost frozen on the batch, and a tier margin: neither may travel.
    await sequelize.query(
      'UPDATE batches SET cost_per_bar_cents = 4271, ingredient_cost_cents = 51252 WHERE id = ANY($1::int[])',
      {
        bind: [marked.batchIds],
      },
    )
    const otherTierPrices = [9013, 9031, 4271, 51252]

    const responses: { what: string; body: unknown }[] = []
    const keep = (what: string, r: { status: number; body: unknown }, status = 200) => {
      expect(r.status, `${what}: ${JSON.stringify(r.body)}`).toBe(status)
      responses.push({ what, body: r.body })
      return r
    }
    keep('catalogue', await buyerA.get('/api/catalogue'))
    keep('cart line', await buyerA.put(`/api/cart/lines/${marked.productId}`, { cases: 2 }))
    keep('cart', await buyerA.get('/api/cart'))
    const placed = keep(
      'order placed',
      await buyerA.post(
        '/api/orders',
        { lines: [{ productId: marked.productId, cases: 2 }], poNumber: 'WALK-1' },
        { 'Idempotency-Key': randomUUID() },
      ),
      201,
    )
    const orderId = (placed.body as { order: { id: number } }).order.id
    keep(
      'pre-order placed',
      await buyerA.post(
        '/api/orders',
        { lines: [{ productId: marked.productId, cases: 3, preorder: true }] },
        { 'Idempotency-Key': randomUUID() },
      ),
      201,
    )
    keep('orders list', await buyerA.get('/api/orders'))
    keep('order detail', await buyerA.get(`/api/orders/${orderId}`))
    keep('reorder', await buyerA.post(`/api/orders/${orderId}/reorder`))
    keep('cart after reorder', await buyerA.get('/api/cart'))
    keep('cancelled', await buyerA.post(`/api/orders/${orderId}/cancel`, { reason: 'Walk test' }))
    keep(
      'insufficient stock',
      await buyerA.post(
        '/api/orders',
        { lines: [{ productId: marked.productId, cases: 50 }] },
        { 'Idempotency-Key': randomUUID() },
      ),
      409,
    )

    for (const { what, body } of responses) {
      const found = walk(body, what, { keys: [], numbers: [] })
      expect(
        found.keys.filter((k) => /cost|margin/i.test(k.split('.').at(-1)!)),
        what,
      ).toEqual([])
      expect(
        found.numbers.filter((x) => otherTierPrices.includes(x.n)),
        what,
      ).toEqual([])
    }
    // The walk saw the buyer's own price, so it was looking in the right places.
    const seen = responses.flatMap(({ what, body }) => walk(body, what, { keys: [], numbers: [] }).numbers)
    expect(seen.some((x) => x.n === 8887)).toBe(true)
  })
})
