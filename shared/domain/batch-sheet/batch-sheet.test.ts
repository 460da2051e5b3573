import { describe, expect, it } from 'vitest'
import { DomainError } from '@shared/domain/errors'
import {
  OILS_SUM_TOLERANCE,
  VANILLIN_WARN_PCT,
  computeBatchSheet,
  computeRecipeBatchSheet,
  oilPercentagesAddUp,
  oilPercentagesSum,
  oilWeightForBars,
  scaleOils,
  type BatchRecipe,
  type BatchSheetInput,
} from '@shared/domain/batch-sheet/batch-sheet'

const oils = [
  { ingredientId: 1, name: 'Olive oil', grams: 300, sapNaoh: 0.135 },
  { ingredientId: 2, name: 'Coconut oil', grams: 150, sapNaoh: 0.183 },
  { ingredientId: 3, name: 'Castor oil', grams: 50, sapNaoh: 0.128 },
]

const base: BatchSheetInput = {
  oils,
  superfatPct: 5,
  water: { mode: 'concentration', pct: 33 },
  fragrances: [{ ingredientId: 10, name: 'Lavender', pctOfOils: 5, maxUsagePct: 6, vanillinPct: 0.1 }],
  additives: [{ ingredientId: 20, name: 'Kaolin clay', gPerKgOils: 10 }],
}

// Worked by hand (same oils as the lye test):
//   NaOH  (300 × 0.135 + 150 × 0.183 + 50 × 0.128) × 0.95 = 74.35 × 0.95 = 70.6325 g
//   water at 33 %: 70.6325 × 0.67 ÷ 0.33 = 143.405378… g;  at 2:1: 70.6325 × 2 = 141.265 g
//   fragrance 5 % of 500 g = 25 g;  clay 10 g/kg × 0.5 kg = 5 g
//   total 500 + 70.6325 + 143.405378… + 25 + 5 = 744.037878… g
describe('computeBatchSheet totals', () => {
  it.each([
    {
      name: '33 % concentration',
      input: base,
      expected: {
        oilsG: 500,
        naohG: 70.6325,
        waterG: 143.405378788,
        fragranceG: 25,
        additivesG: 5,
        totalG: 744.037878788,
      },
      source: 'hand calculation',
    },
    {
      name: '2:1 water:lye',
      input: { ...base, water: { mode: 'ratio', ratio: 2 } } satisfies BatchSheetInput,
      expected: {
        oilsG: 500,
        naohG: 70.6325,
        waterG: 141.265,
        fragranceG: 25,
        additivesG: 5,
        totalG: 741.8975,
      },
      source: 'hand calculation',
    },
    {
      // 70.6325 ÷ 0.9 = 78.480556 g; water 2:1 = 156.961111 g; no fragrance, no additives
      name: '90 % pure lye, oils only',
      input: {
        oils,
        superfatPct: 5,
        water: { mode: 'ratio', ratio: 2 },
        lyePurityPct: 90,
      } satisfies BatchSheetInput,
      expected: {
        oilsG: 500,
        naohG: 78.480555556,
        waterG: 156.961111111,
        fragranceG: 0,
        additivesG: 0,
        totalG: 735.441666667,
      },
      source: 'hand calculation',
    },
  ])('$name ($source)', ({ input, expected }) => {
    const sheet = computeBatchSheet(input)
    for (const [key, value] of Object.entries(expected)) {
      expect(sheet[key as keyof typeof expected], key).toBeCloseTo(value, 6)
    }
  })
})

describe('computeBatchSheet lines', () => {
  const sheet = computeBatchSheet(base)

  it.each([
    { index: 0, role: 'oil', ingredientId: 1, grams: 300, pctOfOils: 60, source: 'hand calculation' },
    { index: 2, role: 'oil', ingredientId: 3, grams: 50, pctOfOils: 10, source: 'hand calculation' },
    // 70.6325 ÷ 500 = 14.1265 %
    {
      index: 3,
      role: 'lye',
      ingredientId: null,
      grams: 70.6325,
      pctOfOils: 14.1265,
      source: 'hand calculation',
    },
    {
      index: 4,
      role: 'water',
      ingredientId: null,
      grams: 143.405378788,
      pctOfOils: 28.681075758,
      source: 'hand calculation',
    },
    { index: 5, role: 'fragrance', ingredientId: 10, grams: 25, pctOfOils: 5, source: 'hand calculation' },
    { index: 6, role: 'additive', ingredientId: 20, grams: 5, pctOfOils: 1, source: 'hand calculation' },
  ])('line $index is $role, $grams g ($source)', ({ index, role, ingredientId, grams, pctOfOils }) => {
    const line = sheet.lines[index]
    expect(line).toMatchObject({ role, ingredientId })
    expect(line?.grams).toBeCloseTo(grams, 6)
    expect(line?.pctOfOils).toBeCloseTo(pctOfOils, 6)
  })

  it.each([
    // 300 g ÷ 28.349523125 g/oz = 10.582189… oz
    { index: 0, ounces: 10.582188584, source: 'NIST Handbook 44 App. C' },
    // 25 g ÷ 28.349523125 = 0.881849… oz
    { index: 5, ounces: 0.881849049, source: 'NIST Handbook 44 App. C' },
  ])('line $index in ounces = $ounces ($source)', ({ index, ounces }) => {
    expect(sheet.lines[index]?.ounces).toBeCloseTo(ounces, 8)
  })

  it('has one line per ingredient and the lines add up to the total (hand calculation)', () => {
    expect(sheet.lines).toHaveLength(7)
    expect(sheet.lines.reduce((s, l) => s + l.grams, 0)).toBeCloseTo(sheet.totalG, 9)
    expect(sheet.warnings).toEqual([])
  })
})

describe('computeBatchSheet warnings', () => {
  const withFragrance = (f: Partial<NonNullable<BatchSheetInput['fragrances']>[number]>) =>
    computeBatchSheet({
      ...base,
      fragrances: [{ ingredientId: 10, name: 'Lavender', pctOfOils: 5, ...f }],
    }).warnings.map((w) => w.code)

  it.each([
    {
      f: { pctOfOils: 7, maxUsagePct: 6 },
      codes: ['fragrance_over_max'],
      source: 'IFRA Standards (supplier certificate)',
    },
    { f: { pctOfOils: 6, maxUsagePct: 6 }, codes: [], source: 'IFRA Standards (supplier certificate)' },
    { f: { pctOfOils: 12, maxUsagePct: null }, codes: [], source: 'hand calculation' },
    { f: { vanillinPct: VANILLIN_WARN_PCT }, codes: [], source: 'common practice' },
    { f: { vanillinPct: 0.15 }, codes: [], source: 'common practice' },
    { f: { vanillinPct: 2 }, codes: ['vanillin_browning'], source: 'common practice' },
    {
      f: { pctOfOils: 8, maxUsagePct: 4.5, vanillinPct: 3 },
      codes: ['fragrance_over_max', 'vanillin_browning'],
      source: 'common practice',
    },
  ])('$f → $codes ($source)', ({ f, codes }) => {
    expect(withFragrance(f)).toEqual(codes)
  })

  it('names the fragrance in the message (hand calculation)', () => {
    const [warning] = computeBatchSheet({
      ...base,
      fragrances: [{ ingredientId: 11, name: 'Vanilla bean', pctOfOils: 5, vanillinPct: 4 }],
    }).warnings
    expect(warning).toMatchObject({ code: 'vanillin_browning', ingredientId: 11 })
    expect(warning?.message).toMatch(/Vanilla bean/)
  })
})

describe('computeBatchSheet bad input', () => {
  it.each<{ input: BatchSheetInput; field: string; source: string }>([
    { input: { ...base, oils: [] }, field: 'oils', source: 'hand calculation' },
    { input: { ...base, oils: [{ ...oils[0]!, grams: 0 }] }, field: 'oils', source: 'hand calculation' },
    {
      input: { ...base, oils: [oils[0]!, { ...oils[1]!, grams: -150 }] },
      field: 'oils.1.grams',
      source: 'hand calculation',
    },
    { input: { ...base, superfatPct: 25 }, field: 'superfatPct', source: 'common practice' },
    { input: { ...base, superfatPct: -2 }, field: 'superfatPct', source: 'common practice' },
    { input: { ...base, lyePurityPct: 30 }, field: 'lyePurityPct', source: 'common practice' },
    {
      input: { ...base, water: { mode: 'concentration', pct: 60 } },
      field: 'water.pct',
      source: 'common practice',
    },
    {
      input: { ...base, water: { mode: 'ratio', ratio: 0.5 } },
      field: 'water.ratio',
      source: 'common practice',
    },
    {
      input: { ...base, fragrances: [{ ingredientId: 10, name: 'Lavender', pctOfOils: -1 }] },
      field: 'fragrances.0.pctOfOils',
      source: 'hand calculation',
    },
    {
      input: {
        ...base,
        fragrances: [{ ingredientId: 10, name: 'Lavender', pctOfOils: 5, vanillinPct: 140 }],
      },
      field: 'fragrances.0.vanillinPct',
      source: 'hand calculation',
    },
    {
      input: { ...base, additives: [{ ingredientId: 20, name: 'Kaolin clay', gPerKgOils: -10 }] },
      field: 'additives.0.gPerKgOils',
      source: 'hand calculation',
    },
  ])('rejects $field ($source)', ({ input, field }) => {
    const call = () => computeBatchSheet(input)
    expect(call).toThrow(DomainError)
    expect(call).toThrow(expect.objectContaining({ field }))
  })
})

describe('scaleOils / oilPercentagesSum', () => {
  it.each([
    { pcts: [60, 30, 10], weight: 1000, grams: [600, 300, 100], source: 'hand calculation' },
    { pcts: [100], weight: 750, grams: [750], source: 'hand calculation' },
    // 33.33 + 33.33 + 33.33 = 99.99 (inside the tolerance): normalised, 1000 × 33.33 ÷ 99.99 = 333.333… each
    {
      pcts: [33.33, 33.33, 33.33],
      weight: 1000,
      grams: [1000 / 3, 1000 / 3, 1000 / 3],
      source: 'hand calculation',
    },
  ])('$pcts of $weight g → $grams ($source)', ({ pcts, weight, grams }) => {
    const scaled = scaleOils(
      pcts.map((pct, i) => ({ ingredientId: i + 1, pct })),
      weight,
    )
    scaled.forEach((o, i) => expect(o.grams).toBeCloseTo(grams[i]!, 9))
    expect(scaled.reduce((s, o) => s + o.grams, 0)).toBeCloseTo(weight, 9)
  })

  it.each([
    { pcts: [33.33, 33.33, 33.34], sum: 100, ok: true, source: 'hand calculation' },
    { pcts: [50, 49.995], sum: 99.995, ok: true, source: 'hand calculation' },
    // exactly OILS_SUM_TOLERANCE short
    { pcts: [33.33, 33.33, 33.33], sum: 100 - OILS_SUM_TOLERANCE, ok: true, source: 'hand calculation' },
    { pcts: [33.33, 33.33, 33.32], sum: 99.98, ok: false, source: 'hand calculation' },
    { pcts: [60, 30], sum: 90, ok: false, source: 'hand calculation' },
    { pcts: [60, 30, 10.5], sum: 100.5, ok: false, source: 'hand calculation' },
  ])('sum of $pcts = $sum, within tolerance: $ok ($source)', ({ pcts, sum, ok }) => {
    expect(oilPercentagesSum(pcts)).toBeCloseTo(sum, 9)
    expect(oilPercentagesAddUp(pcts)).toBe(ok)
    const call = () =>
      scaleOils(
        pcts.map((pct, i) => ({ ingredientId: i + 1, pct })),
        1000,
      )
    if (ok) expect(call).not.toThrow()
    else expect(call).toThrow(expect.objectContaining({ code: 'oils_sum', field: 'oils' }))
  })

  it.each([
    { pcts: [110, -10], weight: 1000, field: 'oils.1.pct', source: 'hand calculation' },
    { pcts: [100], weight: -1, field: 'oilWeightG', source: 'hand calculation' },
  ])('rejects $field ($source)', ({ pcts, weight, field }) => {
    expect(() =>
      scaleOils(
        pcts.map((pct, i) => ({ ingredientId: i + 1, pct })),
        weight,
      ),
    ).toThrow(expect.objectContaining({ field }))
  })
})

// 60 / 30 / 10 of the same oils, 2:1 water, 5 % fragrance, 10 g/kg clay. A 1000 g run, by hand:
//   NaOH (600 × 0.135 + 300 × 0.183 + 100 × 0.128) × 0.95 = 148.7 × 0.95 = 141.265 g
//   water 282.53 g, fragrance 50 g, clay 10 g → total 1483.795 g, ratio 1.483795
//   10 bars × 140 g = 1400 g → oils 1400 ÷ 1.483795 = 943.52656… g
const recipe: BatchRecipe = {
  oils: [
    { ingredientId: 1, name: 'Olive oil', pct: 60, sapNaoh: 0.135 },
    { ingredientId: 2, name: 'Coconut oil', pct: 30, sapNaoh: 0.183 },
    { ingredientId: 3, name: 'Castor oil', pct: 10, sapNaoh: 0.128 },
  ],
  superfatPct: 5,
  water: { mode: 'ratio', ratio: 2 },
  fragrances: [{ ingredientId: 10, name: 'Lavender', pctOfOils: 5 }],
  additives: [{ ingredientId: 20, name: 'Kaolin clay', gPerKgOils: 10 }],
}

describe('oilWeightForBars', () => {
  it.each([
    { bars: 10, barWeightG: 140, oilsG: 943.526565327, source: 'hand calculation' },
    // 1483.795 g of batch is what 1000 g of oils makes
    { bars: 1, barWeightG: 1483.795, oilsG: 1000, source: 'hand calculation' },
    // 24 bars × 4.5 oz × 28.349523125 = 3061.748497 g → ÷ 1.483795 = 2063.457888… g
    { bars: 24, barWeightG: 4.5 * 28.349523125, oilsG: 2063.457888, source: 'hand calculation' },
  ])('$bars bars of $barWeightG g → $oilsG g oils ($source)', ({ bars, barWeightG, oilsG }) => {
    const oils = oilWeightForBars({ bars, barWeightG, recipe })
    expect(oils).toBeCloseTo(oilsG, 5)
    expect(computeRecipeBatchSheet(recipe, oils).totalG).toBeCloseTo(bars * barWeightG, 6)
  })

  it.each([
    { bars: 0, barWeightG: 140, field: 'bars', source: 'hand calculation' },
    { bars: 2.5, barWeightG: 140, field: 'bars', source: 'hand calculation' },
    { bars: 10, barWeightG: -140, field: 'barWeightG', source: 'hand calculation' },
  ])('rejects $field ($source)', ({ bars, barWeightG, field }) => {
    expect(() => oilWeightForBars({ bars, barWeightG, recipe })).toThrow(expect.objectContaining({ field }))
  })
})
