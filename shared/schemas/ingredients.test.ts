import { describe, expect, it } from 'vitest'
import {
  CreateIngredientSchema,
  PurchaseFormSchema,
  PurchaseSchema,
  formatBaseQuantity,
  formatUnitCost,
  latestPossibleToday,
  unitProblem,
} from '@shared/schemas/ingredients'
import type { BaseUnit, IngredientKind, PurchaseUnit } from '@shared/schemas/ingredients'

const pathsOf = (r: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }) =>
  r.success ? [] : r.error!.issues.map((i) => i.path.join('.'))

describe('CreateIngredientSchema', () => {
  it.each([
    // SAP(NaOH) = SAP(KOH) ÷ 1000 × M(NaOH)/M(KOH) = × 0.712888 (IUPAC/CIAAW 2021, REFERENCES.md)
    { input: { sapKoh: 190 }, koh: 190, naoh: 0.13544872, source: 'IUPAC/CIAAW 2021 molar masses' },
    {
      input: { sapKoh: '256.5' },
      koh: 256.5,
      naoh: 0.18285577,
      source: 'IUPAC/CIAAW 2021; Codex CXS 210-1999 coconut midpoint',
    },
    { input: { sapNaoh: 0.1345 }, koh: 188.6708, naoh: 0.1345, source: 'IUPAC/CIAAW 2021 molar masses' },
  ])('completes the SAP pair from $input ($source)', ({ input, koh, naoh }) => {
    const r = CreateIngredientSchema.parse({ name: 'Oil', kind: 'oil', ...input })
    expect(Math.abs(r.sapKoh! - koh) / koh).toBeLessThan(2e-4)
    expect(Math.abs(r.sapNaoh! - naoh) / naoh).toBeLessThan(2e-4)
    expect(r.unit).toBe('g')
  })

  it.each<{ kind: IngredientKind; extra: object; expected: object; source: string }>([
    {
      kind: 'lye',
      extra: {},
      expected: { purityPct: 100, unit: 'g' },
      source: 'product rule: pure unless stated',
    },
    {
      kind: 'packaging',
      extra: { reorderLevel: '250' },
      expected: { unit: 'each', reorderLevel: 250 },
      source: 'product rule',
    },
    {
      kind: 'fragrance',
      extra: { maxUsagePct: '4.5', vanillinPct: '' },
      expected: { maxUsagePct: 4.5, vanillinPct: null },
      source: 'form text',
    },
  ])('fills in a $kind ($source)', ({ kind, extra, expected }) => {
    expect(CreateIngredientSchema.parse({ name: 'X', kind, ...extra })).toMatchObject(expected)
  })

  it.each<{ input: object; path: string; source: string }>([
    { input: { kind: 'oil' }, path: 'sapKoh', source: 'DESIGN.md: oils carry a NaOH SAP value' },
    { input: { kind: 'fragrance', sapNaoh: 0.13 }, path: 'sapNaoh', source: 'DESIGN.md: SAP for oils only' },
    { input: { kind: 'oil', sapKoh: 40 }, path: 'sapKoh', source: 'below any soap oil (common practice)' },
    { input: { kind: 'oil', sapNaoh: 0.3 }, path: 'sapNaoh', source: 'above coconut, Codex CXS 210-1999' },
    { input: { kind: 'oil', sapKoh: '1,90' }, path: 'sapKoh', source: 'not a number' },
    { input: { kind: 'lye', purityPct: 101 }, path: 'purityPct', source: 'a percentage' },
    { input: { kind: 'lye', purityPct: 99.555 }, path: 'purityPct', source: 'numeric(5,2) column' },
  ])('refuses $input on $path ($source)', ({ input, path }) => {
    expect(pathsOf(CreateIngredientSchema.safeParse({ name: 'X', ...input }))).toEqual([path])
  })
})

describe('PurchaseFormSchema', () => {
  const base = {
    ingredientId: '3',
    supplier: 'Northway',
    receivedOn: '2026-10-01',
    quantity: '11',
    unit: 'lb',
  }
  it.each([
    { cost: '64.50', freight: '', costCents: 6450, freightCents: 0, source: 'money helper' },
    { cost: '$1,234.56', freight: '12', costCents: 123456, freightCents: 1200, source: 'money helper' },
  ])('turns $cost + $freight into cents ($source)', ({ cost, freight, costCents, freightCents }) => {
    expect(PurchaseFormSchema.parse({ ...base, cost, freight })).toMatchObject({
      ingredientId: 3,
      quantity: 11,
      costCents,
      freightCents,
    })
  })

  it.each([
    { patch: { cost: '12.345' }, path: 'cost', source: 'at most two decimals' },
    { patch: { cost: '' }, path: 'cost', source: 'cost required' },
    { patch: { freight: '-2' }, path: 'freight', source: 'no negative money' },
    { patch: { quantity: '2.5', unit: 'each' }, path: 'quantity', source: 'items are whole' },
    { patch: { ingredientId: '' }, path: 'ingredientId', source: 'choose one' },
  ])('refuses $patch on $path ($source)', ({ patch, path }) => {
    expect(pathsOf(PurchaseFormSchema.safeParse({ ...base, cost: '10', freight: '', ...patch }))).toEqual([
      path,
    ])
  })

  it('is the API schema with money typed as text: both accept the same purchase (hand calculation)', () => {
    const api = PurchaseSchema.parse({ ...base, ingredientId: 3, quantity: 11, costCents: 6450 })
    const form = PurchaseFormSchema.parse({ ...base, cost: '64.50', freight: '' })
    expect(form).toEqual(api)
  })
})

describe('unitProblem', () => {
  it.each<{ kind: IngredientKind; unit: PurchaseUnit; ok: boolean; source: string }>([
    { kind: 'oil', unit: 'lb', ok: true, source: 'mass unit for a mass ingredient' },
    { kind: 'oil', unit: 'each', ok: false, source: 'product rule: each is for packaging' },
    { kind: 'packaging', unit: 'each', ok: true, source: 'product rule' },
    { kind: 'packaging', unit: 'g', ok: false, source: 'product rule: packaging is counted' },
    { kind: 'lye', unit: 'kg', ok: true, source: 'mass unit' },
  ])('$kind in $unit: $ok ($source)', ({ kind, unit, ok }) => {
    expect(unitProblem(kind, unit) === null).toBe(ok)
  })
})

describe('display', () => {
  it.each<{ cents: number; unit: BaseUnit; text: string; source: string }>([
    // (16800 + 17400) ¢ ÷ 40 000 g = 0.855 ¢/g = $8.55 per kg
    { cents: 0.855, unit: 'g', text: '$8.55 / kg', source: 'hand calculation' },
    { cents: 21, unit: 'each', text: '$0.21 each', source: 'hand calculation' },
    { cents: 2.5, unit: 'each', text: '$0.025 each', source: 'hand calculation' },
  ])('formatUnitCost($cents, $unit) = $text ($source)', ({ cents, unit, text }) => {
    expect(formatUnitCost(cents, unit)).toBe(text)
  })

  it.each<{ qty: number; unit: BaseUnit; text: string; source: string }>([
    // 11 lb = 4989.51607 g (NIST Handbook 44 App. C)
    { qty: 4989.51607, unit: 'g', text: '4.99 kg', source: 'NIST Handbook 44 App. C' },
    { qty: 450, unit: 'g', text: '450 g', source: 'hand calculation' },
    { qty: 1000, unit: 'each', text: '1,000 each', source: 'hand calculation' },
  ])('formatBaseQuantity($qty, $unit) = $text ($source)', ({ qty, unit, text }) => {
    expect(formatBaseQuantity(qty, unit)).toBe(text)
  })
})

describe('latestPossibleToday', () => {
  it.each([
    // Kiritimati keeps UTC+14 (IANA tz database): 11:00 UTC is already 01:00 the next day there
    {
      now: '2026-12-01T11:00:00Z',
      today: '2026-12-02',
      source: 'IANA tz database, Pacific/Kiritimati UTC+14',
    },
    {
      now: '2026-12-01T09:59:59Z',
      today: '2026-12-01',
      source: 'IANA tz database, Pacific/Kiritimati UTC+14',
    },
  ])('at $now it is $today somewhere ($source)', ({ now, today }) => {
    expect(latestPossibleToday(new Date(now))).toBe(today)
  })
})
