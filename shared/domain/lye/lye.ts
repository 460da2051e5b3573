import { requireInRange, requireNonNegative, requirePositive } from '@shared/domain/errors'

/** IUPAC/CIAAW standard atomic weights, 2021 conventional values (g/mol). */
export const ATOMIC_WEIGHT = Object.freeze({ Na: 22.98976928, K: 39.0983, O: 15.999, H: 1.008 })

export const MOLAR_MASS_NAOH = ATOMIC_WEIGHT.Na + ATOMIC_WEIGHT.O + ATOMIC_WEIGHT.H // 39.99676928
export const MOLAR_MASS_KOH = ATOMIC_WEIGHT.K + ATOMIC_WEIGHT.O + ATOMIC_WEIGHT.H // 56.1053
/** One mole of either hydroxide saponifies the same ester bonds, so SAP scales by molar mass. ≈ 0.712888 */
export const KOH_TO_NAOH = MOLAR_MASS_NAOH / MOLAR_MASS_KOH

/** Percent ranges a recipe may use; outside them the input is a typo, not a recipe. Ends included. */
export const SUPERFAT_RANGE = Object.freeze({ min: 0, max: 20 })
export const LYE_CONCENTRATION_RANGE = Object.freeze({ min: 20, max: 50 })
export const LYE_PURITY_RANGE = Object.freeze({ min: 50, max: 100 })
/** Water:lye ratios that give a concentration inside LYE_CONCENTRATION_RANGE (4:1 = 20 %, 1:1 = 50 %). */
export const WATER_TO_LYE_RATIO_RANGE = Object.freeze({ min: 1, max: 4 })

/** mg KOH per g of oil (how published tables give it) → g NaOH per g of oil. */
export function sapKohToNaoh(mgKohPerG: number): number {
  requireNonNegative(mgKohPerG, 'sapKoh')
  return (mgKohPerG / 1000) * KOH_TO_NAOH
}

/** g NaOH per g of oil → mg KOH per g of oil. */
export function sapNaohToKoh(gNaohPerG: number): number {
  requireNonNegative(gNaohPerG, 'sapNaoh')
  return (gNaohPerG / KOH_TO_NAOH) * 1000
}

/**
 * Grams of lye as weighed: Σ grams × SAP(NaOH) × (1 − superfat) ÷ purity. The superfat leaves
 * that share of the oils unsaponified; a lye that is only 90 % NaOH needs 1/0.9 as much weighed.
 * Error fields follow the batch-sheet input: `oils.<i>.grams`, `superfatPct`, `lyePurityPct`.
 */
export function naohForOils(
  oils: readonly { grams: number; sapNaoh: number }[],
  superfatPct: number,
  purityPct = 100,
): number {
  requireInRange(superfatPct, SUPERFAT_RANGE, 'superfatPct')
  requireInRange(purityPct, LYE_PURITY_RANGE, 'lyePurityPct')
  let pureNaoh = 0
  oils.forEach((oil, i) => {
    requireNonNegative(oil.grams, `oils.${i}.grams`)
    requireNonNegative(oil.sapNaoh, `oils.${i}.sapNaoh`)
    pureNaoh += oil.grams * oil.sapNaoh
  })
  return (pureNaoh * (1 - superfatPct / 100)) / (purityPct / 100)
}

/** Water for a lye solution of `concentrationPct` % lye by weight: lye × (1 − c) ÷ c. */
export function waterFromConcentration(lyeG: number, concentrationPct: number): number {
  requireNonNegative(lyeG, 'lyeG')
  requireInRange(concentrationPct, LYE_CONCENTRATION_RANGE, 'concentrationPct')
  const c = concentrationPct / 100
  return (lyeG * (1 - c)) / c
}

/** Water for a water:lye ratio by weight (2 means 2 g of water per g of lye). */
export function waterFromRatio(lyeG: number, waterToLyeRatio: number): number {
  requireNonNegative(lyeG, 'lyeG')
  requireInRange(waterToLyeRatio, WATER_TO_LYE_RATIO_RANGE, 'ratio')
  return lyeG * waterToLyeRatio
}

/** Lye concentration in percent for a water:lye ratio: 100 ÷ (1 + ratio); 2:1 → 33.33 %. */
export function concentrationFromRatio(ratio: number): number {
  requirePositive(ratio, 'ratio')
  return 100 / (1 + ratio)
}

export interface CodedStatement {
  readonly code: string
  readonly text: string
}

export interface LyeCautions {
  readonly signalWord: string
  readonly pictogram: string
  readonly hazards: readonly CodedStatement[]
  readonly precautions: readonly CodedStatement[]
  readonly practice: readonly string[]
  readonly disclaimer: string
}

/**
 * Shown wherever the product tells someone how much sodium hydroxide to weigh. Classification
 * under GHS/CLP as given in REFERENCES.md (statement texts in its shortened wording); the
 * practice line has no formal source (common practice).
 */
export const LYE_CAUTIONS: LyeCautions = deepFreeze({
  signalWord: 'Danger',
  pictogram: 'GHS05',
  hazards: [
    { code: 'H290', text: 'May be corrosive to metals.' },
    { code: 'H314', text: 'Causes severe skin burns and eye damage.' },
  ],
  precautions: [
    { code: 'P280', text: 'Wear protective gloves, eye protection and face protection.' },
    { code: 'P260', text: 'Do not breathe dust.' },
    { code: 'P301+P330+P331', text: 'If swallowed: rinse mouth. Do not induce vomiting.' },
    { code: 'P303+P361+P353', text: 'If on skin: take off contaminated clothing. Rinse skin with water.' },
    { code: 'P305+P351+P338', text: 'If in eyes: rinse cautiously with water for several minutes.' },
  ],
  practice: ['Always add lye to water, never water to lye.'],
  disclaimer:
    "This batch sheet is an aid: the studio's own safety assessment, local cosmetic and labelling rules, and licensed advice decide.",
})

function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object') {
    Object.values(value).forEach(deepFreeze)
    Object.freeze(value)
  }
  return value
}
