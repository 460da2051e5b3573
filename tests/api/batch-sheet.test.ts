import fs from 'node:fs'
import path from 'node:path'
import { PDFParse } from 'pdf-parse'
import type { Response } from 'supertest'
import { QueryTypes } from 'sequelize'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { formatGrams } from '@shared/domain/units/units'
import { DEMO_INGREDIENTS, DEMO_RECIPES } from '../../seeders/demo/catalogue'
import type { RecipeBatchSheet } from '@shared/schemas/batch-sheet'
import type { RecipeIngredientOption, RecipeListItem } from '@shared/schemas/recipes'
import { clientAs } from '@tests/factories/api-client'
import type { ApiClient } from '@tests/factories/api-client'

const app = createApp({ pruneSessions: false })

// Saponification values the demo seeds (seeders/reference/oils.ts), mg KOH per g, each the
// midpoint of its published range: olive 190 (Codex CXS 33-1981, 184–196, from memory),
// coconut 256.5 (Codex CXS 210-1999, 248–265), castor 181.5 (British Pharmacopoeia 1993, 176–187),
// palm 199.5 (Codex CXS 210-1999, 190–209); shea 180 (from memory, no published range).
const SAP_KOH: Record<string, number> = {
  'Olive oil': 190,
  'Coconut oil': 256.5,
  'Castor oil': 181.5,
  'Palm oil': 199.5,
  'Shea butter': 180,
}
// KOH → NaOH by molar mass, IUPAC/CIAAW standard atomic weights 2021 (conventional values).
const M_NAOH = 22.98976928 + 15.999 + 1.008
const M_KOH = 39.0983 + 15.999 + 1.008
const sapNaoh = (oil: string) => (SAP_KOH[oil]! / 1000) * (M_NAOH / M_KOH)
// 1 oz = 28.349523125 g exactly (1959 international yard and pound agreement; NIST Handbook 44 App. C).
const OZ = 28.349523125
// sap_naoh is stored to 7 decimals (numeric(9,7)): about 4e-7 relative on a value near 0.14.
const close = (actual: number, expected: number, rel = 2e-6) =>
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.abs(expected) * rel + 1e-9)

let owner: ApiClient
let ids: Map<string, number>

const binary = (res: Response, cb: (err: Error | null, body: Buffer) => void) => {
  const stream = res as unknown as NodeJS.ReadableStream
  const chunks: Buffer[] = []
  stream.on('data', (c: Buffer) => chunks.push(c))
  stream.on('end', () => cb(null, Buffer.concat(chunks)))
}

beforeAll(async () => {
  owner = await clientAs(app, 'owner')
  const r = await owner.get('/api/recipes/ingredient-options').expect(200)
  ids = new Map((r.body.items as RecipeIngredientOption[]).map((i) => [i.name, i.id]))
})

const id = (name: string) => {
  const found = ids.get(name)
  if (found == null) throw new Error(`no demo ingredient ${name}`)
  return found
}

async function recipeId(name: string) {
  const r = await owner.get('/api/recipes').expect(200)
  return (r.body.items as RecipeListItem[]).find((i) => i.name === name)!.id
}

describe('POST /api/batch-sheet (the contract)', () => {
  // Worked by hand: 600 g olive, 300 g coconut, 100 g castor at 5 % superfat, 33 % lye.
  //   Σ grams × SAP(KOH) = 600 × 190 + 300 × 256.5 + 100 × 181.5 = 209,100 mg KOH
  //   NaOH = 209.1 g × 39.99677 / 56.1053 × 0.95 = 149.06478 × 0.95 ≈ 141.61155 g
  //   water = NaOH × (1 − 0.33) / 0.33 ≈ 287.51435 g; total ≈ 1429.12589 g
  const oils = [
    ['Olive oil', 600],
    ['Coconut oil', 300],
    ['Castor oil', 100],
  ] as const

  it('answers the contract keys with the lye and water of a worked example', async () => {
    const r = await owner.post('/api/batch-sheet', {
      oils: oils.map(([name, grams]) => ({ ingredientId: id(name), grams })),
      superfatPct: 5,
      lyeConcentrationPct: 33,
    })
    expect(r.status).toBe(200)
    expect(Object.keys(r.body).sort()).toEqual(['lines', 'naohG', 'oilsG', 'totalG', 'waterG'])
    const naoh = oils.reduce((s, [name, g]) => s + g * sapNaoh(name), 0) * (1 - 0.05)
    close(r.body.naohG, naoh)
    close(r.body.naohG, 141.61155, 1e-6)
    close(r.body.waterG, 287.51435, 1e-6)
    close(r.body.totalG, 1429.12589, 1e-6)
    close(r.body.waterG, (naoh * (1 - 0.33)) / 0.33)
    expect(r.body.oilsG).toBe(1000)
    close(r.body.totalG, 1000 + naoh + (naoh * 0.67) / 0.33)
    expect(r.body.lines).toEqual(oils.map(([name, grams]) => ({ ingredientId: id(name), name, grams })))
    for (const line of r.body.lines)
      expect(Object.keys(line).sort()).toEqual(['grams', 'ingredientId', 'name'])
  })

  it('divides by the lye purity: 97 % NaOH needs 1/0.97 as much weighed', async () => {
    const body = {
      oils: [{ ingredientId: id('Olive oil'), grams: 1000 }],
      superfatPct: 0,
      lyeConcentrationPct: 25,
    }
    const pure = await owner.post('/api/batch-sheet', body)
    const r = await owner.post('/api/batch-sheet', { ...body, lyePurityPct: 97 })
    expect(r.status).toBe(200)
    // 1000 g × 190 mg KOH/g → 190 g KOH-equivalent × 0.712888 = 135.4487 g NaOH at 100 %
    close(pure.body.naohG, 1000 * sapNaoh('Olive oil'))
    close(r.body.naohG, (1000 * sapNaoh('Olive oil')) / 0.97)
    // Water follows the weighed lye: lye × (1 − c) / c with c = 0.25, i.e. 3 × lye
    close(r.body.waterG, r.body.naohG * 3)
  })

  it('takes a water:lye ratio instead, and fragrance and additive lines', async () => {
    const r = await owner.post('/api/batch-sheet', {
      oils: [{ ingredientId: id('Palm oil'), grams: 500 }],
      superfatPct: 5,
      waterLyeRatio: 2,
      fragrances: [{ ingredientId: id('Lavender essential oil'), pct: 4 }],
      additives: [{ ingredientId: id('Sodium lactate'), gPerKg: 10 }],
    })
    expect(r.status).toBe(200)
    const naoh = 500 * sapNaoh('Palm oil') * 0.95
    close(r.body.naohG, naoh)
    close(r.body.waterG, naoh * 2)
    expect(r.body.lines.map((l: { name: string; grams: number }) => [l.name, l.grams])).toEqual([
      ['Palm oil', 500],
      ['Lavender essential oil', 20],
      ['Sodium lactate', 5],
    ])
    close(r.body.totalG, 500 + naoh * 3 + 20 + 5)
  })

  it.each([
    [{ superfatPct: 25 }, 'superfatPct'],
    [{ superfatPct: -1 }, 'superfatPct'],
    [{ lyeConcentrationPct: 55 }, 'lyeConcentrationPct'],
    [{ lyeConcentrationPct: 10 }, 'lyeConcentrationPct'],
    [{ lyeConcentrationPct: undefined }, 'lyeConcentrationPct'],
    [{ lyePurityPct: 30 }, 'lyePurityPct'],
    [{ oils: [] }, 'oils'],
    [{ oils: [{ ingredientId: 1, grams: -5 }] }, 'oils.0.grams'],
  ])('400 for %j with the field %s', async (change, field) => {
    const r = await owner.post('/api/batch-sheet', {
      oils: [{ ingredientId: id('Olive oil'), grams: 500 }],
      superfatPct: 5,
      lyeConcentrationPct: 33,
      ...change,
    })
    expect(r.status).toBe(400)
    expect(r.body.error.code).toBe('invalid_input')
    expect(r.body.error.details.map((d: { field: string }) => d.field)).toContain(field)
  })

  it('400 oils.N.ingredientId for an unknown ingredient and for one that is not an oil (no SAP value)', async () => {
    const r = await owner.post('/api/batch-sheet', {
      oils: [
        { ingredientId: id('Olive oil'), grams: 500 },
        { ingredientId: 999_999, grams: 100 },
        { ingredientId: id('Lavender essential oil'), grams: 100 },
        { ingredientId: id('Sodium hydroxide'), grams: 100 },
      ],
      superfatPct: 5,
      lyeConcentrationPct: 33,
    })
    expect(r.status).toBe(400)
    expect(r.body.error.details.map((d: { field: string }) => d.field)).toEqual([
      'oils.1.ingredientId',
      'oils.2.ingredientId',
      'oils.3.ingredientId',
    ])
    expect(r.body.error.details[1].message).toMatch(/not an oil/)
  })

  it('401 signed out; 403 for the packer and a buyer', async () => {
    const body = {
      oils: [{ ingredientId: id('Olive oil'), grams: 500 }],
      superfatPct: 5,
      lyeConcentrationPct: 33,
    }
    expect((await (await clientAs(app, 'anon')).post('/api/batch-sheet', body)).status).toBe(401)
    for (const who of ['packer', 'buyerA'] as const) {
      expect((await (await clientAs(app, who)).post('/api/batch-sheet', body)).status).toBe(403)
    }
  })
})

describe('GET /api/recipes/:id/batch-sheet', () => {
  // Lavender classic as the demo catalogue has it (seeders/demo/catalogue.ts): olive 40, coconut 25,
  // palm 20, shea 10, castor 5 % of oils; 5 % superfat, 33 % lye, sodium hydroxide 99 % pure;
  // lavender 4 % of oils; sodium lactate 10 g per kg of oils. The figures are read from there.
  const demo = DEMO_RECIPES.find((d) => d.name === 'Lavender classic')!
  const mould = demo.mouldOilWeightG
  const sf = demo.superfatPct / 100
  const c = demo.lyeConcentrationPct / 100
  const purity = DEMO_INGREDIENTS.find((i) => i.name === 'Sodium hydroxide')!.purityPct! / 100
  const naohFor = (oilG: number) =>
    (demo.oils.reduce((s, [name, pct]) => s + ((oilG * pct) / 100) * sapNaoh(name), 0) * (1 - sf)) / purity
  const fragranceG = (mould * demo.fragrances[0]![1]) / 100
  const additiveG = (mould * demo.additives[0]![1]) / 1000

  it('gives every line for one mould in grams and ounces, lye with its purity, water, total and bars', async () => {
    const r = await owner.get(`/api/recipes/${await recipeId('Lavender classic')}/batch-sheet`)
    expect(r.status).toBe(200)
    const sheet = r.body.sheet as RecipeBatchSheet
    expect(sheet.basis).toBe('mould')
    expect(sheet.oilsG).toBe(mould)
    expect(sheet.lyePurityPct).toBe(purity * 100)
    close(sheet.naohG, naohFor(mould))
    close(sheet.waterG, (naohFor(mould) * (1 - c)) / c)
    const byName = new Map(sheet.lines.map((l) => [l.name, l]))
    expect(byName.get('Olive oil')!.grams).toBeCloseTo(
      (mould * demo.oils.find(([n]) => n === 'Olive oil')![1]) / 100,
      9,
    )
    expect(byName.get('Lavender essential oil')!.grams).toBeCloseTo(fragranceG, 9)
    expect(byName.get('Sodium lactate')!.grams).toBeCloseTo(additiveG, 9)
    expect(byName.get('Sodium hydroxide')).toMatchObject({
      role: 'lye',
      ingredientId: id('Sodium hydroxide'),
    })
    expect(byName.get('Distilled water')).toMatchObject({
      role: 'water',
      ingredientId: id('Distilled water'),
    })
    for (const l of sheet.lines) close(l.ounces, l.grams / OZ, 1e-12)
    const total = mould + naohFor(mould) * (1 + (1 - c) / c) + fragranceG + additiveG
    close(sheet.totalG, total)
    expect(sheet.expectedBars).toBe(Math.floor(total / demo.barWeightG))
    expect(sheet.warnings).toEqual([])
    expect(sheet.cautions.hazards.map((h) => h.code)).toEqual(['H290', 'H314'])
    expect(sheet.cautions.signalWord).toBe('Danger')
  })

  it('sizes the batch for a number of bars: the whole batch weighs bars × bar weight', async () => {
    const r = await owner.get(`/api/recipes/${await recipeId('Lavender classic')}/batch-sheet?bars=24`)
    expect(r.status).toBe(200)
    expect(r.body.sheet.basis).toBe('bars')
    close(r.body.sheet.totalG, 24 * demo.barWeightG, 1e-9)
    expect(r.body.sheet.expectedBars).toBe(24)
  })

  it('sizes the batch for an oil weight', async () => {
    const r = await owner.get(`/api/recipes/${await recipeId('Lavender classic')}/batch-sheet?oilWeightG=500`)
    expect(r.status).toBe(200)
    expect(r.body.sheet.oilsG).toBe(500)
    close(r.body.sheet.naohG, naohFor(500))
  })

  it('warns that a vanillin-rich fragrance browns (Honey oat: 1.8 % vanillin)', async () => {
    const r = await owner.get(`/api/recipes/${await recipeId('Honey oat')}/batch-sheet`)
    expect(r.body.sheet.warnings).toEqual([
      expect.objectContaining({ code: 'vanillin_browning', ingredientId: id('Honey oat fragrance') }),
    ])
  })

  it('flags a fragrance whose certificate limit was lowered after the recipe was saved', async () => {
    const [f] = await sequelize.query<{ id: number }>(
      `INSERT INTO ingredients (name, kind, max_usage_pct, vanillin_pct, unit)
       VALUES ('Sheet test fragrance', 'fragrance', 5, 0, 'g') RETURNING id`,
      { type: QueryTypes.SELECT },
    )
    const created = await owner.post('/api/recipes', {
      name: 'Sheet flag test',
      oils: [{ ingredientId: id('Olive oil'), pct: 100 }],
      superfatPct: 5,
      waterMode: 'concentration',
      lyeConcentrationPct: 33,
      fragrances: [{ ingredientId: f!.id, pct: 4 }],
      labourMinutes: 30,
      barWeightG: 120,
      barsPerMould: 10,
      barsKeptBack: 1,
      mouldOilWeightG: 900,
    })
    expect(created.status).toBe(201)
    await sequelize.query('UPDATE ingredients SET max_usage_pct = 3 WHERE id = $1', { bind: [f!.id] })
    const r = await owner.get(`/api/recipes/${created.body.recipe.id}/batch-sheet`)
    expect(r.body.sheet.warnings).toEqual([
      expect.objectContaining({ code: 'fragrance_over_max', ingredientId: f!.id }),
    ])
  })

  it.each([
    ['?bars=0', 'query.bars'],
    ['?bars=2.5', 'query.bars'],
    ['?oilWeightG=-1', 'query.oilWeightG'],
    ['?oilWeightG=abc', 'query.oilWeightG'],
    ['?oilWeightG=500&bars=4', 'query.bars'],
  ])('400 for %s with the field %s', async (q, field) => {
    const r = await owner.get(`/api/recipes/${await recipeId('Lavender classic')}/batch-sheet${q}`)
    expect(r.status).toBe(400)
    expect(r.body.error.details.map((d: { field: string }) => d.field)).toContain(field)
  })

  it('404 for a recipe that does not exist; 400 for an id that is not one', async () => {
    expect((await owner.get('/api/recipes/999999/batch-sheet')).status).toBe(404)
    expect((await owner.get('/api/recipes/abc/batch-sheet')).status).toBe(400)
  })

  it('401 signed out; 403 for the packer and a buyer (JSON and PDF)', async () => {
    const rid = await recipeId('Lavender classic')
    for (const path of [`/api/recipes/${rid}/batch-sheet`, `/api/recipes/${rid}/batch-sheet.pdf`]) {
      expect((await (await clientAs(app, 'anon')).get(path)).status).toBe(401)
      for (const who of ['packer', 'buyerB'] as const) {
        expect((await (await clientAs(app, who)).get(path)).status).toBe(403)
      }
    }
  })
})

describe('GET /api/recipes/:id/batch-sheet.pdf', () => {
  it('is a PDF with the recipe name, the NaOH grams and the lye cautions', async () => {
    const rid = await recipeId('Cedar & sage')
    const json = await owner.get(`/api/recipes/${rid}/batch-sheet?bars=20`).expect(200)
    const r: Response = await owner
      .get(`/api/recipes/${rid}/batch-sheet.pdf?bars=20`)
      .buffer(true)
      .parse(binary)
    expect(r.status).toBe(200)
    expect(r.headers['content-type']).toBe('application/pdf')
    const pdf = r.body as Buffer
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-')
    // Kept for a look at the layout (test-results is not committed).
    fs.mkdirSync(path.resolve('test-results', 'pdf'), { recursive: true })
    fs.writeFileSync(path.resolve('test-results', 'pdf', 'batch-sheet-cedar-sage.pdf'), pdf)
    const parser = new PDFParse({ data: new Uint8Array(pdf) })
    const { text } = await parser.getText()
    await parser.destroy()
    expect(text).toContain('Batch sheet: Cedar & sage')
    expect(text).toContain(formatGrams(json.body.sheet.naohG))
    expect(text).toContain('H314')
    expect(text).toContain('Causes severe skin burns and eye damage.')
    expect(text).toContain('Always add lye to water, never water to lye.')
    expect(text).toMatch(/safety assessment/)
    expect(text).toContain('Brindlewick Soapery')
  })

  it('400 for a bad size, like the JSON sheet', async () => {
    const r = await owner.get(`/api/recipes/${await recipeId('Cedar & sage')}/batch-sheet.pdf?bars=-2`)
    expect(r.status).toBe(400)
    expect(r.body.error.details[0].field).toBe('query.bars')
  })
})
