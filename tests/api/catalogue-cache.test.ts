/**
 * The buyer's catalogue is cached per tier (server/modules/catalogue/catalogue-cache.ts). Every
 * change that shows in it must show at once: a write-off, a reservation by another shop's order,
 * a new price, a renamed product and one taken off sale; and a refused change leaves it as it was.
 */
import { randomUUID } from 'node:crypto'
import { once } from 'node:events'
import http from 'node:http'
import type { AddressInfo } from 'node:net'
import { gunzipSync } from 'node:zlib'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { clientAs } from '@tests/factories/api-client'
import type { ApiClient } from '@tests/factories/api-client'
import { makeProduct, resetShop, setMinimums } from '@tests/factories/orders'
import type { TestProduct } from '@tests/factories/orders'

const app = createApp({ pruneSessions: false })

type Item = {
  productId: number
  sku: string
  name: string
  readyBars: number
  priceBreaks: { minCases: number; unitPriceCents: number }[]
}

let owner: ApiClient
let buyerA: ApiClient
let buyerB: ApiClient
let p: TestProduct

async function itemOf(c: ApiClient, productId: number): Promise<Item | undefined> {
  const r = await c.get('/api/catalogue').expect(200)
  return (r.body.items as Item[]).find((i) => i.productId === productId)
}

async function tierIdOf(c: ApiClient): Promise<number> {
  const me = await c.get('/api/auth/me').expect(200)
  const shop = await owner.get(`/api/shops/${me.body.user.shopId}`).expect(200)
  return shop.body.shop.tierId as number
}

beforeAll(async () => {
  ;[owner, buyerA, buyerB] = await Promise.all([
    clientAs(app, 'owner'),
    clientAs(app, 'buyerA'),
    clientAs(app, 'buyerB'),
  ])
  await setMinimums(0, 0)
  p = await makeProduct({
    casePack: 6,
    prices: { Standard: [[1, 700]], Preferred: [[1, 650]], Distributor: [[1, 600]] },
    batches: [{ readyInDays: -5, bars: 60 }],
  })
})

describe('the cached catalogue', () => {
  it('shows a write-off at once', async () => {
    expect((await itemOf(buyerA, p.productId))?.readyBars).toBe(60)
    const r = await owner.post(`/api/batches/${p.batchIds[0]}/moves`, {
      kind: 'written_off',
      reason: 'damaged',
      bars: 6,
    })
    expect(r.status, JSON.stringify(r.body)).toBe(201)
    expect((await itemOf(buyerA, p.productId))?.readyBars).toBe(54)
  })

  it('shows the bars another shop reserved at once, to every tier', async () => {
    expect((await itemOf(buyerB, p.productId))?.readyBars).toBe(54)
    await resetShop('buyerB')
    const r = await buyerB.post(
      '/api/orders',
      { lines: [{ productId: p.productId, cases: 2 }] },
      { 'Idempotency-Key': randomUUID() },
    )
    expect(r.status, JSON.stringify(r.body)).toBe(201)
    expect((await itemOf(buyerA, p.productId))?.readyBars).toBe(42)
    expect((await itemOf(buyerB, p.productId))?.readyBars).toBe(42)
  })

  // The demo's own products: their recipes are complete, so pricing and product edits are accepted.
  const demoProduct = async (sku: string) => {
    const r = await buyerA.get('/api/catalogue').expect(200)
    return (r.body.items as Item[]).find((i) => i.sku === sku)!.productId
  }

  it('shows a new price at once, and only to the tier it belongs to', async () => {
    const tierA = await tierIdOf(buyerA)
    const id = await demoProduct('CDR')
    const before = await itemOf(buyerB, id)
    const r = await owner.put(`/api/pricing/${id}/${tierA}`, {
      breaks: [{ minCases: 1, unitPriceCents: 640 }],
    })
    expect(r.status, JSON.stringify(r.body)).toBe(200)
    expect((await itemOf(buyerA, id))?.priceBreaks).toEqual([{ minCases: 1, unitPriceCents: 640 }])
    expect((await itemOf(buyerB, id))?.priceBreaks).toEqual(before?.priceBreaks)
  })

  it('keeps its body when a change is refused', async () => {
    const before = await itemOf(buyerA, p.productId)
    const r = await owner.post(`/api/batches/${p.batchIds[0]}/moves`, {
      kind: 'written_off',
      reason: 'damaged',
      bars: 500,
    })
    expect(r.status).toBe(409)
    expect(await itemOf(buyerA, p.productId)).toEqual(before)
  })

  it("shows a shop's new tier at once", async () => {
    const me = await buyerB.get('/api/auth/me').expect(200)
    const shopB = me.body.user.shopId as number
    const tierA = await tierIdOf(buyerA)
    const tierB = await tierIdOf(buyerB)
    const id = await demoProduct('LAV')
    const atA = (await itemOf(buyerA, id))?.priceBreaks
    expect((await itemOf(buyerB, id))?.priceBreaks).not.toEqual(atA)
    const moved = await owner.patch(`/api/shops/${shopB}`, { tierId: tierA })
    expect(moved.status, JSON.stringify(moved.body)).toBe(200)
    expect((await itemOf(buyerB, id))?.priceBreaks).toEqual(atA)
    expect((await owner.patch(`/api/shops/${shopB}`, { tierId: tierB })).status).toBe(200)
  })

  it('shows a renamed product at once and drops one taken off sale', async () => {
    const id = await demoProduct('HNY')
    const renamed = await owner.patch(`/api/products/${id}`, { name: 'Honey Oat, renamed' })
    expect(renamed.status, JSON.stringify(renamed.body)).toBe(200)
    expect((await itemOf(buyerA, id))?.name).toBe('Honey Oat, renamed')
    const off = await owner.patch(`/api/products/${id}`, { active: false })
    expect(off.status, JSON.stringify(off.body)).toBe(200)
    expect(await itemOf(buyerA, id)).toBeUndefined()
  })
})

describe('the catalogue on the wire', () => {
  // The bytes as they cross the wire (supertest would unzip them): over a real socket.
  const raw = async (c: ApiClient, encoding: string) => {
    const server = http.createServer(app).listen(0, '127.0.0.1')
    await once(server, 'listening')
    const { port } = server.address() as AddressInfo
    const cookie = (
      await c.agent.jar.getCookies({ domain: '127.0.0.1', path: '/', secure: false, script: false })
    )
      .map((k) => `${k.name}=${k.value}`)
      .join('; ')
    try {
      return await new Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }>(
        (resolve, reject) => {
          http
            .get(
              {
                host: '127.0.0.1',
                port,
                path: '/api/catalogue',
                headers: { cookie, 'accept-encoding': encoding },
              },
              (res) => {
                const chunks: Buffer[] = []
                res.on('data', (b: Buffer) => chunks.push(b))
                res.on('end', () =>
                  resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks) }),
                )
              },
            )
            .on('error', reject)
        },
      )
    } finally {
      server.close()
    }
  }

  it('sends its stored gzip to a client that takes gzip, JSON to one that does not, the same body either way', async () => {
    const zipped = await raw(buyerA, 'gzip, deflate, br')
    expect(zipped.status).toBe(200)
    expect(zipped.headers['content-encoding']).toBe('gzip')
    expect(zipped.headers['vary']).toMatch(/Accept-Encoding/i)
    const plain = await raw(buyerA, 'identity')
    expect(plain.status).toBe(200)
    expect(plain.headers['content-encoding']).toBeUndefined()
    expect(zipped.body.length).toBeLessThan(plain.body.length)
    const items = JSON.parse(plain.body.toString('utf8')).items as Item[]
    expect(items.length).toBeGreaterThan(0)
    expect(JSON.parse(gunzipSync(zipped.body).toString('utf8'))).toEqual({ items })
    expect(zipped.headers['etag']).toBe(plain.headers['etag'])
  })

  it('answers 304 on its ETag with or without gzip, and a new body after a change', async () => {
    const first = await buyerA.get('/api/catalogue').expect(200)
    const etag = first.headers['etag'] as string
    for (const encoding of ['gzip', 'identity']) {
      const again = await buyerA.agent
        .get('/api/catalogue')
        .set('If-None-Match', etag)
        .set('Accept-Encoding', encoding)
      expect(again.status).toBe(304)
    }
    const r = await owner.post(`/api/batches/${p.batchIds[0]}/moves`, {
      kind: 'written_off',
      reason: 'damaged',
      bars: 1,
    })
    expect(r.status).toBe(201)
    const after = await buyerA.agent
      .get('/api/catalogue')
      .set('If-None-Match', etag)
      .set('Accept-Encoding', 'gzip')
    expect(after.status).toBe(200)
    expect(after.headers['etag']).not.toBe(etag)
  })

  it('other answers over 1 KB are gzipped when asked for, and left plain when not', async () => {
    const zipped = await owner.agent.get('/api/orders?pageSize=25').set('Accept-Encoding', 'gzip')
    expect(zipped.status).toBe(200)
    expect(zipped.headers['content-encoding']).toBe('gzip')
    expect(Array.isArray(zipped.body.items)).toBe(true)
    const plain = await owner.agent.get('/api/orders?pageSize=25').set('Accept-Encoding', 'identity')
    expect(plain.headers['content-encoding']).toBeUndefined()
    expect(plain.body).toEqual(zipped.body)
  })
})
