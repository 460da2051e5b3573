import { requireFinite, requireNonNegative } from '@shared/domain/errors'

// The one place where mass changes unit. Everything is stored in grams; other units exist
// only at the edge (a supplier's invoice in pounds, a label in ounces).

export type MassUnit = 'g' | 'kg' | 'oz' | 'lb'
export type QuantityUnit = MassUnit | 'each'

/**
 * Exact by definition: the 1959 international yard and pound agreement fixes
 * 1 lb = 453.59237 g and 1 oz (avoirdupois) = 1/16 lb = 28.349523125 g (NIST Handbook 44, App. C).
 */
export const GRAMS_PER: Readonly<Record<MassUnit, number>> = Object.freeze({
  g: 1,
  kg: 1000,
  oz: 28.349523125,
  lb: 453.59237,
})

export const MASS_UNITS: readonly MassUnit[] = Object.freeze(['g', 'kg', 'oz', 'lb'])

export function isMassUnit(unit: string): unit is MassUnit {
  return Object.hasOwn(GRAMS_PER, unit)
}

export function toGrams(qty: number, unit: MassUnit): number {
  requireNonNegative(qty, 'qty')
  return qty * GRAMS_PER[unit]
}

export function gramsTo(grams: number, unit: MassUnit): number {
  requireNonNegative(grams, 'grams')
  return grams / GRAMS_PER[unit]
}

/** Mass goes to grams; counted items ('each': labels, boxes) stay as they are. */
export function toBaseQuantity(
  qty: number,
  unit: QuantityUnit,
): { quantity: number; baseUnit: 'g' | 'each' } {
  if (unit === 'each') return { quantity: requireNonNegative(qty, 'qty'), baseUnit: 'each' }
  return { quantity: toGrams(qty, unit), baseUnit: 'g' }
}

const formatters = new Map<string, Intl.NumberFormat>()
function fixed(decimals: number, locale: string): Intl.NumberFormat {
  const key = `${locale}|${decimals}`
  let f = formatters.get(key)
  if (!f) {
    f = new Intl.NumberFormat(locale, { minimumFractionDigits: decimals, maximumFractionDigits: decimals })
    formatters.set(key, f)
  }
  return f
}

/** "1,234.5 g" — display only; keep computing with the unrounded number. */
export function formatGrams(g: number, locale = 'en-US'): string {
  return `${fixed(1, locale).format(requireFinite(g, 'grams'))} g`
}

/** Grams shown as avoirdupois ounces, "17.64 oz" — display only. */
export function formatOunces(g: number, locale = 'en-US'): string {
  return `${fixed(2, locale).format(requireFinite(g, 'grams') / GRAMS_PER.oz)} oz`
}
