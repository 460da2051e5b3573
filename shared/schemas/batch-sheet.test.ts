import { describe, expect, it } from 'vitest'
import { BatchSheetRequestSchema, RecipeSheetQuerySchema } from '@shared/schemas/batch-sheet'

const valid = { oils: [{ ingredientId: 1, grams: 500 }], superfatPct: 5, lyeConcentrationPct: 33 }

const fieldsOf = (input: unknown) => {
  const r = BatchSheetRequestSchema.safeParse(input)
  return r.success ? [] : r.error.issues.map((i) => i.path.join('.'))
}

describe('BatchSheetRequestSchema (the contract of POST /api/batch-sheet)', () => {
  it('accepts the contract body, with or without a purity', () => {
    expect(fieldsOf(valid)).toEqual([])
    expect(fieldsOf({ ...valid, lyePurityPct: 97 })).toEqual([])
  })

  it.each([
    { body: { ...valid, superfatPct: 25 }, field: 'superfatPct', source: 'SUPERFAT_RANGE 0–20' },
    { body: { ...valid, superfatPct: '5' }, field: 'superfatPct', source: 'numbers, not strings' },
    {
      body: { ...valid, lyeConcentrationPct: 10 },
      field: 'lyeConcentrationPct',
      source: 'LYE_CONCENTRATION_RANGE 20–50',
    },
    {
      body: { ...valid, lyeConcentrationPct: undefined },
      field: 'lyeConcentrationPct',
      source: 'water needs a basis',
    },
    { body: { ...valid, waterLyeRatio: 2 }, field: 'waterLyeRatio', source: 'either concentration or ratio' },
    { body: { ...valid, lyePurityPct: 40 }, field: 'lyePurityPct', source: 'LYE_PURITY_RANGE 50–100' },
    { body: { ...valid, oils: [] }, field: 'oils', source: 'at least one oil' },
    {
      body: { ...valid, oils: [{ ingredientId: 1, grams: 0 }] },
      field: 'oils.0.grams',
      source: 'more than 0 g',
    },
    {
      body: { ...valid, oils: [{ ingredientId: 'x', grams: 5 }] },
      field: 'oils.0.ingredientId',
      source: 'an id',
    },
  ])('refuses $field ($source)', ({ body, field }) => {
    expect(fieldsOf(body)).toContain(field)
  })
})

describe('RecipeSheetQuerySchema', () => {
  it.each([
    { q: {}, ok: true },
    { q: { oilWeightG: '750.5' }, ok: true },
    { q: { bars: '24' }, ok: true },
    { q: { bars: '2.5' }, ok: false },
    { q: { bars: '0' }, ok: false },
    { q: { oilWeightG: '-3' }, ok: false },
    { q: { oilWeightG: '500', bars: '4' }, ok: false },
  ])('$q → ok: $ok', ({ q, ok }) => {
    expect(RecipeSheetQuerySchema.safeParse(q).success).toBe(ok)
  })
})
