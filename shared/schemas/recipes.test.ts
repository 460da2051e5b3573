import { describe, expect, it } from 'vitest'
import { CostSheetQuerySchema, RecipeInputSchema } from '@shared/schemas/recipes'
import type { RecipeFormValues } from '@shared/schemas/recipes'

const valid: RecipeFormValues = {
  name: 'Test bar',
  oils: [
    { ingredientId: 1, pct: 60 },
    { ingredientId: 2, pct: 40 },
  ],
  superfatPct: 5,
  waterMode: 'concentration',
  lyeConcentrationPct: 33,
  labourMinutes: 60,
  barWeightG: 130,
  barsPerMould: 12,
  barsKeptBack: 2,
  mouldOilWeightG: 1100,
}

const fieldsOf = (input: unknown) => {
  const r = RecipeInputSchema.safeParse(input)
  return r.success ? [] : r.error.issues.map((i) => i.path.join('.'))
}

describe('RecipeInputSchema', () => {
  it('accepts a plain recipe and fills the defaults (28-day cure: common practice)', () => {
    const r = RecipeInputSchema.parse(valid)
    expect(r).toMatchObject({ cureDays: 28, fragrances: [], additives: [], packaging: [], notes: null })
    expect(r.waterLyeRatio).toBeNull()
    expect(r.lyeIngredientId).toBeNull()
  })

  it.each([
    // Three thirds written to two decimals make 99.99, inside the 0.01 tolerance (hand calculation)
    { name: 'thirds to two decimals', pcts: [33.33, 33.33, 33.34], ok: true },
    { name: '99.99 %', pcts: [33.33, 33.33, 33.33], ok: true },
    { name: '99 %', pcts: [50, 49], ok: false },
    { name: '100.5 %', pcts: [50, 50.5], ok: false },
    { name: 'one oil at 100 %', pcts: [100], ok: true },
  ])('oils summing: $name (hand calculation)', ({ pcts, ok }) => {
    const fields = fieldsOf({ ...valid, oils: pcts.map((pct, i) => ({ ingredientId: i + 1, pct })) })
    expect(fields.includes('oils')).toBe(!ok)
  })

  it.each([
    { change: { superfatPct: -1 }, field: 'superfatPct', source: 'SUPERFAT_RANGE 0–20' },
    { change: { superfatPct: 21 }, field: 'superfatPct', source: 'SUPERFAT_RANGE 0–20' },
    {
      change: { lyeConcentrationPct: 19.9 },
      field: 'lyeConcentrationPct',
      source: 'LYE_CONCENTRATION_RANGE 20–50',
    },
    {
      change: { lyeConcentrationPct: 51 },
      field: 'lyeConcentrationPct',
      source: 'LYE_CONCENTRATION_RANGE 20–50',
    },
    {
      change: { lyeConcentrationPct: null },
      field: 'lyeConcentrationPct',
      source: 'concentration mode needs it',
    },
    {
      change: { waterMode: 'ratio', lyeConcentrationPct: null },
      field: 'waterLyeRatio',
      source: 'ratio mode needs it',
    },
    {
      change: { waterMode: 'ratio', waterLyeRatio: 4.5 },
      field: 'waterLyeRatio',
      source: 'WATER_TO_LYE_RATIO_RANGE 1–4',
    },
    { change: { barsKeptBack: 12 }, field: 'barsKeptBack', source: 'kept back < bars per mould' },
    { change: { barsPerMould: 0 }, field: 'barsPerMould', source: 'at least one bar' },
    { change: { barWeightG: 0 }, field: 'barWeightG', source: 'a bar weighs something' },
    { change: { mouldOilWeightG: -5 }, field: 'mouldOilWeightG', source: 'positive weight' },
    { change: { labourMinutes: 1.5 }, field: 'labourMinutes', source: 'whole minutes' },
    { change: { cureDays: 400 }, field: 'cureDays', source: 'at most a year' },
    { change: { name: '  ' }, field: 'name', source: 'a name is required' },
    { change: { oils: [] }, field: 'oils', source: 'at least one oil' },
    {
      change: { fragrances: [{ ingredientId: 5, pct: 0 }] },
      field: 'fragrances.0.pct',
      source: 'more than 0 %',
    },
    {
      change: { additives: [{ ingredientId: 5, gPerKg: -1 }] },
      field: 'additives.0.gPerKg',
      source: 'more than 0 g',
    },
    {
      change: { packaging: [{ ingredientId: 5, qtyPerBar: 0 }] },
      field: 'packaging.0.qtyPerBar',
      source: 'more than 0',
    },
    {
      change: {
        oils: [
          { ingredientId: 1, pct: 50 },
          { ingredientId: 1, pct: 50 },
        ],
      },
      field: 'oils.1.ingredientId',
      source: 'one row per ingredient',
    },
    { change: { superfatPct: Number.NaN }, field: 'superfatPct', source: 'an empty number input' },
  ])('refuses $field ($source)', ({ change, field }) => {
    expect(fieldsOf({ ...valid, ...change })).toContain(field)
  })

  it('keeps only the figure of the chosen water mode', () => {
    const r = RecipeInputSchema.parse({
      ...valid,
      waterMode: 'ratio',
      waterLyeRatio: 2,
      lyeConcentrationPct: 33,
    })
    expect(r.lyeConcentrationPct).toBeNull()
    expect(r.waterLyeRatio).toBe(2)
  })
})

describe('CostSheetQuerySchema', () => {
  it('reads the what-if prices from the query string into a map', () => {
    const r = CostSheetQuerySchema.parse({ oilWeightG: '900', priceOverride: { '12': '0.45' } })
    expect(r.oilWeightG).toBe(900)
    expect([...r.priceOverride]).toEqual([[12, 0.45]])
  })

  it.each([
    { q: { oilWeightG: '0' }, field: 'oilWeightG' },
    { q: { oilWeightG: 'lots' }, field: 'oilWeightG' },
    { q: { priceOverride: { x: '1' } }, field: 'priceOverride.x' },
    { q: { priceOverride: { '3': '-1' } }, field: 'priceOverride.3' },
  ])('refuses $field', ({ q, field }) => {
    const r = CostSheetQuerySchema.safeParse(q)
    expect(r.success).toBe(false)
    expect(r.error!.issues.map((i) => i.path.join('.'))).toContain(field)
  })
})
