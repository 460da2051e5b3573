import { describe, expect, it } from 'vitest'
import { DomainError } from '@shared/domain/errors'
import {
  KOH_TO_NAOH,
  LYE_CAUTIONS,
  MOLAR_MASS_KOH,
  MOLAR_MASS_NAOH,
  concentrationFromRatio,
  naohForOils,
  sapKohToNaoh,
  sapNaohToKoh,
  waterFromConcentration,
  waterFromRatio,
} from '@shared/domain/lye/lye'

const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b)

describe('molar masses and the KOH → NaOH factor', () => {
  it.each([
    // 22.98976928 + 15.999 + 1.008 = 39.99676928
    { name: 'M(NaOH)', value: MOLAR_MASS_NAOH, expected: 39.99676928, digits: 8, source: 'CIAAW 2021' },
    // 39.0983 + 15.999 + 1.008 = 56.1053
    { name: 'M(KOH)', value: MOLAR_MASS_KOH, expected: 56.1053, digits: 8, source: 'CIAAW 2021' },
    // 39.99676928 ÷ 56.1053 = 0.7128875…
    { name: 'KOH_TO_NAOH', value: KOH_TO_NAOH, expected: 0.712888, digits: 6, source: 'CIAAW 2021' },
  ])('$name = $expected ($source)', ({ value, expected, digits }) => {
    expect(value).toBeCloseTo(expected, digits)
  })

  it("agrees with the trade's ÷ 1.403 within 2e-4 relative (common practice)", () => {
    expect(relative(KOH_TO_NAOH, 1 / 1.403)).toBeLessThan(2e-4)
  })
})

describe('sapKohToNaoh', () => {
  // Expected values are mg/g ÷ 1000 × 0.712888 (the CIAAW factor to six figures).
  it.each([
    { oil: 'coconut, low end', sapKoh: 248, naoh: 0.176796224, source: 'Codex CXS 210-1999' },
    { oil: 'coconut, midpoint', sapKoh: 256.5, naoh: 0.182855772, source: 'Codex CXS 210-1999' },
    { oil: 'coconut, high end', sapKoh: 265, naoh: 0.18891532, source: 'Codex CXS 210-1999' },
    { oil: 'palm, midpoint', sapKoh: 199.5, naoh: 0.142221156, source: 'Codex CXS 210-1999' },
    { oil: 'soybean, midpoint', sapKoh: 192, naoh: 0.136874496, source: 'Codex CXS 210-1999' },
    { oil: 'canola, midpoint', sapKoh: 187.5, naoh: 0.1336665, source: 'Codex CXS 210-1999' },
    { oil: 'sunflower high oleic, midpoint', sapKoh: 188, naoh: 0.134022944, source: 'Codex CXS 210-1999' },
    { oil: 'safflower high oleic, midpoint', sapKoh: 190, naoh: 0.13544872, source: 'Codex CXS 210-1999' },
    { oil: 'castor, midpoint', sapKoh: 181.5, naoh: 0.129389172, source: 'British Pharmacopoeia 1993' },
    { oil: 'lard, midpoint', sapKoh: 197.5, naoh: 0.14079538, source: 'Codex CXS 211-1999' },
  ])('$oil: $sapKoh mg KOH/g → $naoh g NaOH/g ($source)', ({ sapKoh, naoh }) => {
    const value = sapKohToNaoh(sapKoh)
    expect(relative(value, naoh)).toBeLessThan(1e-6)
    // the trade's shortcut, mg/g ÷ 1403
    expect(relative(value, sapKoh / 1403)).toBeLessThan(2e-4)
    expect(sapNaohToKoh(value)).toBeCloseTo(sapKoh, 9)
  })

  it.each([
    { call: () => sapKohToNaoh(-190), field: 'sapKoh', source: 'hand calculation' },
    { call: () => sapNaohToKoh(Number.NaN), field: 'sapNaoh', source: 'hand calculation' },
  ])('rejects bad input on $field ($source)', ({ call, field }) => {
    expect(call).toThrow(DomainError)
    expect(call).toThrow(expect.objectContaining({ field }))
  })
})

// A small recipe worked by hand:
//   olive   300 g × 0.135 = 40.5  g NaOH
//   coconut 150 g × 0.183 = 27.45 g
//   castor   50 g × 0.128 =  6.4  g
//   sum 74.35 g; 5 % superfat → 74.35 × 0.95 = 70.6325 g NaOH
//   at 90 % purity: 70.6325 ÷ 0.9 = 78.480555… g
const smallRecipe = [
  { grams: 300, sapNaoh: 0.135 },
  { grams: 150, sapNaoh: 0.183 },
  { grams: 50, sapNaoh: 0.128 },
]

describe('naohForOils', () => {
  it.each([
    { superfat: 5, purity: 100, naoh: 70.6325, source: 'hand calculation' },
    { superfat: 0, purity: 100, naoh: 74.35, source: 'hand calculation' },
    { superfat: 5, purity: 90, naoh: 70.6325 / 0.9, source: 'hand calculation' },
    // 74.35 × 0.8 = 59.48
    { superfat: 20, purity: 100, naoh: 59.48, source: 'hand calculation' },
  ])('superfat $superfat %, purity $purity % → $naoh g ($source)', ({ superfat, purity, naoh }) => {
    expect(naohForOils(smallRecipe, superfat, purity)).toBeCloseTo(naoh, 9)
  })

  it('90 % purity raises the lye by exactly 1/0.9 (hand calculation)', () => {
    const pure = naohForOils(smallRecipe, 5)
    expect(naohForOils(smallRecipe, 5, 90) / pure).toBeCloseTo(1 / 0.9, 12)
  })

  it('no oils, no lye (hand calculation)', () => {
    expect(naohForOils([], 5)).toBe(0)
  })

  it.each([
    { oils: smallRecipe, superfat: -1, purity: 100, field: 'superfatPct', source: 'common practice' },
    { oils: smallRecipe, superfat: 25, purity: 100, field: 'superfatPct', source: 'common practice' },
    {
      oils: smallRecipe,
      superfat: Number.NaN,
      purity: 100,
      field: 'superfatPct',
      source: 'hand calculation',
    },
    { oils: smallRecipe, superfat: 5, purity: 40, field: 'lyePurityPct', source: 'common practice' },
    { oils: smallRecipe, superfat: 5, purity: 101, field: 'lyePurityPct', source: 'hand calculation' },
    {
      oils: [
        { grams: 100, sapNaoh: 0.135 },
        { grams: -5, sapNaoh: 0.183 },
      ],
      superfat: 5,
      purity: 100,
      field: 'oils.1.grams',
      source: 'hand calculation',
    },
    {
      oils: [{ grams: 100, sapNaoh: -0.135 }],
      superfat: 5,
      purity: 100,
      field: 'oils.0.sapNaoh',
      source: 'hand calculation',
    },
  ])('rejects $field = bad ($source)', ({ oils, superfat, purity, field }) => {
    const call = () => naohForOils(oils, superfat, purity)
    expect(call).toThrow(DomainError)
    expect(call).toThrow(expect.objectContaining({ field }))
  })
})

describe('water', () => {
  it.each([
    // 70.6325 × (1 − 0.33) ÷ 0.33 = 70.6325 × 67 ÷ 33 = 143.405378…
    { lye: 70.6325, pct: 33, water: 143.405378788, source: 'hand calculation' },
    // 30 % : 100 × 0.7 ÷ 0.3 = 233.333…
    { lye: 100, pct: 30, water: 700 / 3, source: 'hand calculation' },
    // 50 % : equal weights
    { lye: 100, pct: 50, water: 100, source: 'hand calculation' },
  ])('$lye g lye at $pct % → $water g water ($source)', ({ lye, pct, water }) => {
    expect(waterFromConcentration(lye, pct)).toBeCloseTo(water, 9)
  })

  it.each([
    // 70.6325 × 2 = 141.265
    { lye: 70.6325, ratio: 2, water: 141.265, source: 'hand calculation' },
    { lye: 100, ratio: 2.5, water: 250, source: 'hand calculation' },
  ])('$lye g lye at $ratio:1 → $water g water ($source)', ({ lye, ratio, water }) => {
    expect(waterFromRatio(lye, ratio)).toBeCloseTo(water, 9)
  })

  it.each([
    // 100 ÷ (1 + 2) = 33.333… %: the trade's "2:1 is about 33 %"
    { ratio: 2, pct: 100 / 3, source: 'common practice' },
    { ratio: 3, pct: 25, source: 'common practice' },
    { ratio: 1, pct: 50, source: 'hand calculation' },
  ])('ratio $ratio:1 → $pct % ($source)', ({ ratio, pct }) => {
    expect(concentrationFromRatio(ratio)).toBeCloseTo(pct, 9)
    expect(waterFromConcentration(100, pct)).toBeCloseTo(waterFromRatio(100, ratio), 9)
  })

  it.each([
    { call: () => waterFromConcentration(70, 10), field: 'concentrationPct', source: 'common practice' },
    { call: () => waterFromConcentration(70, 60), field: 'concentrationPct', source: 'common practice' },
    { call: () => waterFromConcentration(-1, 33), field: 'lyeG', source: 'hand calculation' },
    { call: () => waterFromRatio(70, 0.5), field: 'ratio', source: 'common practice' },
    { call: () => waterFromRatio(70, 6), field: 'ratio', source: 'common practice' },
    { call: () => concentrationFromRatio(0), field: 'ratio', source: 'hand calculation' },
  ])('rejects bad input on $field ($source)', ({ call, field }) => {
    expect(call).toThrow(DomainError)
    expect(call).toThrow(expect.objectContaining({ field }))
  })
})

describe('LYE_CAUTIONS', () => {
  it.each([
    { code: 'H290', list: 'hazards', source: 'GHS/CLP (REFERENCES.md)' },
    { code: 'H314', list: 'hazards', source: 'GHS/CLP (REFERENCES.md)' },
    { code: 'P280', list: 'precautions', source: 'GHS/CLP (REFERENCES.md)' },
    { code: 'P260', list: 'precautions', source: 'GHS/CLP (REFERENCES.md)' },
    { code: 'P301+P330+P331', list: 'precautions', source: 'GHS/CLP (REFERENCES.md)' },
    { code: 'P303+P361+P353', list: 'precautions', source: 'GHS/CLP (REFERENCES.md)' },
    { code: 'P305+P351+P338', list: 'precautions', source: 'GHS/CLP (REFERENCES.md)' },
  ] as const)('carries $code ($source)', ({ code, list }) => {
    const entry = LYE_CAUTIONS[list].find((s) => s.code === code)
    expect(entry?.text).toMatch(/\S/)
  })

  it('names the signal word, pictogram, practice and disclaimer (GHS/CLP; common practice)', () => {
    expect(LYE_CAUTIONS.signalWord).toBe('Danger')
    expect(LYE_CAUTIONS.pictogram).toBe('GHS05')
    expect(LYE_CAUTIONS.practice).toContain('Always add lye to water, never water to lye.')
    expect(LYE_CAUTIONS.disclaimer).toMatch(/safety assessment/)
    expect(Object.isFrozen(LYE_CAUTIONS.precautions[0])).toBe(true)
  })
})
