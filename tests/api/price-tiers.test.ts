import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { DEMO_TIERS } from '../../seeders/demo/scenario'
import { ApiClient, clientAs } from '@tests/factories/api-client'
import type { DemoCaller } from '@tests/factories/api-client'

const app = createApp({ pruneSessions: false })

type Detail = { field: string; message: string }
type Tier = { id: number; name: string; targetMarginPct: number; sortOrder: number; shopCount: number }
const fields = (body: { error?: { details?: Detail[] } }) =>
  (body.error?.details ?? []).map((d) => d.field).sort()

let owner: ApiClient
let seq = 0
const uniqueName = (stem: string) => `${stem} ${++seq} ${Date.now().toString(36)}`

async function newTier(targetMarginPct = 45) {
  const r = await owner.post('/api/price-tiers', { name: uniqueName('Tier'), targetMarginPct })
  expect(r.status, JSON.stringify(r.body)).toBe(201)
  return r.body.tier as Tier
}

beforeAll(async () => {
  owner = await clientAs(app, 'owner')
})

describe('price tiers: who may', () => {
  const routes: [string, string, unknown?][] = [
    ['get', '/api/price-tiers'],
    ['post', '/api/price-tiers', { name: 'Sneaky', targetMarginPct: 10 }],
    ['patch', '/api/price-tiers/1', { targetMarginPct: 1 }],
  ]
  it.each(routes)('%s %s answers 401 signed out', async (method, url, payload) => {
    const c = new ApiClient(app)
    const r =
      method === 'get'
        ? await c.get(url)
        : await (c[method as 'post'] as ApiClient['post']).call(c, url, payload)
    expect(r.status).toBe(401)
  })
  it.each(
    (['packer', 'buyerA', 'buyerB'] as DemoCaller[]).flatMap((w) =>
      routes.map(([m, u, b]) => [w, m, u, b] as const),
    ),
  )('%s: %s %s answers 403', async (who, method, url, payload) => {
    const c = await clientAs(app, who)
    const r =
      method === 'get'
        ? await c.get(url)
        : await (c[method as 'post'] as ApiClient['post']).call(c, url, payload)
    expect(r.status).toBe(403)
  })
})

describe('GET /api/price-tiers', () => {
  it('lists the tiers in their order, with target margins and how many shops buy at each', async () => {
    const r = await owner.get('/api/price-tiers').expect(200)
    const items = r.body.items as Tier[]
    expect(items.slice(0, 3).map((t) => [t.name, t.targetMarginPct])).toEqual(
      DEMO_TIERS.map((t) => [t.name, t.targetMarginPct]),
    )
    // One demo shop per tier (seeders/demo/scenario.ts).
    expect(items.slice(0, 3).map((t) => t.shopCount)).toEqual([1, 1, 1])
  })
})

describe('POST /api/price-tiers', () => {
  it('creates a tier after the others (201)', async () => {
    const before = (await owner.get('/api/price-tiers')).body.items as Tier[]
    const r = await owner.post('/api/price-tiers', { name: '  Museum shops  ', targetMarginPct: 47.5 })
    expect(r.status).toBe(201)
    expect(r.body.tier).toMatchObject({ name: 'Museum shops', targetMarginPct: 47.5, shopCount: 0 })
    expect(r.body.tier.sortOrder).toBeGreaterThan(Math.max(...before.map((t) => t.sortOrder)))
    // The new tier shows on the pricing screen at once, with a suggestion for every product.
    const pricing = await owner.get('/api/pricing').expect(200)
    expect(pricing.body.tiers.map((t: Tier) => t.id)).toContain(r.body.tier.id)
    const cell = pricing.body.items[0].cells.find((c: { tierId: number }) => c.tierId === r.body.tier.id)
    expect(cell).toMatchObject({ breaks: [], singleCasePriceCents: null })
  })

  it('refuses a name another tier has, ignoring case (409 name)', async () => {
    const r = await owner.post('/api/price-tiers', { name: 'standard', targetMarginPct: 30 })
    expect(r.status).toBe(409)
    expect(r.body.error.code).toBe('name_taken')
    expect(fields(r.body)).toEqual(['name'])
  })

  it.each([
    ['100 % (a margin is a share of the price: MARGIN_RANGE)', 100],
    ['over 100 %', 120],
    ['a negative margin', -1],
    ['three decimals (the column keeps two)', 45.125],
    ['text', '45'],
  ])('refuses a target margin of %s (400 targetMarginPct)', async (_label, targetMarginPct) => {
    const r = await owner.post('/api/price-tiers', { name: uniqueName('Bad'), targetMarginPct })
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['targetMarginPct'])
  })

  it('accepts 0 % and 99.99 %, the ends of the range', async () => {
    for (const m of [0, 99.99]) {
      const r = await owner.post('/api/price-tiers', { name: uniqueName('Edge'), targetMarginPct: m })
      expect(r.status).toBe(201)
      expect(r.body.tier.targetMarginPct).toBe(m)
    }
  })

  it('refuses an empty or over-long name (400 name), and reports both fields at once', async () => {
    const a = await owner.post('/api/price-tiers', { name: '   ', targetMarginPct: 40 })
    expect(fields(a.body)).toEqual(['name'])
    const b = await owner.post('/api/price-tiers', { name: 'x'.repeat(61), targetMarginPct: 40 })
    expect(fields(b.body)).toEqual(['name'])
    const c = await owner.post('/api/price-tiers', {})
    expect(c.status).toBe(400)
    expect(fields(c.body)).toEqual(['name', 'targetMarginPct'])
  })
})

describe('PATCH /api/price-tiers/:id', () => {
  it('changes the name and the margin; the pricing screen suggests from the new margin', async () => {
    const t = await newTier(40)
    const r = await owner.patch(`/api/price-tiers/${t.id}`, {
      name: `${t.name} renamed`,
      targetMarginPct: 60,
    })
    expect(r.status).toBe(200)
    expect(r.body.tier).toMatchObject({ id: t.id, name: `${t.name} renamed`, targetMarginPct: 60 })
    const pricing = await owner.get('/api/pricing').expect(200)
    const item = pricing.body.items[0] as {
      costPerBarCents: number
      cells: { tierId: number; suggestedUnitPriceCents: number }[]
    }
    const step = pricing.body.priceStepCents as number
    // REFERENCES: cost ÷ (1 − margin), up to the price step: 60 % margin keeps 40 % of the price.
    const expected = Math.ceil(Math.ceil((item.costPerBarCents * 100) / 40) / step) * step
    expect(item.cells.find((c) => c.tierId === t.id)!.suggestedUnitPriceCents).toBe(expected)
  })

  it('changes only what is sent', async () => {
    const t = await newTier(33)
    const r = await owner.patch(`/api/price-tiers/${t.id}`, { targetMarginPct: 34 })
    expect(r.body.tier).toMatchObject({ name: t.name, targetMarginPct: 34 })
  })

  it('refuses another tier’s name (409), a bad margin (400) and an unknown tier (404)', async () => {
    const t = await newTier()
    const a = await owner.patch(`/api/price-tiers/${t.id}`, { name: 'Preferred' })
    expect(a.status).toBe(409)
    expect(fields(a.body)).toEqual(['name'])
    const b = await owner.patch(`/api/price-tiers/${t.id}`, { targetMarginPct: 100 })
    expect(b.status).toBe(400)
    expect(fields(b.body)).toEqual(['targetMarginPct'])
    expect((await owner.patch('/api/price-tiers/999999', { targetMarginPct: 10 })).status).toBe(404)
    const c = await owner.patch('/api/price-tiers/abc', { targetMarginPct: 10 })
    expect(fields(c.body)).toEqual(['params.id'])
    // Renaming a tier to its own name in other letters is fine.
    const self = await owner.patch(`/api/price-tiers/${t.id}`, { name: t.name.toUpperCase() })
    expect(self.status).toBe(200)
  })
})
