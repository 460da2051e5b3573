import { describe, expect, it } from 'vitest'
import { DomainError } from '@shared/domain/errors'
import {
  consumeOldestFirst,
  costBreakdown,
  costPerBar,
  costPerBarParts,
  lotUnitCostCents,
  weightedAverageUnitCost,
  type CostPerBarInput,
  type LotOnHand,
} from '@shared/domain/costing/costing'

describe('lotUnitCostCents', () => {
  it.each([
    // 50 lb pail (22 679.6185 g) for $89.99 → 8999 ÷ 22 679.6185 = 0.396788… ¢/g
    { lot: { quantity: 22679.6185, costCents: 8999 }, unit: 0.396788, source: 'hand calculation' },
    // 1000 labels for $45.00 → 4.5 ¢ each
    { lot: { quantity: 1000, costCents: 4500 }, unit: 4.5, source: 'hand calculation' },
    { lot: { quantity: 3, costCents: 100 }, unit: 100 / 3, source: 'hand calculation' },
    { lot: { quantity: 500, costCents: 0 }, unit: 0, source: 'hand calculation' },
  ])('$lot.costCents ¢ for $lot.quantity → $unit ($source)', ({ lot, unit }) => {
    expect(lotUnitCostCents(lot)).toBeCloseTo(unit, 6)
  })

  it.each([
    { lot: { quantity: 0, costCents: 100 }, field: 'quantity', source: 'hand calculation' },
    { lot: { quantity: -5, costCents: 100 }, field: 'quantity', source: 'hand calculation' },
    { lot: { quantity: 5, costCents: 10.5 }, field: 'costCents', source: 'hand calculation' },
    { lot: { quantity: 5, costCents: -100 }, field: 'costCents', source: 'hand calculation' },
  ])('rejects $field ($source)', ({ lot, field }) => {
    expect(() => lotUnitCostCents(lot)).toThrow(expect.objectContaining({ name: 'DomainError', field }))
  })
})

describe('weightedAverageUnitCost', () => {
  it.each([
    // (1000 × 0.5 + 3000 × 0.7) ÷ 4000 = 2600 ÷ 4000 = 0.65
    {
      lots: [
        { remainingQuantity: 1000, unitCost: 0.5 },
        { remainingQuantity: 3000, unitCost: 0.7 },
      ],
      average: 0.65,
      source: 'hand calculation',
    },
    // the used-up lot at 9 ¢ does not count
    {
      lots: [
        { remainingQuantity: 0, unitCost: 9 },
        { remainingQuantity: 250, unitCost: 0.4 },
      ],
      average: 0.4,
      source: 'hand calculation',
    },
    { lots: [{ remainingQuantity: 0, unitCost: 0.5 }], average: null, source: 'hand calculation' },
    { lots: [], average: null, source: 'hand calculation' },
  ])('$lots → $average ($source)', ({ lots, average }) => {
    const result = weightedAverageUnitCost(lots)
    if (average === null) expect(result).toBeNull()
    else expect(result).toBeCloseTo(average, 12)
  })

  it('rejects a negative remaining quantity (hand calculation)', () => {
    expect(() => weightedAverageUnitCost([{ remainingQuantity: -1, unitCost: 1 }])).toThrow(
      expect.objectContaining({ field: 'lots.0.remainingQuantity' }),
    )
  })
})

describe('consumeOldestFirst', () => {
  const lots: LotOnHand[] = [
    { id: 7, receivedDate: '2024-02-01', remainingQuantity: 1000, unitCost: 0.6 },
    { id: 5, receivedDate: '2024-01-10', remainingQuantity: 500, unitCost: 0.5 },
    { id: 3, receivedDate: '2024-01-10', remainingQuantity: 200, unitCost: 0.4 },
    { id: 2, receivedDate: '2023-12-01', remainingQuantity: 0, unitCost: 0.3 },
  ]

  it.each([
    // lot 3 (same day as 5, lower id) 200 × 0.4 = 80; lot 5 500 × 0.5 = 250; lot 7 100 × 0.6 = 60
    {
      needed: 800,
      takes: [
        { lotId: 3, quantity: 200, costCents: 80 },
        { lotId: 5, quantity: 500, costCents: 250 },
        { lotId: 7, quantity: 100, costCents: 60 },
      ],
      shortBy: 0,
      source: 'hand calculation',
    },
    {
      needed: 150,
      takes: [{ lotId: 3, quantity: 150, costCents: 60 }],
      shortBy: 0,
      source: 'hand calculation',
    },
    // 2000 needed, 1700 on hand → short by 300
    {
      needed: 2000,
      takes: [
        { lotId: 3, quantity: 200, costCents: 80 },
        { lotId: 5, quantity: 500, costCents: 250 },
        { lotId: 7, quantity: 1000, costCents: 600 },
      ],
      shortBy: 300,
      source: 'hand calculation',
    },
    { needed: 0, takes: [], shortBy: 0, source: 'hand calculation' },
  ])('$needed needed ($source)', ({ needed, takes, shortBy }) => {
    const result = consumeOldestFirst(lots, needed)
    expect(result.shortBy).toBe(shortBy)
    expect(result.takes).toHaveLength(takes.length)
    result.takes.forEach((t, i) => {
      expect(t.lotId).toBe(takes[i]?.lotId)
      expect(t.quantity).toBeCloseTo(takes[i]!.quantity, 9)
      expect(t.costCents).toBeCloseTo(takes[i]!.costCents, 9)
    })
  })

  it('leaves no float residue when the lots exactly cover the need (hand calculation)', () => {
    const small: LotOnHand[] = [
      { id: 1, receivedDate: '2024-01-01', remainingQuantity: 0.1, unitCost: 1 },
      { id: 2, receivedDate: '2024-01-02', remainingQuantity: 0.2, unitCost: 1 },
    ]
    expect(consumeOldestFirst(small, 0.3).shortBy).toBe(0)
  })

  it('does not change the lots it is given (hand calculation)', () => {
    const copy = structuredClone(lots)
    consumeOldestFirst(lots, 800)
    expect(lots).toEqual(copy)
  })

  it.each([
    { lots, needed: -1, field: 'needed', source: 'hand calculation' },
    {
      lots: [{ ...lots[0]!, receivedDate: '2024-02-30' }],
      needed: 1,
      field: 'lots.0.receivedDate',
      source: 'hand calculation',
    },
    {
      lots: [{ ...lots[0]!, remainingQuantity: -1 }],
      needed: 1,
      field: 'lots.0.remainingQuantity',
      source: 'hand calculation',
    },
  ])('rejects $field ($source)', ({ lots, needed, field }) => {
    expect(() => consumeOldestFirst(lots, needed)).toThrow(
      expect.objectContaining({ name: 'DomainError', field }),
    )
  })
})

describe('costPerBar', () => {
  const base: CostPerBarInput = {
    ingredientCostCents: 4321.5,
    packagingPerBarCents: 35,
    labourMinutes: 90,
    hourlyRateCents: 2400,
    barsCut: 12,
    barsKeptBack: 2,
  }

  it.each([
    // labour 90 min × 2400 ¢/h ÷ 60 = 3600; packaging 35 × 10 = 350;
    // total 4321.5 + 3600 + 350 = 8271.5; per bar 8271.5 ÷ 10 = 827.15 → 827
    {
      input: base,
      expected: {
        sellableBars: 10,
        batchIngredientCents: 4321.5,
        labourCents: 3600,
        packagingCents: 350,
        totalBatchCents: 8271.5,
        costPerBarCents: 827,
      },
      source: 'hand calculation',
    },
    // 1005 ÷ 2 = 502.5 → 503 (half up)
    {
      input: {
        ...base,
        ingredientCostCents: 1005,
        packagingPerBarCents: 0,
        labourMinutes: 0,
        barsCut: 2,
        barsKeptBack: 0,
      },
      expected: {
        sellableBars: 2,
        batchIngredientCents: 1005,
        labourCents: 0,
        packagingCents: 0,
        totalBatchCents: 1005,
        costPerBarCents: 503,
      },
      source: 'hand calculation',
    },
    // a loaf of 10 with its two end slices kept back leaves 8 (common practice);
    // 2000 + 45 min × 2000 ÷ 60 (1500) + 8 × 20 (160) = 3660 → 457.5 → 458
    {
      input: {
        ingredientCostCents: 2000,
        packagingPerBarCents: 20,
        labourMinutes: 45,
        hourlyRateCents: 2000,
        barsCut: 10,
        barsKeptBack: 2,
      },
      expected: {
        sellableBars: 8,
        batchIngredientCents: 2000,
        labourCents: 1500,
        packagingCents: 160,
        totalBatchCents: 3660,
        costPerBarCents: 458,
      },
      source: 'common practice',
    },
  ])('$expected.costPerBarCents ¢ a bar ($source)', ({ input, expected }) => {
    const result = costPerBar(input)
    for (const [key, value] of Object.entries(expected)) {
      expect(result[key as keyof typeof expected], key).toBeCloseTo(value, 9)
    }
    expect(Number.isInteger(result.costPerBarCents)).toBe(true)
  })

  it.each([
    {
      input: { ...base, barsKeptBack: 12 },
      code: 'no_sellable_bars',
      field: 'barsKeptBack',
      source: 'hand calculation',
    },
    {
      input: { ...base, barsKeptBack: 13 },
      code: 'no_sellable_bars',
      field: 'barsKeptBack',
      source: 'hand calculation',
    },
    {
      input: { ...base, barsCut: 0, barsKeptBack: 0 },
      code: 'no_sellable_bars',
      field: 'barsCut',
      source: 'hand calculation',
    },
    { input: { ...base, barsCut: 10.5 }, code: 'not_integer', field: 'barsCut', source: 'hand calculation' },
    {
      input: { ...base, barsKeptBack: -1 },
      code: 'out_of_range',
      field: 'barsKeptBack',
      source: 'hand calculation',
    },
    {
      input: { ...base, labourMinutes: -30 },
      code: 'negative',
      field: 'labourMinutes',
      source: 'hand calculation',
    },
    {
      input: { ...base, ingredientCostCents: Number.NaN },
      code: 'invalid_number',
      field: 'ingredientCostCents',
      source: 'hand calculation',
    },
  ])('rejects $field with $code ($source)', ({ input, code, field }) => {
    const call = () => costPerBar(input)
    expect(call).toThrow(DomainError)
    expect(call).toThrow(expect.objectContaining({ code, field }))
  })
})

describe('costBreakdown', () => {
  it.each([
    // 8271.5 total: ingredients 4321.5 (52.245…%), labour 3600 (43.523…%), packaging 350 (4.231…%)
    {
      parts: costPerBarParts(
        costPerBar({
          ingredientCostCents: 4321.5,
          packagingPerBarCents: 35,
          labourMinutes: 90,
          hourlyRateCents: 2400,
          barsCut: 12,
          barsKeptBack: 2,
        }),
      ),
      shares: [
        { category: 'ingredients', cents: 4321.5, pct: 52.245663 },
        { category: 'labour', cents: 3600, pct: 43.52294 },
        { category: 'packaging', cents: 350, pct: 4.231397 },
      ],
      source: 'hand calculation',
    },
    // oils 300 + 100 merged = 400 of 500 → 80 %; fragrance 100 → 20 %
    {
      parts: [
        { category: 'oils', cents: 300 },
        { category: 'fragrance', cents: 100 },
        { category: 'oils', cents: 100 },
      ],
      shares: [
        { category: 'oils', cents: 400, pct: 80 },
        { category: 'fragrance', cents: 100, pct: 20 },
      ],
      source: 'hand calculation',
    },
    {
      parts: [{ category: 'oils', cents: 0 }],
      shares: [{ category: 'oils', cents: 0, pct: 0 }],
      source: 'hand calculation',
    },
    { parts: [], shares: [], source: 'hand calculation' },
  ])('$shares.length categories ($source)', ({ parts, shares }) => {
    const result = costBreakdown<string>(parts)
    expect(result.map((s) => s.category)).toEqual(shares.map((s) => s.category))
    result.forEach((s, i) => {
      expect(s.cents).toBeCloseTo(shares[i]!.cents, 9)
      expect(s.pct).toBeCloseTo(shares[i]!.pct, 5)
    })
    if (result.length > 0 && result.some((s) => s.cents > 0)) {
      expect(result.reduce((sum, s) => sum + s.pct, 0)).toBeCloseTo(100, 9)
    }
  })

  it('rejects a negative part (hand calculation)', () => {
    expect(() => costBreakdown([{ category: 'oils', cents: -1 }])).toThrow(
      expect.objectContaining({ field: 'parts.0.cents' }),
    )
  })
})
