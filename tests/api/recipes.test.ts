import { QueryTypes } from 'sequelize'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { costPerBarForRecipes, recipeSnapshot } from '@server/modules/recipes/recipe-cost.service'
import { getSettings } from '@server/modules/settings/settings.service'
import { DEMO_RECIPES } from '../../seeders/demo/catalogue'
import type { CostSheet, Recipe, RecipeIngredientOption, RecipeListItem } from '@shared/schemas/recipes'
import { clientAs } from '@tests/factories/api-client'
import type { ApiClient } from '@tests/factories/api-client'

const app = createApp({ pruneSessions: false })

let owner: ApiClient
let ids: Map<string, number>
const id = (name: string) => {
  const found = ids.get(name)
  if (found == null) throw new Error(`no demo ingredient ${name}`)
  return found
}

beforeAll(async () => {
  owner = await clientAs(app, 'owner')
  const r = await owner.get('/api/recipes/ingredient-options').expect(200)
  ids = new Map((r.body.items as RecipeIngredientOption[]).map((i) => [i.name, i.id]))
})

let seq = 0
/** A valid recipe body with a name of its own (tests share the database). */
function body(over: Record<string, unknown> = {}) {
  seq += 1
  return {
    name: `Test recipe ${seq} ${Date.now()}`,
    oils: [
      { ingredientId: id('Olive oil'), pct: 70 },
      { ingredientId: id('Coconut oil'), pct: 30 },
    ],
    superfatPct: 5,
    waterMode: 'concentration',
    lyeConcentrationPct: 33,
    lyeIngredientId: id('Sodium hydroxide'),
    waterIngredientId: id('Distilled water'),
    fragrances: [{ ingredientId: id('Lavender essential oil'), pct: 3 }],
    additives: [{ ingredientId: id('Rose clay'), gPerKg: 5 }],
    packaging: [{ ingredientId: id('Kraft bar box'), qtyPerBar: 1 }],
    labourMinutes: 60,
    cureDays: 30,
    barWeightG: 120,
    barsPerMould: 10,
    barsKeptBack: 2,
    mouldOilWeightG: 1000,
    ...over,
  }
}

const fields = (r: { body: { error: { details?: { field: string }[] } } }) =>
  (r.body.error.details ?? []).map((d) => d.field)

async function listed(name: string, archived = false) {
  const r = await owner.get(`/api/recipes${archived ? '?archived=true' : ''}`).expect(200)
  return (r.body.items as RecipeListItem[]).find((i) => i.name === name)
}

describe('seeded recipes', () => {
  it('lists every demo recipe with its oils, superfat, cure, bars and a cost per bar', async () => {
    const r = await owner.get('/api/recipes').expect(200)
    const items = r.body.items as RecipeListItem[]
    for (const demo of DEMO_RECIPES) {
      const item = items.find((i) => i.name === demo.name)
      expect(item, demo.name).toBeDefined()
      expect(item!.oils).toEqual(demo.oils.map(([name, pct]) => ({ name, pct })))
      expect(item).toMatchObject({
        superfatPct: demo.superfatPct,
        cureDays: demo.cureDays,
        barsPerMould: demo.barsPerMould,
        missingCosts: [],
      })
      expect(item!.costPerBarCents).toBeGreaterThan(0)
    }
  })

  it('saves every demo recipe back unchanged: each fragrance is within its maximum usage', async () => {
    const r = await owner.get('/api/recipes').expect(200)
    for (const item of (r.body.items as RecipeListItem[]).filter((i) =>
      DEMO_RECIPES.some((d) => d.name === i.name),
    )) {
      const recipe = (await owner.get(`/api/recipes/${item.id}`).expect(200)).body.recipe as Recipe
      const put = await owner.put(`/api/recipes/${item.id}`, {
        ...recipe,
        lyeIngredientId: recipe.lye?.ingredientId ?? null,
        waterIngredientId: recipe.water?.ingredientId ?? null,
      })
      expect(put.status, `${recipe.name}: ${JSON.stringify(put.body)}`).toBe(200)
    }
  })
})

describe('POST /api/recipes', () => {
  it('creates a recipe and answers it with items joined to names and kinds', async () => {
    const b = body()
    const r = await owner.post('/api/recipes', b)
    expect(r.status).toBe(201)
    const recipe = r.body.recipe as Recipe
    expect(recipe).toMatchObject({
      name: b.name,
      superfatPct: 5,
      waterMode: 'concentration',
      lyeConcentrationPct: 33,
      waterLyeRatio: null,
      cureDays: 30,
      lye: { ingredientId: id('Sodium hydroxide'), name: 'Sodium hydroxide', kind: 'lye', purityPct: 99 },
      water: { ingredientId: id('Distilled water'), name: 'Distilled water', kind: 'liquid' },
      archivedAt: null,
    })
    expect(recipe.oils.map((o) => [o.name, o.kind, o.pct])).toEqual([
      ['Olive oil', 'oil', 70],
      ['Coconut oil', 'oil', 30],
    ])
    expect(recipe.fragrances).toEqual([
      expect.objectContaining({
        name: 'Lavender essential oil',
        kind: 'fragrance',
        pct: 3,
        maxUsagePct: 4.5,
      }),
    ])
    expect(recipe.additives).toEqual([
      expect.objectContaining({ name: 'Rose clay', kind: 'colourant', gPerKg: 5 }),
    ])
    expect(recipe.packaging).toEqual([
      expect.objectContaining({ name: 'Kraft bar box', kind: 'packaging', qtyPerBar: 1 }),
    ])
    const again = await owner.get(`/api/recipes/${recipe.id}`).expect(200)
    expect(again.body.recipe).toEqual(recipe)
    const [audit] = await sequelize.query<{ n: number }>(
      `SELECT count(*)::int AS n FROM audit_events WHERE action = 'recipe.created' AND entity_id = $1`,
      { bind: [recipe.id], type: QueryTypes.SELECT },
    )
    expect(audit!.n).toBe(1)
  })

  it('defaults the cure to 28 days (common practice) and keeps a water:lye ratio', async () => {
    const { cureDays: _drop, ...rest } = body({
      waterMode: 'ratio',
      waterLyeRatio: 2.2,
      lyeConcentrationPct: null,
    })
    const r = await owner.post('/api/recipes', rest)
    expect(r.status).toBe(201)
    expect(r.body.recipe).toMatchObject({
      cureDays: 28,
      waterMode: 'ratio',
      waterLyeRatio: 2.2,
      lyeConcentrationPct: null,
    })
  })

  it.each([
    ['oils that add up to 95 %', { oils: [{ pct: 65 }, { pct: 30 }] }, 'oils'],
    ['a superfat of 25 %', { superfatPct: 25 }, 'superfatPct'],
    ['a lye concentration of 60 %', { lyeConcentrationPct: 60 }, 'lyeConcentrationPct'],
    ['a ratio mode without a ratio', { waterMode: 'ratio', lyeConcentrationPct: null }, 'waterLyeRatio'],
    ['a water:lye ratio of 5', { waterMode: 'ratio', waterLyeRatio: 5 }, 'waterLyeRatio'],
    ['as many bars kept back as cut', { barsKeptBack: 10 }, 'barsKeptBack'],
    ['no name', { name: '' }, 'name'],
    ['a negative labour time', { labourMinutes: -5 }, 'labourMinutes'],
  ])('400 for %s', async (_label, change, field) => {
    const b = body() as Record<string, unknown>
    if ('oils' in change) {
      const base = b.oils as { ingredientId: number; pct: number }[]
      b.oils = (change.oils as { pct: number }[]).map((o, i) => ({ ...base[i]!, pct: o.pct }))
    }
    const { oils: _oils, ...rest } = change as Record<string, unknown>
    const r = await owner.post('/api/recipes', { ...b, ...rest })
    expect(r.status).toBe(400)
    expect(fields(r)).toContain(field)
  })

  it('400 with the row at fault for unknown ingredients and ingredients of the wrong kind', async () => {
    const r = await owner.post(
      '/api/recipes',
      body({
        oils: [
          { ingredientId: 999_999, pct: 50 },
          { ingredientId: id('Lavender essential oil'), pct: 50 },
        ],
        fragrances: [{ ingredientId: id('Olive oil'), pct: 3 }],
        additives: [{ ingredientId: id('Paper label'), gPerKg: 3 }],
        packaging: [{ ingredientId: id('Poppy seeds'), qtyPerBar: 1 }],
        lyeIngredientId: id('Distilled water'),
        waterIngredientId: id('Sodium hydroxide'),
      }),
    )
    expect(r.status).toBe(400)
    expect(fields(r)).toEqual([
      'oils.0.ingredientId',
      'oils.1.ingredientId',
      'fragrances.0.ingredientId',
      'additives.0.ingredientId',
      'packaging.0.ingredientId',
      'lyeIngredientId',
      'waterIngredientId',
    ])
  })

  it('422 fragrance_over_max on fragrances.N.pct with the reason, and saves nothing', async () => {
    const b = body({
      fragrances: [
        { ingredientId: id('Cedar & sage fragrance'), pct: 2 },
        { ingredientId: id('Peppermint essential oil'), pct: 3.5 },
      ],
    })
    const r = await owner.post('/api/recipes', b)
    expect(r.status).toBe(422)
    expect(r.body.error.code).toBe('fragrance_over_max')
    expect(r.body.error.details).toEqual([
      {
        field: 'fragrances.1.pct',
        message: expect.stringMatching(/Peppermint essential oil.*3\.5 %.*maximum usage of 3 %/),
      },
    ])
    expect(await listed(b.name)).toBeUndefined()
  })

  it('409 name_taken for a second recipe of the same name (any case)', async () => {
    const b = body()
    await owner.post('/api/recipes', b).then((r) => expect(r.status).toBe(201))
    const r = await owner.post('/api/recipes', { ...body(), name: b.name.toUpperCase() })
    expect(r.status).toBe(409)
    expect(r.body.error.code).toBe('name_taken')
    expect(fields(r)).toEqual(['name'])
  })
})

describe('PUT /api/recipes/:id', () => {
  it('replaces the items in one go', async () => {
    const created = (await owner.post('/api/recipes', body())).body.recipe as Recipe
    const r = await owner.put(
      `/api/recipes/${created.id}`,
      body({
        name: created.name,
        oils: [
          { ingredientId: id('Palm oil'), pct: 50 },
          { ingredientId: id('Shea butter'), pct: 30 },
          { ingredientId: id('Castor oil'), pct: 20 },
        ],
        fragrances: [],
        additives: [{ ingredientId: id('Poppy seeds'), gPerKg: 8 }],
        packaging: [{ ingredientId: id('Paper label'), qtyPerBar: 2 }],
        superfatPct: 6,
      }),
    )
    expect(r.status).toBe(200)
    const recipe = r.body.recipe as Recipe
    expect(recipe.oils.map((o) => o.name)).toEqual(['Palm oil', 'Shea butter', 'Castor oil'])
    expect(recipe.fragrances).toEqual([])
    expect(recipe.additives.map((a) => [a.name, a.gPerKg])).toEqual([['Poppy seeds', 8]])
    expect(recipe.packaging.map((p) => [p.name, p.qtyPerBar])).toEqual([['Paper label', 2]])
    expect(recipe.superfatPct).toBe(6)
    const [{ n }] = (await sequelize.query<{ n: number }>(
      'SELECT count(*)::int AS n FROM recipe_items WHERE recipe_id = $1',
      { bind: [created.id], type: QueryTypes.SELECT },
    )) as [{ n: number }]
    expect(n).toBe(5)
  })

  it('leaves the recipe as it was when the new version is refused', async () => {
    const created = (await owner.post('/api/recipes', body())).body.recipe as Recipe
    const r = await owner.put(
      `/api/recipes/${created.id}`,
      body({ name: 'Changed name', fragrances: [{ ingredientId: id('Lavender essential oil'), pct: 5 }] }),
    )
    expect(r.status).toBe(422)
    expect(fields(r)).toEqual(['fragrances.0.pct'])
    expect((await owner.get(`/api/recipes/${created.id}`)).body.recipe).toEqual(created)
  })

  it('400 for a bad body, 404 for an unknown recipe, 400 for an id that is not one', async () => {
    const created = (await owner.post('/api/recipes', body())).body.recipe as Recipe
    const bad = await owner.put(`/api/recipes/${created.id}`, body({ barsPerMould: 0 }))
    expect(bad.status).toBe(400)
    expect(fields(bad)).toContain('barsPerMould')
    expect((await owner.put('/api/recipes/999999', body())).status).toBe(404)
    const notId = await owner.put('/api/recipes/x', body())
    expect(notId.status).toBe(400)
    expect(fields(notId)).toEqual(['params.id'])
  })
})

describe('archive and restore', () => {
  it('takes a recipe off the list, refuses changes, and brings it back', async () => {
    const created = (await owner.post('/api/recipes', body())).body.recipe as Recipe
    const a = await owner.post(`/api/recipes/${created.id}/archive`)
    expect(a.status).toBe(200)
    expect(a.body.recipe.archivedAt).toEqual(expect.any(String))
    expect(await listed(created.name)).toBeUndefined()
    expect(await listed(created.name, true)).toBeDefined()
    const put = await owner.put(`/api/recipes/${created.id}`, body({ name: created.name }))
    expect(put.status).toBe(409)
    expect(put.body.error.code).toBe('recipe_archived')
    const back = await owner.post(`/api/recipes/${created.id}/restore`)
    expect(back.status).toBe(200)
    expect(back.body.recipe.archivedAt).toBeNull()
    expect(await listed(created.name)).toBeDefined()
  })

  it('refuses to restore a recipe whose name was taken meanwhile (409)', async () => {
    const first = (await owner.post('/api/recipes', body())).body.recipe as Recipe
    await owner.post(`/api/recipes/${first.id}/archive`).then((r) => expect(r.status).toBe(200))
    await owner.post('/api/recipes', { ...body(), name: first.name }).then((r) => expect(r.status).toBe(201))
    const r = await owner.post(`/api/recipes/${first.id}/restore`)
    expect(r.status).toBe(409)
    expect(fields(r)).toEqual(['name'])
  })

  it('404 for an unknown recipe', async () => {
    expect((await owner.post('/api/recipes/999999/archive')).status).toBe(404)
  })
})

describe('GET /api/recipes/:id/cost-sheet', () => {
  type Lot = { ingredient_id: number; remaining: string; unit_cost: string }
  /** Current unit cost by hand: lots on hand weighted by what is left in each (cents per g or item). */
  async function unitCosts() {
    const lots = await sequelize.query<Lot>(
      'SELECT ingredient_id, remaining, (cost_cents + freight_cents) / quantity AS unit_cost FROM ingredient_lots WHERE remaining > 0',
      { type: QueryTypes.SELECT },
    )
    const sums = new Map<number, { q: number; c: number }>()
    for (const l of lots) {
      const s = sums.get(l.ingredient_id) ?? { q: 0, c: 0 }
      s.q += Number(l.remaining)
      s.c += Number(l.remaining) * Number(l.unit_cost)
      sums.set(l.ingredient_id, s)
    }
    return new Map([...sums].map(([k, s]) => [k, s.c / s.q]))
  }

  async function demoId(name: string) {
    return (await listed(name))!.id
  }

  it('costs one mould of Lavender classic from the lots on hand, packaging and labour', async () => {
    const rid = await demoId('Lavender classic')
    const r = await owner.get(`/api/recipes/${rid}/cost-sheet`)
    expect(r.status).toBe(200)
    const cs = r.body.costSheet as CostSheet
    const sheet = (await owner.get(`/api/recipes/${rid}/batch-sheet`)).body.sheet as {
      lines: { ingredientId: number; grams: number; role: string }[]
    }
    const unit = await unitCosts()
    // Olive oil has two purchases at different prices: 20 kg for $168 and 20 kg for $174
    // (seeders/demo/catalogue.ts), so its cost is their average weighted by what is left.
    expect(unit.get(id('Olive oil'))).toBeGreaterThan(0.84)
    expect(unit.get(id('Olive oil'))).toBeLessThan(0.87)

    const demo = DEMO_RECIPES.find((d) => d.name === 'Lavender classic')!
    const ingredientCents = sheet.lines.reduce((s, l) => s + l.grams * unit.get(l.ingredientId)!, 0)
    const sellable = demo.barsPerMould - demo.barsKeptBack
    const packagingPerBar = demo.packaging.reduce((s, [name, perBar]) => s + perBar * unit.get(id(name))!, 0)
    const { labourRateCents } = await getSettings()
    const labour = (demo.labourMinutes * labourRateCents) / 60
    const total = ingredientCents + packagingPerBar * sellable + labour

    expect(cs).toMatchObject({
      recipeName: 'Lavender classic',
      oilWeightG: 1100,
      barsCut: 12,
      barsKeptBack: 2,
      sellableBars: 10,
    })
    expect(cs.ingredientCostCents).toBeCloseTo(ingredientCents, 6)
    expect(cs.packagingPerBarCents).toBeCloseTo(packagingPerBar, 9)
    expect(cs.packagingCents).toBeCloseTo(packagingPerBar * sellable, 9)
    expect(cs.labourCents).toBeCloseTo(labour, 9)
    expect(cs.totalBatchCents).toBeCloseTo(total, 6)
    expect(cs.costPerBarCents).toBe(Math.round(total / sellable))
    for (const line of cs.lines) {
      expect(line.noCost).toBe(false)
      expect(line.unitCostCents).toBeCloseTo(unit.get(line.ingredientId!)!, 9)
    }
    const box = cs.lines.find((l) => l.name === 'Kraft bar box')!
    expect(box).toMatchObject({ role: 'packaging', unit: 'each', quantity: sellable, perBar: 1 })
    // The breakdown adds up to the batch and is sorted largest first.
    expect(cs.breakdown.reduce((s, b) => s + b.cents, 0)).toBeCloseTo(total, 6)
    expect(cs.breakdown.map((b) => b.cents)).toEqual(
      [...cs.breakdown.map((b) => b.cents)].sort((a, b) => b - a),
    )
    expect(cs.breakdown.find((b) => b.category === 'labour')!.cents).toBeCloseTo(labour, 9)
    expect(cs.breakdown.map((b) => b.category).sort()).toEqual(
      ['additive', 'fragrance', 'labour', 'liquid', 'lye', 'oil', 'packaging'].sort(),
    )
    expect(cs.overrides).toEqual([])
    expect(cs.warnings).toEqual([])

    // The export other modules call gives the same figure.
    const map = await costPerBarForRecipes([rid, rid, 999_999])
    expect([...map.keys()]).toEqual([rid])
    expect(map.get(rid)).toEqual({ costPerBarCents: cs.costPerBarCents, missingCosts: [] })
    expect((await listed('Lavender classic'))!.costPerBarCents).toBe(cs.costPerBarCents)
  })

  it('answers a what-if price for one ingredient and marks it', async () => {
    const rid = await demoId('Lavender classic')
    const demo = DEMO_RECIPES.find((d) => d.name === 'Lavender classic')!
    const oliveG = (demo.mouldOilWeightG * demo.oils.find(([n]) => n === 'Olive oil')![1]) / 100
    const base = (await owner.get(`/api/recipes/${rid}/cost-sheet`)).body.costSheet as CostSheet
    const olive = id('Olive oil')
    const r = await owner.get(`/api/recipes/${rid}/cost-sheet?priceOverride[${olive}]=1.5`)
    expect(r.status).toBe(200)
    const cs = r.body.costSheet as CostSheet
    const line = cs.lines.find((l) => l.ingredientId === olive)!
    expect(line).toMatchObject({ overridden: true, unitCostCents: 1.5 })
    expect(line.lineCostCents).toBeCloseTo(oliveG * 1.5, 9)
    const baseLine = base.lines.find((l) => l.ingredientId === olive)!
    expect(cs.totalBatchCents - base.totalBatchCents).toBeCloseTo(oliveG * 1.5 - baseLine.lineCostCents, 6)
    expect(cs.overrides).toEqual([
      {
        ingredientId: olive,
        name: 'Olive oil',
        centsPerUnit: 1.5,
        currentUnitCostCents: baseLine.unitCostCents,
      },
    ])
    expect(cs.lines.filter((l) => l.overridden)).toHaveLength(1)
  })

  it('costs another oil weight with the bars that batch cuts', async () => {
    const rid = await demoId('Lavender classic')
    const cs = (await owner.get(`/api/recipes/${rid}/cost-sheet?oilWeightG=2200`).expect(200)).body
      .costSheet as CostSheet
    const sheet = (await owner.get(`/api/recipes/${rid}/batch-sheet?oilWeightG=2200`)).body.sheet as {
      totalG: number
    }
    expect(cs.oilWeightG).toBe(2200)
    const demo = DEMO_RECIPES.find((d) => d.name === 'Lavender classic')!
    expect(cs.barsCut).toBe(Math.floor(sheet.totalG / demo.barWeightG))
    expect(cs.sellableBars).toBe(cs.barsCut - demo.barsKeptBack)
  })

  it('flags an ingredient with nothing on hand: cost 0, noCost, a warning and missingCosts', async () => {
    const [fresh] = await sequelize.query<{ id: number }>(
      `INSERT INTO ingredients (name, kind, unit) VALUES ('Unbought test clay', 'colourant', 'g') RETURNING id`,
      { type: QueryTypes.SELECT },
    )
    const created = (
      await owner.post('/api/recipes', body({ additives: [{ ingredientId: fresh!.id, gPerKg: 4 }] }))
    ).body.recipe as Recipe
    const cs = (await owner.get(`/api/recipes/${created.id}/cost-sheet`).expect(200)).body
      .costSheet as CostSheet
    expect(cs.lines.find((l) => l.ingredientId === fresh!.id)).toMatchObject({
      noCost: true,
      unitCostCents: null,
      lineCostCents: 0,
      quantity: 4,
    })
    expect(cs.warnings).toEqual([expect.objectContaining({ code: 'no_cost', ingredientId: fresh!.id })])
    expect(cs.missingCosts).toEqual(['Unbought test clay'])
    expect((await costPerBarForRecipes([created.id])).get(created.id)!.missingCosts).toEqual([
      'Unbought test clay',
    ])
  })

  it('counts the lye and water at 0 with a warning when the recipe names no ingredient for them', async () => {
    const created = (
      await owner.post('/api/recipes', body({ lyeIngredientId: null, waterIngredientId: null }))
    ).body.recipe as Recipe
    const cs = (await owner.get(`/api/recipes/${created.id}/cost-sheet`).expect(200)).body
      .costSheet as CostSheet
    expect(cs.lines.filter((l) => l.role === 'lye' || l.role === 'water')).toEqual([
      expect.objectContaining({ ingredientId: null, noCost: true, lineCostCents: 0 }),
      expect.objectContaining({ ingredientId: null, noCost: true, lineCostCents: 0 }),
    ])
    expect(cs.warnings.map((w) => w.code)).toEqual(['not_costed', 'not_costed'])
  })

  it.each([
    ['?oilWeightG=0', 'query.oilWeightG'],
    ['?oilWeightG=10', 'query.oilWeightG'],
    ['?priceOverride[abc]=1', 'query.priceOverride.abc'],
    ['?priceOverride[5]=-2', 'query.priceOverride.5'],
  ])('400 for %s with the field %s', async (q, field) => {
    const r = await owner.get(`/api/recipes/${await demoId('Lavender classic')}/cost-sheet${q}`)
    expect(r.status).toBe(400)
    expect(fields(r)).toContain(field)
  })

  it('400 for a what-if on an ingredient the recipe does not use', async () => {
    const r = await owner.get(
      `/api/recipes/${await demoId('Lavender classic')}/cost-sheet?priceOverride[${id('Rose clay')}]=1`,
    )
    expect(r.status).toBe(400)
    expect(fields(r)).toEqual([`query.priceOverride.${id('Rose clay')}`])
  })

  it('404 for an unknown recipe', async () => {
    expect((await owner.get('/api/recipes/999999/cost-sheet')).status).toBe(404)
  })
})

describe('recipeSnapshot', () => {
  it('gives the recipe with its items as plain JSON, and null for an unknown id', async () => {
    const created = (await owner.post('/api/recipes', body())).body.recipe as Recipe
    const snap = await recipeSnapshot(created.id)
    expect(snap).toEqual(created)
    expect(JSON.parse(JSON.stringify(snap))).toEqual(snap)
    expect(await recipeSnapshot(999_999)).toBeNull()
  })
})

describe('rights', () => {
  it('401 signed out and 403 for the packer and buyers on every recipe route', async () => {
    const rid = (await owner.post('/api/recipes', body())).body.recipe.id as number
    const calls: [string, (c: ApiClient) => Promise<{ status: number }>][] = [
      ['GET /api/recipes', (c) => c.get('/api/recipes')],
      ['GET /api/recipes/ingredient-options', (c) => c.get('/api/recipes/ingredient-options')],
      ['GET /api/recipes/:id', (c) => c.get(`/api/recipes/${rid}`)],
      ['POST /api/recipes', (c) => c.post('/api/recipes', body())],
      ['PUT /api/recipes/:id', (c) => c.put(`/api/recipes/${rid}`, body())],
      ['POST /api/recipes/:id/archive', (c) => c.post(`/api/recipes/${rid}/archive`)],
      ['POST /api/recipes/:id/restore', (c) => c.post(`/api/recipes/${rid}/restore`)],
      ['GET /api/recipes/:id/cost-sheet', (c) => c.get(`/api/recipes/${rid}/cost-sheet`)],
    ]
    const clients = {
      anon: await clientAs(app, 'anon'),
      packer: await clientAs(app, 'packer'),
      buyerA: await clientAs(app, 'buyerA'),
      buyerC: await clientAs(app, 'buyerC'),
    }
    for (const [label, call] of calls) {
      expect((await call(clients.anon)).status, `${label} anon`).toBe(401)
      for (const who of ['packer', 'buyerA', 'buyerC'] as const) {
        expect((await call(clients[who])).status, `${label} ${who}`).toBe(403)
      }
    }
    // Nothing changed on the way.
    expect((await owner.get(`/api/recipes/${rid}`)).body.recipe.archivedAt).toBeNull()
  })
})
