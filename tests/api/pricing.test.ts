import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { DEFAULT_SETTINGS } from '@shared/schemas/settings'
import { DEMO_PRODUCTS } from '../../seeders/demo/catalogue'
import { DEMO_TIERS } from '../../seeders/demo/scenario'
import { ApiClient, clientAs } from '@tests/factories/api-client'
import type { DemoCaller } from '@tests/factories/api-client'

const app = createApp({ pruneSessions: false })

type Detail = { field: string; message: string }
type Break = { minCases: number; unitPriceCents: number }
type Cell = {
  tierId: number
  breaks: Break[]
  singleCasePriceCents: number | null
  marginPct: number | null
  level: 'ok' | 'under_margin' | 'under_cost' | null
  suggestedUnitPriceCents: number | null
  suggestionBlocked: string | null
}
type Item = {
  productId: number
  sku: string
  msrpCents: number
  costPerBarCents: number | null
  keystoneMsrpCents: number | null
  cells: Cell[]
}
type Tier = { id: number; name: string; targetMarginPct: number }

const fields = (body: { error?: { details?: Detail[] } }) =>
  (body.error?.details ?? []).map((d) => d.field).sort()

/**
 * The suggested price recomputed by hand. REFERENCES: cost ÷ (1 − margin), up to the next cent and
 * then up to the studio's price step (DESIGN.md, "Suggested prices"). Integer arithmetic: cost ×
 * 100 ÷ (100 − margin %) with the margin in hundredths of a percent, so no float noise enters.
 */
function expectedSuggestion(costCents: number, marginPct: number, stepCents: number) {
  const keptBasisPoints = 10000 - Math.round(marginPct * 100)
  const cents = Math.ceil((costCents * 10000) / keptBasisPoints)
  return Math.ceil(cents / stepCents) * stepCents
}
/** Margin on the selling price: (price − cost) ÷ price (REFERENCES: keystone = 50 % margin on retail). */
const expectedMargin = (price: number, cost: number) => ((price - cost) / price) * 100

let owner: ApiClient
let tiers: Tier[]
let step: number
let lavenderRecipeId: number
let seq = 0

async function overview() {
  const r = await owner.get('/api/pricing')
  expect(r.status).toBe(200)
  return r.body as {
    tiers: Tier[]
    items: Item[]
    priceStepCents: number
    keystoneTierId: number
    currency: string
  }
}
const itemOf = async (productId: number) => (await overview()).items.find((i) => i.productId === productId)!
const tierId = (name: string) => tiers.find((t) => t.name === name)!.id

async function newProduct(overrides: Record<string, unknown> = {}) {
  const r = await owner.post('/api/products', {
    sku: `PR${(++seq).toString().padStart(2, '0')}-${Date.now().toString(36).slice(-5).toUpperCase()}`,
    name: 'Pricing test bar',
    recipeId: lavenderRecipeId,
    netWeightG: 113,
    cutWeightG: 130,
    casePack: 12,
    msrpCents: 1200,
    active: true,
    ...overrides,
  })
  expect(r.status, JSON.stringify(r.body)).toBe(201)
  return r.body.product as { id: number; sku: string; costPerBarCents: number }
}

beforeAll(async () => {
  owner = await clientAs(app, 'owner')
  const o = await overview()
  tiers = o.tiers
  step = o.priceStepCents
  const recipes = (await owner.get('/api/products/recipe-options')).body.items as {
    id: number
    name: string
  }[]
  lavenderRecipeId = recipes.find((r) => r.name === 'Lavender classic')!.id
})

describe('pricing: who may', () => {
  const routes: [string, string, unknown?][] = [
    ['get', '/api/pricing'],
    ['put', '/api/pricing/1/1', { breaks: [] }],
    ['post', '/api/pricing/accept', { items: [{ productId: 1, tierId: 1, unitPriceCents: 500 }] }],
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
    (['packer', 'buyerA', 'buyerC'] as DemoCaller[]).flatMap((w) =>
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

describe('GET /api/pricing', () => {
  it('gives every active product with cost, MSRP, keystone and, per tier, breaks, margin, suggestion and check', async () => {
    const o = await overview()
    expect(o.priceStepCents).toBe(DEFAULT_SETTINGS.priceStepCents)
    expect(o.tiers.map((t) => [t.name, t.targetMarginPct])).toEqual(
      DEMO_TIERS.map((t) => [t.name, t.targetMarginPct]),
    )
    expect(o.keystoneTierId).toBe(tierId('Standard'))
    for (const demo of DEMO_PRODUCTS) {
      const item = o.items.find((i) => i.sku === demo.sku)!
      expect(item, demo.sku).toBeDefined()
      expect(item.msrpCents).toBe(demo.msrpCents)
      const cost = item.costPerBarCents!
      expect(cost).toBeGreaterThan(0)
      for (const tier of o.tiers) {
        const cell = item.cells.find((c) => c.tierId === tier.id)!
        const seeded = demo.prices[tier.name as keyof typeof demo.prices]
        expect(cell.breaks).toEqual(
          seeded.map(([minCases, unitPriceCents]) => ({ minCases, unitPriceCents })),
        )
        const single = seeded.find(([m]) => m === 1)![1]
        expect(cell.singleCasePriceCents).toBe(single)
        expect(cell.marginPct).toBeCloseTo(expectedMargin(single, cost), 9)
        expect(cell.suggestedUnitPriceCents).toBe(expectedSuggestion(cost, tier.targetMarginPct, step))
        const level =
          single < cost
            ? 'under_cost'
            : expectedMargin(single, cost) < tier.targetMarginPct
              ? 'under_margin'
              : 'ok'
        expect(cell.level, `${demo.sku} ${tier.name}`).toBe(level)
      }
      // Keystone (Monash Business School, Marketing Dictionary): MSRP = 2 × the Standard 1-case price.
      expect(item.keystoneMsrpCents).toBe(2 * demo.prices.Standard[0]![1])
    }
  })

  it.each([
    // cost, margin %, step → price; each by hand: cost ÷ (1 − margin), then up to the step.
    [520, 55, 5, 1160], // 520 ÷ 0.45 = 1155.6 → 1156 → 1160
    [450, 50, 5, 900], // exactly 900: already on the step
    [300, 40, 25, 500], // 300 ÷ 0.6 = 500
    [333, 40, 25, 575], // 555 → 575
  ])(
    'the by-hand figure itself: cost %i at %i %% margin, step %i → %i (REFERENCES: cost ÷ (1 − margin))',
    (cost, m, s, price) => {
      expect(expectedSuggestion(cost, m, s)).toBe(price)
    },
  )

  it('lists a new product with no breaks as unpriced, with suggestions to accept', async () => {
    const p = await newProduct()
    const item = await itemOf(p.id)
    for (const cell of item.cells) {
      expect(cell).toMatchObject({
        breaks: [],
        singleCasePriceCents: null,
        marginPct: null,
        level: null,
        suggestionBlocked: null,
      })
    }
    expect(item.keystoneMsrpCents).toBeNull()
  })

  it('leaves inactive products out', async () => {
    const p = await newProduct({ active: false })
    expect((await overview()).items.some((i) => i.productId === p.id)).toBe(false)
  })
})

describe('PUT /api/pricing/:productId/:tierId', () => {
  it('replaces the table in one go, sorted by case count', async () => {
    const p = await newProduct()
    const std = tierId('Standard')
    const suggested = expectedSuggestion(p.costPerBarCents, 55, step)
    const r = await owner.put(`/api/pricing/${p.id}/${std}`, {
      breaks: [
        { minCases: 10, unitPriceCents: suggested },
        { minCases: 1, unitPriceCents: suggested + 100 },
        { minCases: 5, unitPriceCents: suggested + 50 },
      ],
    })
    expect(r.status, JSON.stringify(r.body)).toBe(200)
    expect(r.body.warnings).toEqual([])
    const cell = (r.body.item as Item).cells.find((c) => c.tierId === std)!
    expect(cell.breaks.map((b) => b.minCases)).toEqual([1, 5, 10])
    expect(cell.level).toBe('ok')
    // Replacing again drops the rows not sent.
    const again = await owner.put(`/api/pricing/${p.id}/${std}`, {
      breaks: [{ minCases: 1, unitPriceCents: suggested }],
    })
    expect((again.body.item as Item).cells.find((c) => c.tierId === std)!.breaks).toEqual([
      { minCases: 1, unitPriceCents: suggested },
    ])
    // Other tiers are untouched.
    expect((again.body.item as Item).cells.find((c) => c.tierId === tierId('Preferred'))!.breaks).toEqual([])
  })

  it('accepts a price under the tier margin with a warning on its field', async () => {
    const p = await newProduct()
    const cost = p.costPerBarCents
    const price = cost + 10 // above cost, far under a 55 % margin
    const r = await owner.put(`/api/pricing/${p.id}/${tierId('Standard')}`, {
      breaks: [{ minCases: 1, unitPriceCents: price }],
    })
    expect(r.status).toBe(200)
    expect(r.body.warnings).toHaveLength(1)
    expect(r.body.warnings[0]).toMatchObject({ field: 'breaks.0.unitPriceCents', code: 'under_margin' })
    expect(r.body.warnings[0].marginPct).toBeCloseTo(expectedMargin(price, cost), 9)
    expect((r.body.item as Item).cells.find((c) => c.tierId === tierId('Standard'))!.level).toBe(
      'under_margin',
    )
  })

  it('refuses a price under cost with 422 under_cost on the field, and keeps the old table', async () => {
    const p = await newProduct()
    const std = tierId('Standard')
    const good = expectedSuggestion(p.costPerBarCents, 55, step)
    await owner
      .put(`/api/pricing/${p.id}/${std}`, { breaks: [{ minCases: 1, unitPriceCents: good }] })
      .then((r) => expect(r.status).toBe(200))
    const r = await owner.put(`/api/pricing/${p.id}/${std}`, {
      breaks: [
        { minCases: 1, unitPriceCents: good },
        { minCases: 5, unitPriceCents: p.costPerBarCents - 1 },
      ],
    })
    expect(r.status).toBe(422)
    expect(r.body.error.code).toBe('under_cost')
    expect(fields(r.body)).toEqual(['breaks.1.unitPriceCents'])
    expect((await itemOf(p.id)).cells.find((c) => c.tierId === std)!.breaks).toEqual([
      { minCases: 1, unitPriceCents: good },
    ])
  })

  it('takes a price exactly at cost as under margin, not under cost', async () => {
    const p = await newProduct()
    const r = await owner.put(`/api/pricing/${p.id}/${tierId('Distributor')}`, {
      breaks: [{ minCases: 1, unitPriceCents: p.costPerBarCents }],
    })
    expect(r.status).toBe(200)
    expect(r.body.warnings[0].code).toBe('under_margin')
  })

  it.each([
    [
      'duplicate case counts',
      [
        { minCases: 1, unitPriceCents: 2000 },
        { minCases: 1, unitPriceCents: 1900 },
      ],
      ['breaks.1.minCases'],
    ],
    [
      'a price that rises with the case count',
      [
        { minCases: 1, unitPriceCents: 2000 },
        { minCases: 5, unitPriceCents: 2100 },
      ],
      ['breaks.1.unitPriceCents'],
    ],
    ['a negative price', [{ minCases: 1, unitPriceCents: -100 }], ['breaks.0.unitPriceCents']],
    [
      'a price in fractions of a cent',
      [{ minCases: 1, unitPriceCents: 1999.5 }],
      ['breaks.0.unitPriceCents'],
    ],
    ['no break at 1 case', [{ minCases: 2, unitPriceCents: 2000 }], ['breaks.0.minCases']],
    [
      '0 cases',
      [
        { minCases: 0, unitPriceCents: 2000 },
        { minCases: 1, unitPriceCents: 2000 },
      ],
      ['breaks.0.minCases'],
    ],
    ['a price that is not a number', [{ minCases: 1, unitPriceCents: '20.00' }], ['breaks.0.unitPriceCents']],
  ])('refuses %s (400 on the field)', async (_label, breaks, expected) => {
    const p = await newProduct()
    const r = await owner.put(`/api/pricing/${p.id}/${tierId('Standard')}`, { breaks })
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(expected)
  })

  it('clears the table with an empty list (the product is then unpriced in that tier)', async () => {
    const p = await newProduct()
    const dist = tierId('Distributor')
    const price = expectedSuggestion(p.costPerBarCents, 40, step)
    await owner.put(`/api/pricing/${p.id}/${dist}`, { breaks: [{ minCases: 1, unitPriceCents: price }] })
    expect((await itemOf(p.id)).cells.find((c) => c.tierId === dist)!.singleCasePriceCents).toBe(price)
    const r = await owner.put(`/api/pricing/${p.id}/${dist}`, { breaks: [] })
    expect(r.status).toBe(200)
    const cell = (await itemOf(p.id)).cells.find((c) => c.tierId === dist)!
    expect(cell).toMatchObject({ breaks: [], singleCasePriceCents: null, level: null })
  })

  it('answers 404 for an unknown product or tier, 400 for malformed ids', async () => {
    const std = tierId('Standard')
    expect((await owner.put(`/api/pricing/999999/${std}`, { breaks: [] })).status).toBe(404)
    const p = await newProduct()
    expect((await owner.put(`/api/pricing/${p.id}/999999`, { breaks: [] })).status).toBe(404)
    const r = await owner.put('/api/pricing/x/y', { breaks: [] })
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['params.productId', 'params.tierId'])
    const b = await owner.put(`/api/pricing/${p.id}/${std}`, {})
    expect(b.status).toBe(400)
    expect(fields(b.body)).toEqual(['breaks'])
  })
})

describe('POST /api/pricing/accept', () => {
  it('sets (or creates) each 1-case break to the suggestion; larger breaks stay', async () => {
    const a = await newProduct()
    const b = await newProduct()
    const std = tierId('Standard')
    const pref = tierId('Preferred')
    const high = expectedSuggestion(a.costPerBarCents, 55, step) + 500
    await owner.put(`/api/pricing/${a.id}/${std}`, {
      breaks: [
        { minCases: 1, unitPriceCents: high },
        { minCases: 5, unitPriceCents: expectedSuggestion(a.costPerBarCents, 55, step) - 5 },
      ],
    })
    const sa = expectedSuggestion(a.costPerBarCents, 55, step)
    const sb = expectedSuggestion(b.costPerBarCents, 50, step)
    const r = await owner.post('/api/pricing/accept', {
      items: [
        { productId: a.id, tierId: std, unitPriceCents: sa },
        { productId: b.id, tierId: pref, unitPriceCents: sb },
      ],
    })
    expect(r.status, JSON.stringify(r.body)).toBe(200)
    expect(r.body.accepted).toBe(2)
    const ia = (r.body.items as Item[]).find((i) => i.productId === a.id)!
    expect(ia.cells.find((c) => c.tierId === std)!.breaks).toEqual([
      { minCases: 1, unitPriceCents: sa },
      { minCases: 5, unitPriceCents: sa - 5 },
    ])
    const cellA = (await itemOf(a.id)).cells.find((c) => c.tierId === std)!
    expect(cellA).toMatchObject({ singleCasePriceCents: sa, level: 'ok', suggestionBlocked: 'same_price' })
    expect(cellA.marginPct).toBeCloseTo(expectedMargin(sa, a.costPerBarCents), 9)
    expect(cellA.marginPct!).toBeGreaterThanOrEqual(55)
    const cellB = (await itemOf(b.id)).cells.find((c) => c.tierId === pref)!
    expect(cellB.breaks).toEqual([{ minCases: 1, unitPriceCents: sb }])
    // Keystone follows the Standard tier only: b has no Standard price yet.
    expect((await itemOf(a.id)).keystoneMsrpCents).toBe(2 * sa)
    expect((await itemOf(b.id)).keystoneMsrpCents).toBeNull()
  })

  it('is all or nothing: one stale price refuses the lot with 409 suggestion_changed on its field', async () => {
    const a = await newProduct()
    const b = await newProduct()
    const std = tierId('Standard')
    const sa = expectedSuggestion(a.costPerBarCents, 55, step)
    const r = await owner.post('/api/pricing/accept', {
      items: [
        { productId: a.id, tierId: std, unitPriceCents: sa },
        { productId: b.id, tierId: std, unitPriceCents: sa + step },
      ],
    })
    expect(r.status).toBe(409)
    expect(r.body.error.code).toBe('suggestion_changed')
    expect(fields(r.body)).toEqual(['items.1.unitPriceCents'])
    expect((await itemOf(a.id)).cells.find((c) => c.tierId === std)!.breaks).toEqual([])
  })

  it('refuses a suggestion under a larger break’s price (422 price_rises), changing nothing', async () => {
    const a = await newProduct()
    const std = tierId('Standard')
    const sa = expectedSuggestion(a.costPerBarCents, 55, step)
    const table = [
      { minCases: 1, unitPriceCents: sa + 200 },
      { minCases: 5, unitPriceCents: sa + 100 },
    ]
    await owner.put(`/api/pricing/${a.id}/${std}`, { breaks: table })
    expect((await itemOf(a.id)).cells.find((c) => c.tierId === std)!.suggestionBlocked).toBe('price_rises')
    const r = await owner.post('/api/pricing/accept', {
      items: [{ productId: a.id, tierId: std, unitPriceCents: sa }],
    })
    expect(r.status).toBe(422)
    expect(r.body.error.code).toBe('price_rises')
    expect(fields(r.body)).toEqual(['items.0.unitPriceCents'])
    expect((await itemOf(a.id)).cells.find((c) => c.tierId === std)!.breaks).toEqual(table)
  })

  it('refuses unknown products and tiers (400 on the field), duplicates and an empty list', async () => {
    const a = await newProduct()
    const std = tierId('Standard')
    const unknown = await owner.post('/api/pricing/accept', {
      items: [
        { productId: 999999, tierId: std, unitPriceCents: 500 },
        { productId: a.id, tierId: 999999, unitPriceCents: 500 },
      ],
    })
    expect(unknown.status).toBe(400)
    expect(fields(unknown.body)).toEqual(['items.0.productId', 'items.1.tierId'])
    const dup = await owner.post('/api/pricing/accept', {
      items: [
        { productId: a.id, tierId: std, unitPriceCents: 500 },
        { productId: a.id, tierId: std, unitPriceCents: 500 },
      ],
    })
    expect(dup.status).toBe(400)
    expect(fields(dup.body)).toEqual(['items.1.tierId'])
    const empty = await owner.post('/api/pricing/accept', { items: [] })
    expect(empty.status).toBe(400)
    expect(fields(empty.body)).toEqual(['items'])
    const negative = await owner.post('/api/pricing/accept', {
      items: [{ productId: a.id, tierId: std, unitPriceCents: -5 }],
    })
    expect(negative.status).toBe(400)
    expect(fields(negative.body)).toEqual(['items.0.unitPriceCents'])
  })
})
