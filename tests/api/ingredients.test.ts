import { randomBytes } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import type { ApiClient } from '@tests/factories/api-client'
import { clientAs } from '@tests/factories/api-client'
import { addDays, isoToday } from '@shared/domain/dates/dates'
import { COST_RULE } from '@shared/schemas/ingredients'
import type { IngredientDetail, IngredientRow, PurchaseRow } from '@shared/schemas/ingredients'

const app = createApp({ pruneSessions: false })

// SAP(NaOH) = SAP(KOH) × M(NaOH)/M(KOH) = × 0.712888 (IUPAC/CIAAW 2021 atomic weights, REFERENCES.md);
// the trade's ÷ 1.403 is 0.018 % off, so checks allow 2 × 10⁻⁴ relative.
const CIAAW_FACTOR = 0.712888
const TOLERANCE = 2e-4
const relErr = (a: number, b: number) => Math.abs(a - b) / Math.abs(b)

let owner: ApiClient
let packer: ApiClient
let buyer: ApiClient
let anon: ApiClient

beforeAll(async () => {
  ;[owner, packer, buyer, anon] = await Promise.all([
    clientAs(app, 'owner'),
    clientAs(app, 'packer'),
    clientAs(app, 'buyerA'),
    clientAs(app, 'anon'),
  ])
})

const tag = () => randomBytes(3).toString('hex')
const counts = async () => {
  const [r] = await sequelize.query<{ ingredients: number; lots: number }>(
    'SELECT (SELECT count(*) FROM ingredients)::int AS ingredients, (SELECT count(*) FROM ingredient_lots)::int AS lots',
    { type: QueryTypes.SELECT },
  )
  return r!
}
const fields = (body: { error: { details?: { field: string }[] } }) =>
  (body.error.details ?? []).map((d) => d.field)

async function createOil(extra: Record<string, unknown> = {}) {
  const r = await owner.post('/api/ingredients', {
    name: `Test oil ${tag()}`,
    kind: 'oil',
    sapKoh: 190,
    ...extra,
  })
  expect(r.status).toBe(201)
  return r.body.ingredient as IngredientRow
}

async function buy(
  ingredientId: number,
  quantity: number,
  unit: string,
  costCents: number,
  freightCents = 0,
  receivedOn = '2026-10-01',
) {
  const r = await owner.post('/api/purchases', {
    ingredientId,
    supplier: 'Test Supply Co',
    receivedOn,
    quantity,
    unit,
    costCents,
    freightCents,
  })
  expect(r.status).toBe(201)
  return r.body.purchase as { id: number }
}

// Every route of the module, for the signed-out and wrong-role checks.
const routes: [method: 'get' | 'post' | 'patch', url: string, body?: unknown][] = [
  ['get', '/api/ingredients'],
  ['post', '/api/ingredients', { name: 'Nope', kind: 'liquid' }],
  ['get', '/api/ingredients/1'],
  ['patch', '/api/ingredients/1', { name: 'Nope' }],
  ['post', '/api/ingredients/1/archive'],
  ['post', '/api/ingredients/1/restore'],
]

describe('who may use /api/ingredients', () => {
  it.each(routes)('%s %s answers 401 when signed out', async (method, url, body) => {
    const before = await counts()
    const r = method === 'get' ? await anon.get(url) : await anon[method](url, body)
    expect(r.status).toBe(401)
    expect(r.body.error.code).toBe('unauthorized')
    expect(await counts()).toEqual(before)
  })

  it.each(routes)('%s %s answers 403 to the packer and to a shop buyer', async (method, url, body) => {
    const before = await counts()
    for (const who of [packer, buyer]) {
      const r = method === 'get' ? await who.get(url) : await who[method](url, body)
      expect(r.status).toBe(403)
      expect(r.body.error.code).toBe('forbidden')
    }
    expect(await counts()).toEqual(before)
  })
})

describe('GET /api/ingredients', () => {
  it('lists the demo ingredients with the contract fields', async () => {
    const r = await owner.get('/api/ingredients').expect(200)
    const items = r.body.items as IngredientRow[]
    expect(r.body.costRule).toBe(COST_RULE)
    expect(items.length).toBeGreaterThanOrEqual(21)
    for (const i of items) {
      for (const key of [
        'id',
        'name',
        'kind',
        'inci',
        'sapNaoh',
        'sapKoh',
        'purityPct',
        'maxUsagePct',
        'vanillinPct',
        'unit',
        'reorderLevel',
        'archived',
        'onHand',
        'currentUnitCost',
        'lots',
      ]) {
        expect(i).toHaveProperty(key)
      }
      expect(i.archived).toBe(false)
    }
    const lye = items.find((i) => i.name === 'Sodium hydroxide')!
    expect(lye).toMatchObject({ kind: 'lye', purityPct: 99, sapNaoh: null, sapKoh: null, unit: 'g' })
    const box = items.find((i) => i.name === 'Kraft bar box')!
    expect(box).toMatchObject({ kind: 'packaging', unit: 'each' })
    // the demo's first delivery, plus any restock a later part of the scenario records
    expect(box.lots).toBeGreaterThanOrEqual(1)
    // 1000 boxes for $210.00: 21 ¢ each however many are left (hand calculation)
    if (box.onHand > 0) expect(box.currentUnitCost).toBeCloseTo(21, 10)
    const lavender = items.find((i) => i.name === 'Lavender essential oil')!
    expect(lavender).toMatchObject({ kind: 'fragrance', maxUsagePct: 4.5, vanillinPct: 0, sapKoh: null })
  })

  it('gives every oil SAP(NaOH) = SAP(KOH) × 0.712888 within 2e-4 (IUPAC/CIAAW 2021, REFERENCES.md)', async () => {
    const items = (await owner.get('/api/ingredients?kind=oil').expect(200)).body.items as IngredientRow[]
    expect(items.length).toBeGreaterThanOrEqual(6)
    for (const oil of items) {
      expect(oil.kind).toBe('oil')
      expect(typeof oil.sapKoh).toBe('number')
      expect(typeof oil.sapNaoh).toBe('number')
      expect(relErr(oil.sapNaoh!, (oil.sapKoh! / 1000) * CIAAW_FACTOR)).toBeLessThan(TOLERANCE)
    }
    // Olive oil at 190 mg KOH/g, the midpoint of Codex CXS 33-1981's 184–196 (from memory): 0.13545 g NaOH/g
    const olive = items.find((i) => i.name === 'Olive oil')!
    expect(olive.sapKoh).toBe(190)
    expect(relErr(olive.sapNaoh!, 0.13544872)).toBeLessThan(TOLERANCE)
    // Coconut 256.5 (midpoint of Codex CXS 210-1999's 248–265) → 0.18285577 g NaOH/g
    const coconut = items.find((i) => i.name === 'Coconut oil')!
    expect(relErr(coconut.sapNaoh!, 0.18285577)).toBeLessThan(TOLERANCE)
  })

  it('stores the demo purchases converted to base units (NIST Handbook 44 App. C; hand calculation)', async () => {
    const lots = (await owner.get('/api/purchases').expect(200)).body.items as PurchaseRow[]
    const lot = (code: string) => lots.find((l) => l.supplierLotCode === code)!
    // 11 lb of shea = 11 × 453.59237 g = 4989.51607 g, stored to 0.1 mg; $64.50 over it
    expect(lot('NSS-SB-0912')).toMatchObject({
      enteredQuantity: 11,
      enteredUnit: 'lb',
      costCents: 6450,
      freightCents: 0,
    })
    expect(lot('NSS-SB-0912').quantity).toBeCloseTo(4989.51607, 3)
    expect(lot('NSS-SB-0912').unitCost).toBeCloseTo(6450 / 4989.5161, 8)
    // 16 oz of lavender oil = 453.59237 g exactly; 20 kg of olive oil for $168.00 = 0.84 ¢/g
    expect(lot('HA-LAV-2609').quantity).toBeCloseTo(453.59237, 3)
    expect(lot('GOT-2608-114').quantity).toBe(20000)
    expect(lot('GOT-2608-114').unitCost).toBeCloseTo(0.84, 10)
  })

  it('reports every ingredient’s on hand and weighted current cost as the lots give them (hand calculation in SQL)', async () => {
    const items = (await owner.get('/api/ingredients').expect(200)).body.items as IngredientRow[]
    // The same rule worked out independently: Σ remaining × (cost + freight) ÷ quantity ÷ Σ remaining.
    const expected = await sequelize.query<{
      id: number
      on_hand: string
      cost: string | null
      lots: number
    }>(
      `SELECT i.id, COALESCE(sum(l.remaining), 0) AS on_hand, count(l.id)::int AS lots,
              sum(l.remaining * (l.cost_cents + l.freight_cents) / l.quantity) FILTER (WHERE l.remaining > 0)
                / NULLIF(sum(l.remaining) FILTER (WHERE l.remaining > 0), 0) AS cost
         FROM ingredients i LEFT JOIN ingredient_lots l ON l.ingredient_id = i.id
        WHERE i.archived_at IS NULL GROUP BY i.id`,
      { type: QueryTypes.SELECT },
    )
    expect(items.length).toBe(expected.length)
    for (const e of expected) {
      const item = items.find((i) => i.id === e.id)!
      expect(item.lots).toBe(e.lots)
      expect(item.onHand).toBeCloseTo(Number(e.on_hand), 4)
      if (e.cost === null) expect(item.currentUnitCost).toBeNull()
      else expect(item.currentUnitCost).toBeCloseTo(Number(e.cost), 8)
    }
  })

  it('filters by kind and shows archived ingredients only when asked', async () => {
    const oil = await createOil()
    await owner.post(`/api/ingredients/${oil.id}/archive`).then((r) => expect(r.status).toBe(200))
    const fragrances = (await owner.get('/api/ingredients?kind=fragrance').expect(200)).body
      .items as IngredientRow[]
    expect(fragrances.length).toBeGreaterThanOrEqual(5)
    expect(fragrances.every((i) => i.kind === 'fragrance')).toBe(true)
    const active = (await owner.get('/api/ingredients?kind=oil').expect(200)).body.items as IngredientRow[]
    expect(active.some((i) => i.id === oil.id)).toBe(false)
    const all = (await owner.get('/api/ingredients?kind=oil&includeArchived=true').expect(200)).body
      .items as IngredientRow[]
    expect(all.find((i) => i.id === oil.id)).toMatchObject({ archived: true })
  })

  it.each([
    ['?kind=soapstone', 'query.kind'],
    ['?includeArchived=perhaps', 'query.includeArchived'],
  ])('answers 400 to %s with the field %s', async (qs, field) => {
    const r = await owner.get(`/api/ingredients${qs}`)
    expect(r.status).toBe(400)
    expect(r.body.error.code).toBe('invalid_input')
    expect(fields(r.body)).toEqual([field])
  })
})

describe('POST /api/ingredients', () => {
  it('creates an oil from its KOH value and derives NaOH with the CIAAW factor (REFERENCES.md)', async () => {
    const name = `Sunflower oil, high oleic ${tag()}`
    // 188 mg KOH/g lies inside Codex CXS 210-1999's 182–194 for high-oleic sunflower
    const r = await owner.post('/api/ingredients', {
      name,
      kind: 'oil',
      inci: 'Helianthus Annuus (Sunflower) Seed Oil',
      sapKoh: 188,
    })
    expect(r.status).toBe(201)
    const i = r.body.ingredient as IngredientRow
    expect(i).toMatchObject({
      name,
      kind: 'oil',
      sapKoh: 188,
      unit: 'g',
      onHand: 0,
      currentUnitCost: null,
      lots: 0,
      archived: false,
      purityPct: null,
    })
    expect(relErr(i.sapNaoh!, 0.188 * CIAAW_FACTOR)).toBeLessThan(TOLERANCE)
    const listed = (
      (await owner.get('/api/ingredients?kind=oil').expect(200)).body.items as IngredientRow[]
    ).find((x) => x.id === i.id)
    expect(listed).toMatchObject({ sapKoh: 188, sapNaoh: i.sapNaoh })
  })

  it('creates an oil from its NaOH value alone and derives KOH (IUPAC/CIAAW 2021)', async () => {
    // 0.1345 g NaOH/g ÷ 0.712888 × 1000 = 188.67 mg KOH/g
    const r = await owner.post('/api/ingredients', { name: `Canola ${tag()}`, kind: 'oil', sapNaoh: 0.1345 })
    expect(r.status).toBe(201)
    expect(r.body.ingredient.sapNaoh).toBeCloseTo(0.1345, 7)
    expect(relErr(r.body.ingredient.sapKoh, 188.67)).toBeLessThan(TOLERANCE)
  })

  it('takes both SAP values when they agree, keeping KOH and deriving NaOH from it', async () => {
    // 0.1355 is 190 ÷ 1.403 rounded, the trade's shortcut (REFERENCES.md)
    const r = await owner.post('/api/ingredients', {
      name: `Olive pomace ${tag()}`,
      kind: 'oil',
      sapKoh: 190,
      sapNaoh: 0.1355,
    })
    expect(r.status).toBe(201)
    expect(r.body.ingredient.sapKoh).toBe(190)
    expect(relErr(r.body.ingredient.sapNaoh, 0.19 * CIAAW_FACTOR)).toBeLessThan(1e-6)
  })

  it.each([
    [
      'lye without a purity gets 100 %',
      { kind: 'lye', inci: 'Potassium Hydroxide' },
      { purityPct: 100, unit: 'g' },
    ],
    ['lye with its purity', { kind: 'lye', purityPct: 90 }, { purityPct: 90 }],
    [
      'a fragrance with its IFRA limit and vanillin',
      { kind: 'fragrance', maxUsagePct: 3.2, vanillinPct: 0.15 },
      { maxUsagePct: 3.2, vanillinPct: 0.15, sapKoh: null },
    ],
    [
      'packaging counted in items',
      { kind: 'packaging', reorderLevel: 200 },
      { unit: 'each', reorderLevel: 200, belowReorder: true },
    ],
    [
      'a liquid from form text',
      { kind: 'liquid', reorderLevel: '5000', notes: '  Filtered  ' },
      { reorderLevel: 5000, notes: 'Filtered' },
    ],
  ])('creates %s', async (_label, extra, expected) => {
    const r = await owner.post('/api/ingredients', { name: `Item ${tag()}`, ...extra })
    expect(r.status).toBe(201)
    expect(r.body.ingredient).toMatchObject(expected)
  })

  it.each<[string, Record<string, unknown>, string]>([
    ['an oil without a SAP value', { kind: 'oil' }, 'sapKoh'],
    ['a SAP value for a fragrance', { kind: 'fragrance', sapKoh: 190 }, 'sapKoh'],
    ['a NaOH SAP value for an additive', { kind: 'additive', sapNaoh: 0.13 }, 'sapNaoh'],
    ['a KOH value typed as NaOH', { kind: 'oil', sapNaoh: 190 }, 'sapNaoh'],
    ['a NaOH value typed as KOH', { kind: 'oil', sapKoh: 0.135 }, 'sapKoh'],
    ['a SAP value out of range', { kind: 'oil', sapKoh: 1900 }, 'sapKoh'],
    ['a negative SAP value', { kind: 'oil', sapKoh: -190 }, 'sapKoh'],
    ['two SAP values that disagree', { kind: 'oil', sapKoh: 190, sapNaoh: 0.18 }, 'sapNaoh'],
    ['a SAP value that is not a number', { kind: 'oil', sapKoh: 'lots' }, 'sapKoh'],
    ['a purity for an oil', { kind: 'oil', sapKoh: 190, purityPct: 99 }, 'purityPct'],
    ['a lye purity under 50 %', { kind: 'lye', purityPct: 40 }, 'purityPct'],
    ['a maximum usage for a colourant', { kind: 'colourant', maxUsagePct: 2 }, 'maxUsagePct'],
    ['a maximum usage of 0 %', { kind: 'fragrance', maxUsagePct: 0 }, 'maxUsagePct'],
    ['a vanillin content over 100 %', { kind: 'fragrance', vanillinPct: 120 }, 'vanillinPct'],
    ['a negative reorder level', { kind: 'liquid', reorderLevel: -1 }, 'reorderLevel'],
    ['an unknown kind', { kind: 'soapstone' }, 'kind'],
    ['an INCI name over 200 characters', { kind: 'liquid', inci: 'x'.repeat(201) }, 'inci'],
  ])('answers 400 to %s, naming %s, and writes nothing', async (_label, extra, field) => {
    const before = await counts()
    const r = await owner.post('/api/ingredients', { name: `Bad ${tag()}`, ...extra })
    expect(r.status).toBe(400)
    expect(r.body.error.code).toBe('invalid_input')
    expect(fields(r.body)).toEqual([field])
    expect(r.body.error.message).toBeTruthy()
    expect(await counts()).toEqual(before)
  })

  it('answers 400 naming every missing field at once', async () => {
    const r = await owner.post('/api/ingredients', {})
    expect(r.status).toBe(400)
    expect(fields(r.body).sort()).toEqual(['kind', 'name'])
  })

  it('answers 409 on field name to a second active ingredient of the same name, in any case', async () => {
    const oil = await createOil()
    const before = await counts()
    const r = await owner.post('/api/ingredients', {
      name: `  ${oil.name.toUpperCase()} `,
      kind: 'oil',
      sapKoh: 190,
    })
    expect(r.status).toBe(409)
    expect(r.body.error.code).toBe('name_taken')
    expect(fields(r.body)).toEqual(['name'])
    expect(await counts()).toEqual(before)
  })

  it('allows the name of an archived ingredient again', async () => {
    const oil = await createOil()
    await owner.post(`/api/ingredients/${oil.id}/archive`).then((r) => expect(r.status).toBe(200))
    const r = await owner.post('/api/ingredients', { name: oil.name, kind: 'oil', sapKoh: 185 })
    expect(r.status).toBe(201)
  })
})

describe('GET /api/ingredients/:id', () => {
  it('gives the ingredient, its lots newest first, and the cost rule with the weighted average (hand calculation)', async () => {
    const oil = await createOil()
    // 10 kg for $40.00 + $10.00 freight = 0.5 ¢/g; 5 kg for $40.00 = 0.8 ¢/g
    const older = await buy(oil.id, 10, 'kg', 4000, 1000, '2026-09-01')
    const newer = await buy(oil.id, 5, 'kg', 4000, 0, '2026-10-01')
    let r = await owner.get(`/api/ingredients/${oil.id}`).expect(200)
    let detail = r.body as IngredientDetail
    expect(detail.costRule).toBe(COST_RULE)
    expect(detail.lots.map((l) => l.id)).toEqual([newer.id, older.id])
    expect(detail.lots[1]!.unitCost).toBeCloseTo(0.5, 10)
    expect(detail.ingredient).toMatchObject({ onHand: 15000, lots: 2, lotsOnHand: 2, kindLocked: true })
    // (10 000 × 0.5 + 5000 × 0.8) ÷ 15 000 = 0.6 ¢/g
    expect(detail.ingredient.currentUnitCost).toBeCloseTo(0.6, 10)

    // 8 kg of the older lot used up: (2000 × 0.5 + 5000 × 0.8) ÷ 7000 = 0.714285… ¢/g
    await sequelize.query('UPDATE ingredient_lots SET remaining = 2000 WHERE id = $1', { bind: [older.id] })
    detail = (await owner.get(`/api/ingredients/${oil.id}`).expect(200)).body
    expect(detail.ingredient.onHand).toBeCloseTo(7000, 6)
    expect(detail.ingredient.currentUnitCost).toBeCloseTo(5000 / 7000, 10)

    // all of it used: no current cost rather than 0
    await sequelize.query('UPDATE ingredient_lots SET remaining = 0 WHERE ingredient_id = $1', {
      bind: [oil.id],
    })
    r = await owner.get(`/api/ingredients/${oil.id}`).expect(200)
    expect(r.body.ingredient).toMatchObject({ onHand: 0, currentUnitCost: null, lots: 2, lotsOnHand: 0 })
  })

  it('answers 404 to an unknown id and 400 to one that is not a number', async () => {
    expect((await owner.get('/api/ingredients/999999')).status).toBe(404)
    const r = await owner.get('/api/ingredients/olive')
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['params.id'])
  })
})

describe('PATCH /api/ingredients/:id', () => {
  it('changes fields and keeps the SAP pair consistent (IUPAC/CIAAW 2021)', async () => {
    const oil = await createOil()
    const r = await owner.patch(`/api/ingredients/${oil.id}`, {
      name: `${oil.name} (organic)`,
      sapKoh: 192,
      reorderLevel: 2000,
    })
    expect(r.status).toBe(200)
    expect(r.body.ingredient).toMatchObject({
      name: `${oil.name} (organic)`,
      sapKoh: 192,
      reorderLevel: 2000,
      belowReorder: true,
    })
    expect(relErr(r.body.ingredient.sapNaoh, 0.192 * CIAAW_FACTOR)).toBeLessThan(TOLERANCE)
    const n = await owner.patch(`/api/ingredients/${oil.id}`, { sapNaoh: 0.14 })
    expect(n.body.ingredient.sapNaoh).toBeCloseTo(0.14, 7)
    expect(relErr(n.body.ingredient.sapKoh, (0.14 / CIAAW_FACTOR) * 1000)).toBeLessThan(TOLERANCE)
  })

  it('changes the kind of an unused ingredient, dropping what belongs to the old kind', async () => {
    const oil = await createOil()
    const r = await owner.patch(`/api/ingredients/${oil.id}`, { kind: 'additive' })
    expect(r.status).toBe(200)
    expect(r.body.ingredient).toMatchObject({ kind: 'additive', sapKoh: null, sapNaoh: null, unit: 'g' })
    const p = await owner.patch(`/api/ingredients/${oil.id}`, { kind: 'packaging' })
    expect(p.body.ingredient.unit).toBe('each')
  })

  it('answers 409 kind_locked on field kind once purchases exist', async () => {
    const oil = await createOil()
    await buy(oil.id, 1, 'kg', 500)
    const r = await owner.patch(`/api/ingredients/${oil.id}`, { kind: 'packaging' })
    expect(r.status).toBe(409)
    expect(r.body.error.code).toBe('kind_locked')
    expect(fields(r.body)).toEqual(['kind'])
    expect((await owner.get(`/api/ingredients/${oil.id}`)).body.ingredient.kind).toBe('oil')
  })

  it.each<[string, Record<string, unknown>, string]>([
    ['a SAP value for a fragrance', { kind: 'fragrance', sapKoh: 190 }, 'sapKoh'],
    ['taking the SAP value off an oil', { sapKoh: null, sapNaoh: null }, 'sapKoh'],
    ['an empty name', { name: '  ' }, 'name'],
    ['a purity for an oil', { purityPct: 95 }, 'purityPct'],
    ['nothing to change', {}, '(body)'],
  ])('answers 400 to %s, naming %s, and changes nothing', async (_label, patch, field) => {
    const oil = await createOil()
    const r = await owner.patch(`/api/ingredients/${oil.id}`, patch)
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual([field])
    const after = (await owner.get(`/api/ingredients/${oil.id}`)).body.ingredient
    expect(after).toMatchObject({ name: oil.name, kind: 'oil', sapKoh: 190 })
  })

  it('answers 409 on field name when renaming to another active ingredient’s name', async () => {
    const a = await createOil()
    const b = await createOil()
    const r = await owner.patch(`/api/ingredients/${b.id}`, { name: a.name.toLowerCase() })
    expect(r.status).toBe(409)
    expect(fields(r.body)).toEqual(['name'])
  })

  it('answers 404 to an unknown id', async () => {
    expect((await owner.patch('/api/ingredients/999999', { name: 'Ghost' })).status).toBe(404)
  })
})

describe('POST /api/ingredients/:id/archive and /restore', () => {
  it('archives and restores, keeping the purchases', async () => {
    const oil = await createOil()
    await buy(oil.id, 2, 'kg', 1000)
    const a = await owner.post(`/api/ingredients/${oil.id}/archive`)
    expect(a.status).toBe(200)
    expect(a.body.ingredient).toMatchObject({ archived: true, lots: 1, onHand: 2000 })
    expect(a.body.ingredient.archivedAt).toMatch(/^\d{4}-\d{2}-\d{2}T/)
    // archiving twice changes nothing
    expect((await owner.post(`/api/ingredients/${oil.id}/archive`)).body.ingredient.archivedAt).toBe(
      a.body.ingredient.archivedAt,
    )
    const r = await owner.post(`/api/ingredients/${oil.id}/restore`)
    expect(r.status).toBe(200)
    expect(r.body.ingredient).toMatchObject({ archived: false, archivedAt: null, lots: 1 })
  })

  it('answers 409 on field name when restoring while another active ingredient has taken the name', async () => {
    const oil = await createOil()
    await owner.post(`/api/ingredients/${oil.id}/archive`)
    await owner
      .post('/api/ingredients', { name: oil.name, kind: 'oil', sapKoh: 191 })
      .then((r) => expect(r.status).toBe(201))
    const r = await owner.post(`/api/ingredients/${oil.id}/restore`)
    expect(r.status).toBe(409)
    expect(fields(r.body)).toEqual(['name'])
    expect((await owner.get(`/api/ingredients/${oil.id}`)).body.ingredient.archived).toBe(true)
  })

  it('answers 404 to unknown ids and 400 to bad ones', async () => {
    expect((await owner.post('/api/ingredients/999999/archive')).status).toBe(404)
    expect((await owner.post('/api/ingredients/999999/restore')).status).toBe(404)
    const r = await owner.post('/api/ingredients/0/archive')
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['params.id'])
  })
})

describe('a purchase received today in the studio’s calendar', () => {
  it('is accepted, tomorrow is not (dates helper)', async () => {
    const oil = await createOil()
    const today = isoToday()
    await buy(oil.id, 1, 'kg', 100, 0, today)
    const r = await owner.post('/api/purchases', {
      ingredientId: oil.id,
      supplier: 'X',
      receivedOn: addDays(today, 2),
      quantity: 1,
      unit: 'kg',
      costCents: 1,
    })
    expect(r.status).toBe(400)
    expect(fields(r.body)).toEqual(['receivedOn'])
  })
})
