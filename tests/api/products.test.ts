import { createHash } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { costPerBarForRecipes } from '@server/modules/recipes/recipe-cost.service'
import { DEMO_PRODUCTS, DEMO_RECIPES } from '../../seeders/demo/catalogue'
import { ApiClient, clientAs } from '@tests/factories/api-client'
import type { DemoCaller } from '@tests/factories/api-client'

const app = createApp({ pruneSessions: false })

type Detail = { field: string; message: string }
const fields = (body: { error?: { details?: Detail[] } }) =>
  (body.error?.details ?? []).map((d) => d.field).sort()

// A real 1×1 PNG, and a PNG signature padded past the 2 MB limit.
const PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==',
  'base64',
)
const JPEG = Buffer.concat([
  Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10]),
  Buffer.from('JFIF\0 stand-in body'),
])
const WEBP = Buffer.concat([
  Buffer.from('RIFF'),
  Buffer.from([0x1a, 0, 0, 0]),
  Buffer.from('WEBPVP8 stand-in body'),
])
const TOO_BIG = Buffer.concat([PNG, Buffer.alloc(2 * 1024 * 1024 + 1 - PNG.length + 1, 0)])

let owner: ApiClient
let recipeIds: Map<string, number>
let seq = 0
/** A SKU no other test in this file uses. */
const sku = (stem = 'T') =>
  `${stem}${(++seq).toString().padStart(3, '0')}-${Date.now().toString(36).slice(-4).toUpperCase()}`

function productBody(overrides: Record<string, unknown> = {}) {
  return {
    sku: sku(),
    name: 'Test bar',
    scentNotes: 'Green tea',
    description: 'A bar made for a test.',
    recipeId: recipeIds.get('Lavender classic'),
    netWeightG: 113,
    cutWeightG: 130,
    casePack: 12,
    msrpCents: 1000,
    gtin: null,
    active: true,
    ...overrides,
  }
}

async function newProduct(overrides: Record<string, unknown> = {}) {
  const r = await owner.post('/api/products', productBody(overrides))
  expect(r.status, JSON.stringify(r.body)).toBe(201)
  return r.body.product as { id: number; sku: string; [k: string]: unknown }
}

async function demoProduct(skuCode: string) {
  const r = await owner.get('/api/products').expect(200)
  return (r.body.items as { id: number; sku: string; [k: string]: unknown }[]).find((p) => p.sku === skuCode)!
}

beforeAll(async () => {
  owner = await clientAs(app, 'owner')
  const r = await owner.get('/api/products/recipe-options').expect(200)
  recipeIds = new Map((r.body.items as { id: number; name: string }[]).map((x) => [x.name, x.id]))
})

const NOT_OWNERS: DemoCaller[] = ['packer', 'buyerA']

describe('products: who may', () => {
  const routes: [string, string, unknown?][] = [
    ['get', '/api/products'],
    ['get', '/api/products/recipe-options'],
    ['get', '/api/products/1'],
    ['post', '/api/products', {}],
    ['patch', '/api/products/1', { name: 'X' }],
    ['post', '/api/products/1/photo'],
    ['delete', '/api/products/1/photo'],
    ['get', '/api/products/1/declaration'],
    ['post', '/api/products/1/declaration', { text: 'Sodium Olivate' }],
  ]

  it.each(routes)('%s %s answers 401 signed out', async (method, url, payload) => {
    const c = new ApiClient(app)
    const r =
      method === 'get'
        ? await c.get(url)
        : await (c[method as 'post'] as ApiClient['post']).call(c, url, payload)
    expect(r.status).toBe(401)
  })

  it.each(NOT_OWNERS.flatMap((who) => routes.map(([m, u, b]) => [who, m, u, b] as const)))(
    '%s: %s %s answers 403',
    async (who, method, url, payload) => {
      const c = await clientAs(app, who)
      const r =
        method === 'get'
          ? await c.get(url)
          : await (c[method as 'post'] as ApiClient['post']).call(c, url, payload)
      expect(r.status).toBe(403)
      expect(r.body.error.code).toBe('forbidden')
    },
  )
})

describe('GET /api/products', () => {
  it('lists every demo product with its recipe, cost per bar and price break counts', async () => {
    const r = await owner.get('/api/products').expect(200)
    const items = r.body.items as {
      sku: string
      recipeName: string
      recipeId: number
      costPerBarCents: number
      cutWeightG: number
      priceBreakCount: number
      pricedTierCount: number
      active: boolean
      photo: unknown
    }[]
    for (const demo of DEMO_PRODUCTS) {
      const p = items.find((i) => i.sku === demo.sku)
      expect(p, demo.sku).toBeDefined()
      expect(p!.recipeName).toBe(demo.recipe)
      expect(p!.active).toBe(true)
      expect(p!.photo).toBeNull()
      const breaks = Object.values(demo.prices).reduce((n, list) => n + list.length, 0)
      expect(p!.priceBreakCount).toBe(breaks)
      expect(p!.pricedTierCount).toBe(3)
    }
    // The cost is the recipe's (recipe-cost.service) for a bar of the recipe's weight, and in
    // proportion to the cut weight for a bar cut to another size (physical-units allocation, common practice).
    const costs = await costPerBarForRecipes([...new Set(items.map((i) => i.recipeId))])
    for (const p of items.filter((i) => DEMO_PRODUCTS.some((d) => d.sku === i.sku))) {
      const recipe = DEMO_RECIPES.find((x) => x.name === p.recipeName)!
      const recipeCost = costs.get(p.recipeId)!.costPerBarCents
      const expected = Math.round((recipeCost * p.cutWeightG) / recipe.barWeightG)
      expect(p.costPerBarCents, p.sku).toBe(expected)
    }
    const lav = items.find((i) => i.sku === 'LAV')!
    const mini = items.find((i) => i.sku === 'LAV-MINI')!
    expect(lav.costPerBarCents).toBe(costs.get(lav.recipeId)!.costPerBarCents)
    expect(mini.costPerBarCents).toBe(Math.round(lav.costPerBarCents / 2)) // 65 g of a 130 g bar
  })

  it('gives the recipes a product can be made from', async () => {
    const r = await owner.get('/api/products/recipe-options').expect(200)
    const names = (r.body.items as { name: string }[]).map((x) => x.name)
    for (const recipe of DEMO_RECIPES) expect(names).toContain(recipe.name)
  })
})

describe('GET /api/products/:id', () => {
  it('answers one product', async () => {
    const p = await newProduct()
    const r = await owner.get(`/api/products/${p.id}`).expect(200)
    expect(r.body.product).toMatchObject({
      id: p.id,
      sku: p.sku,
      recipeName: 'Lavender classic',
      casePack: 12,
    })
  })
  it('answers 404 for an unknown id and 400 for a malformed one', async () => {
    expect((await owner.get('/api/products/999999')).status).toBe(404)
    const r = await owner.get('/api/products/abc')
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['params.id'])
  })
})

describe('POST /api/products', () => {
  it('creates a product (201) with every field, and a valid GTIN (GS1 worked example 629104150021 → 3)', async () => {
    const body = productBody({ gtin: '6291041500213', scentNotes: '  ', description: '' })
    const r = await owner.post('/api/products', body)
    expect(r.status).toBe(201)
    expect(r.body.product).toMatchObject({
      sku: body.sku,
      name: 'Test bar',
      scentNotes: null,
      description: null,
      gtin: '6291041500213',
      netWeightG: 113,
      cutWeightG: 130,
      msrpCents: 1000,
      active: true,
      priceBreakCount: 0,
    })
    expect(typeof r.body.product.costPerBarCents).toBe('number')
  })

  it.each([
    ['lower case', 'lav'],
    ['a double hyphen', 'LAV--MINI'],
    ['a leading hyphen', '-LAV'],
    ['a trailing hyphen', 'LAV-'],
    ['a space', 'LAV MINI'],
    ['13 characters', 'ABCDEFGHIJKLM'],
    ['nothing', ''],
  ])('refuses a SKU with %s (400 sku)', async (_label, bad) => {
    const r = await owner.post('/api/products', productBody({ sku: bad }))
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['sku'])
  })

  it('accepts a 12-character SKU with single inner hyphens', async () => {
    const code = `A1-B2-${Date.now().toString(36).slice(-6).toUpperCase()}`.slice(0, 12)
    const r = await owner.post('/api/products', productBody({ sku: code }))
    expect(r.status, JSON.stringify(r.body)).toBe(201)
  })

  it('refuses a duplicate SKU with 409 on the field sku', async () => {
    const r = await owner.post('/api/products', productBody({ sku: 'LAV' }))
    expect(r.status).toBe(409)
    expect(r.body.error.code).toBe('sku_taken')
    expect(fields(r.body)).toEqual(['sku'])
  })

  it('refuses a GTIN whose check digit is wrong, saying so (GS1 General Specifications)', async () => {
    // 629104150021 has check digit 3 on GS1's own calculator; 4 is wrong.
    const r = await owner.post('/api/products', productBody({ gtin: '6291041500214' }))
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['gtin'])
    expect(r.body.error.details[0].message).toMatch(/check digit is wrong.*3/)
  })

  it.each([
    ['letters', '62910415002A'],
    ['the wrong length', '123456789'],
  ])('refuses a GTIN with %s (400 gtin)', async (_l, bad) => {
    const r = await owner.post('/api/products', productBody({ gtin: bad }))
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['gtin'])
  })

  it('refuses a GTIN another product has (409 gtin)', async () => {
    const r = await owner.post('/api/products', productBody({ gtin: DEMO_PRODUCTS[0]!.gtin }))
    expect(r.status).toBe(409)
    expect(fields(r.body)).toEqual(['gtin'])
  })

  it('refuses a net weight over the cut weight (400 netWeightG)', async () => {
    const r = await owner.post('/api/products', productBody({ netWeightG: 131, cutWeightG: 130 }))
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['netWeightG'])
  })

  it.each([0, 501, 2.5])('refuses a case pack of %s (400 casePack)', async (casePack) => {
    const r = await owner.post('/api/products', productBody({ casePack }))
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['casePack'])
  })

  it('refuses an unknown recipe (400 recipeId) and a negative MSRP (400 msrpCents)', async () => {
    const a = await owner.post('/api/products', productBody({ recipeId: 999999 }))
    expect(a.status).toBe(400)
    expect(fields(a.body)).toEqual(['recipeId'])
    const b = await owner.post('/api/products', productBody({ msrpCents: -1 }))
    expect(b.status).toBe(400)
    expect(fields(b.body)).toEqual(['msrpCents'])
  })

  it('reports every problem at once and creates nothing', async () => {
    const before = (await owner.get('/api/products')).body.items.length
    const r = await owner.post('/api/products', { sku: 'bad sku', casePack: 0, gtin: '123' })
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(
      ['casePack', 'cutWeightG', 'gtin', 'msrpCents', 'name', 'netWeightG', 'recipeId', 'sku'].sort(),
    )
    expect((await owner.get('/api/products')).body.items.length).toBe(before)
  })
})

describe('PATCH /api/products/:id', () => {
  it('changes the fields sent and keeps the others', async () => {
    const p = await newProduct()
    const r = await owner.patch(`/api/products/${p.id}`, { name: 'Renamed bar', active: false, casePack: 6 })
    expect(r.status).toBe(200)
    expect(r.body.product).toMatchObject({
      name: 'Renamed bar',
      active: false,
      casePack: 6,
      sku: p.sku,
      netWeightG: 113,
    })
  })

  it('checks the net weight against the stored cut weight (400 netWeightG, nothing saved)', async () => {
    const p = await newProduct()
    const r = await owner.patch(`/api/products/${p.id}`, { netWeightG: 200, name: 'Should not stick' })
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['netWeightG'])
    const after = await owner.get(`/api/products/${p.id}`)
    expect(after.body.product).toMatchObject({ netWeightG: 113, name: 'Test bar' })
  })

  it('refuses another product’s SKU (409 sku) and a wrong GTIN (400 gtin)', async () => {
    const p = await newProduct()
    const a = await owner.patch(`/api/products/${p.id}`, { sku: 'CDR' })
    expect(a.status).toBe(409)
    expect(fields(a.body)).toEqual(['sku'])
    const b = await owner.patch(`/api/products/${p.id}`, { gtin: '0201234000014' })
    expect(b.status).toBe(400)
    expect(fields(b.body)).toEqual(['gtin'])
  })

  it('answers 404 for an unknown product', async () => {
    expect((await owner.patch('/api/products/999999', { name: 'Nobody' })).status).toBe(404)
  })
})

describe('product photos', () => {
  const upload = async (
    c: ApiClient,
    id: number,
    data: Buffer,
    filename: string,
    contentType: string,
    field = 'photo',
  ) =>
    c.agent
      .post(`/api/products/${id}/photo`)
      .set('X-CSRF-Token', await c.token())
      .attach(field, data, { filename, contentType })

  it('stores a PNG with its SHA-256 and serves it to any signed-in person with safe headers', async () => {
    const p = await newProduct()
    const r = await upload(owner, p.id, PNG, 'bar photo.png', 'image/png')
    expect(r.status, JSON.stringify(r.body)).toBe(200)
    const sha = createHash('sha256').update(PNG).digest('hex')
    expect(r.body.product.photo).toMatchObject({
      sha256: sha,
      contentType: 'image/png',
      sizeBytes: PNG.length,
    })
    for (const who of ['buyerA', 'packer', 'owner'] as const) {
      const c = await clientAs(app, who)
      const g = await c
        .get(r.body.product.photo.url)
        .buffer(true)
        .parse((res, cb) => {
          const chunks: Buffer[] = []
          res.on('data', (d: Buffer) => chunks.push(d))
          res.on('end', () => cb(null, Buffer.concat(chunks)))
        })
      expect(g.status).toBe(200)
      expect(g.headers['content-type']).toBe('image/png')
      expect(g.headers['x-content-type-options']).toBe('nosniff')
      expect(g.headers['content-disposition']).toBe('inline; filename="bar-photo.png"')
      expect(g.headers.etag).toBe(`"${sha}"`)
      expect(Buffer.compare(g.body as Buffer, PNG)).toBe(0)
      const again = await c.get(`/api/products/${p.id}/photo`).set('If-None-Match', `"${sha}"`)
      expect(again.status).toBe(304)
    }
    expect((await new ApiClient(app).get(`/api/products/${p.id}/photo`)).status).toBe(401)
  })

  it('goes by the bytes, not the name or the declared type: a JPEG called .txt is a JPEG, WebP is accepted', async () => {
    const p = await newProduct()
    const j = await upload(owner, p.id, JPEG, 'notes.txt', 'text/plain')
    expect(j.status).toBe(200)
    expect(j.body.product.photo).toMatchObject({ contentType: 'image/jpeg', filename: 'notes.jpg' })
    const w = await upload(owner, p.id, WEBP, 'x.webp', 'application/octet-stream')
    expect(w.status).toBe(200)
    expect(w.body.product.photo.contentType).toBe('image/webp')
    const g = await owner.get(`/api/products/${p.id}/photo`)
    expect(g.headers['content-type']).toBe('image/webp')
  })

  it('refuses a text file renamed .png (400 photo) and keeps the old photo', async () => {
    const p = await newProduct()
    await upload(owner, p.id, PNG, 'good.png', 'image/png').then((r) => expect(r.status).toBe(200))
    const r = await upload(
      owner,
      p.id,
      Buffer.from('just some text, not an image\n'),
      'evil.png',
      'image/png',
    )
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['photo'])
    const g = await owner.get(`/api/products/${p.id}`)
    expect(g.body.product.photo.filename).toBe('good.png')
  })

  it('refuses a photo over 2 MB with 413', async () => {
    const p = await newProduct()
    const r = await upload(owner, p.id, TOO_BIG, 'huge.png', 'image/png')
    expect(r.status).toBe(413)
    expect(fields(r.body)).toEqual(['photo'])
    expect((await owner.get(`/api/products/${p.id}`)).body.product.photo).toBeNull()
  })

  it('refuses a request without a file, or with the file in another field (400 photo)', async () => {
    const p = await newProduct()
    const none = await owner.post(`/api/products/${p.id}/photo`, {})
    expect(none.status).toBe(400)
    expect(fields(none.body)).toEqual(['photo'])
    const other = await upload(owner, p.id, PNG, 'a.png', 'image/png', 'image')
    expect(other.status).toBe(400)
    expect(fields(other.body)).toEqual(['photo'])
  })

  it('makes a hostile file name safe for the Content-Disposition header', async () => {
    const p = await newProduct()
    const r = await upload(owner, p.id, PNG, '../../"evil"\r\nname;.exe.png', 'image/png')
    expect(r.status).toBe(200)
    const g = await owner.get(`/api/products/${p.id}/photo`)
    expect(g.headers['content-disposition']).toMatch(/^inline; filename="[A-Za-z0-9._-]+\.png"$/)
    expect(g.headers['content-disposition']).not.toMatch(/\.\.|"evil"|\\r|;\./)
  })

  it('removes a photo; the photo then answers 404; an unknown product answers 404', async () => {
    const p = await newProduct()
    await upload(owner, p.id, PNG, 'a.png', 'image/png')
    const r = await owner.delete(`/api/products/${p.id}/photo`)
    expect(r.status).toBe(200)
    expect(r.body.product.photo).toBeNull()
    expect((await owner.get(`/api/products/${p.id}/photo`)).status).toBe(404)
    expect((await upload(owner, 999999, PNG, 'a.png', 'image/png')).status).toBe(404)
  })
})

describe('ingredient declaration', () => {
  it('lists the Lavender classic bar in descending order of weight as added (21 CFR 701.3(a))', async () => {
    const lav = await demoProduct('LAV')
    const r = await owner.get(`/api/products/${lav.id}/declaration`)
    expect(r.status).toBe(200)
    const d = r.body.declaration as {
      draft: { text: string; entries: { label: string; grams: number; pct: number; minor: boolean }[] }
      oilWeightG: number
      netWeightOz: number
      confirmed: unknown
    }
    // 1100 g of oils at 40/25/20/10/5 %: olive 440, coconut 275, palm 220, shea 110, castor 55 g;
    // lavender 4 % = 44 g; sodium lactate 10 g per kg = 11 g (hand calculation from the recipe).
    expect(d.oilWeightG).toBe(1100)
    const grams = Object.fromEntries(d.draft.entries.map((e) => [e.label, e.grams]))
    expect(grams['Sodium Olivate']).toBeCloseTo(440, 9)
    expect(grams['Sodium Cocoate']).toBeCloseTo(275, 9)
    expect(grams['Sodium Palmate']).toBeCloseTo(220, 9)
    expect(grams['Sodium Shea Butterate']).toBeCloseTo(110, 9)
    expect(grams['Sodium Castorate']).toBeCloseTo(55, 9)
    expect(grams.Fragrance).toBeCloseTo(44, 9)
    expect(grams['Sodium Lactate']).toBeCloseTo(11, 9)
    // Water at 33 % lye concentration is about twice the lye: between olive and coconut.
    expect(grams.Aqua).toBeGreaterThan(275)
    expect(grams.Aqua).toBeLessThan(440)
    // 21 CFR 701.3(a): descending order of predominance; 701.3(f) (memory) and EU 1223/2009
    // Art. 19(1)(g): 1 % or less may follow the rest.
    const major = d.draft.entries.filter((e) => !e.minor)
    const minor = d.draft.entries.filter((e) => e.minor)
    for (let i = 1; i < major.length; i++) expect(major[i]!.grams).toBeLessThanOrEqual(major[i - 1]!.grams)
    expect(d.draft.entries.slice(major.length)).toEqual(minor)
    expect(minor.map((e) => e.label)).toEqual(['Sodium Lactate']) // 11 g of 1471 g is under 1 %
    expect(d.draft.text).toBe(
      'Sodium Olivate, Aqua, Sodium Cocoate, Sodium Palmate, Sodium Shea Butterate, Sodium Castorate, Fragrance, Sodium Lactate',
    )
    // Saponified names stand for the oil and the lye that reacted with it: no separate NaOH.
    expect(d.draft.text).not.toMatch(/Sodium Hydroxide/)
    // 113 g ÷ 28.349523125 g/oz (NIST Handbook 44, App. C)
    expect(d.netWeightOz).toBeCloseTo(113 / 28.349523125, 12)
    expect(d.confirmed).toBeNull()
  })

  it('keeps an oil without a saponified name under its INCI, with its share of the lye, and says so', async () => {
    // Rose clay: olive 50, coconut 25, cocoa butter 20, castor 5 %; no saponified name for cocoa butter.
    const rsc = await demoProduct('RSC')
    const r = await owner.get(`/api/products/${rsc.id}/declaration`).expect(200)
    const d = r.body.declaration as {
      draft: { text: string; entries: { label: string; grams: number }[] }
      notes: string[]
    }
    const labels = d.draft.entries.map((e) => e.label)
    expect(labels).toContain('Theobroma Cacao (Cocoa) Seed Butter')
    expect(labels).toContain('Sodium Hydroxide')
    const cocoa = d.draft.entries.find((e) => e.label === 'Theobroma Cacao (Cocoa) Seed Butter')!
    const naoh = d.draft.entries.find((e) => e.label === 'Sodium Hydroxide')!
    expect(cocoa.grams).toBeCloseTo(220, 9)
    // The NaOH share of 220 g of cocoa butter is far less than the butter itself, and more than 0.
    expect(naoh.grams).toBeGreaterThan(0)
    expect(naoh.grams).toBeLessThan(cocoa.grams / 3)
    expect(d.notes.join(' ')).toMatch(/Cocoa butter: no saponified INCI name/)
    expect(labels.filter((l) => l === 'Fragrance')).toHaveLength(1)
  })

  it('confirms the text with the date, and shows it afterwards', async () => {
    const p = await newProduct()
    const draft = (await owner.get(`/api/products/${p.id}/declaration`)).body.declaration.draft.text as string
    const r = await owner.post(`/api/products/${p.id}/declaration`, { text: `  ${draft}  ` })
    expect(r.status).toBe(200)
    expect(r.body.declaration.confirmed.text).toBe(draft)
    expect(Date.now() - Date.parse(r.body.declaration.confirmed.confirmedAt)).toBeLessThan(60_000)
    const again = await owner.get(`/api/products/${p.id}/declaration`).expect(200)
    expect(again.body.declaration.confirmed.text).toBe(draft)
    const product = await owner.get(`/api/products/${p.id}`).expect(200)
    expect(product.body.product.declarationConfirmedAt).toBe(r.body.declaration.confirmed.confirmedAt)
  })

  it('refuses an empty text (400 text) and an unknown product (404)', async () => {
    const p = await newProduct()
    const r = await owner.post(`/api/products/${p.id}/declaration`, { text: '   ' })
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['text'])
    expect((await owner.get(`/api/products/${p.id}/declaration`)).body.declaration.confirmed).toBeNull()
    expect((await owner.get('/api/products/999999/declaration')).status).toBe(404)
    expect((await owner.post('/api/products/999999/declaration', { text: 'Aqua' })).status).toBe(404)
  })
})
