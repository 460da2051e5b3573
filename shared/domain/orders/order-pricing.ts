import { DomainError } from '@shared/domain/errors'
import { percentOf } from '@shared/domain/money/money'
import { compareIso } from '@shared/domain/dates/dates'
import { selectPriceBreak } from '@shared/domain/pricing/pricing'
import type { PriceBreak } from '@shared/domain/pricing/pricing'

export type { PriceBreak }

export interface PricingLine {
  productId: number
  /** Whole cases; an order is never for loose bars. */
  cases: number
  /** Bars per case. */
  casePack: number
  /** Declared net weight of one bar, whole grams. */
  netWeightG: number
  /** The shop's tier's breaks for this product. */
  breaks: readonly PriceBreak[]
}

export interface ShippingBand {
  /** The heaviest order (grams, inclusive) the band covers; null for "and above". */
  maxWeightG: number | null
  rateCents: number
}

export interface OrderPricingInput {
  lines: readonly PricingLine[]
  isOpeningOrder: boolean
  openingMinimumCents: number
  reorderMinimumCents: number
  /** Ascending by maxWeightG; only the last may be open-ended (null). */
  shippingBands: readonly ShippingBand[]
  /** Carton and fill per case, whole grams. */
  packagingWeightPerCaseG?: number
  taxRatePct: number
  taxExempt: boolean
}

export interface PricedLine {
  productId: number
  cases: number
  bars: number
  unitPriceCents: number
  lineTotalCents: number
  weightG: number
}

export interface OrderPricing {
  lines: PricedLine[]
  subtotalCents: number
  weightG: number
  shippingCents: number
  taxCents: number
  totalCents: number
  minimumCents: number
  /** How much more merchandise the order needs to meet its minimum; 0 when met. */
  belowMinimumByCents: number
}

function requireWhole(value: number, min: number, code: string, field: string, what: string): void {
  if (!Number.isSafeInteger(value) || value < min) {
    throw new DomainError(code, `${what} must be a whole number ≥ ${min} (got ${value})`, field)
  }
}

/**
 * A cart's lines before pricing: at least one line, whole cases, each product once (a second
 * line of the same product would be priced at the wrong break; the cart merges them instead).
 */
export function validateOrderLines(lines: readonly { productId: number; cases: number }[]): void {
  if (lines.length === 0) throw new DomainError('no_lines', 'An order needs at least one line', 'lines')
  const seen = new Set<number>()
  lines.forEach((line, i) => {
    requireWhole(line.cases, 1, 'invalid_cases', `lines.${i}.cases`, 'Cases')
    if (seen.has(line.productId)) {
      throw new DomainError(
        'duplicate_product',
        `Product ${line.productId} is on the order twice`,
        `lines.${i}.productId`,
      )
    }
    seen.add(line.productId)
  })
}

/** The break of the line's own case count: the greatest minCases ≤ cases. */
export function unitPriceFor(breaks: readonly PriceBreak[], cases: number, field = 'cases'): number {
  const seen = new Set<number>()
  breaks.forEach((b, i) => {
    requireWhole(b.minCases, 1, 'invalid_price_breaks', `breaks.${i}.minCases`, 'Minimum cases')
    requireWhole(b.unitPriceCents, 0, 'invalid_price_breaks', `breaks.${i}.unitPriceCents`, 'Unit price')
    if (seen.has(b.minCases)) {
      throw new DomainError(
        'invalid_price_breaks',
        `Two breaks start at ${b.minCases} cases`,
        `breaks.${i}.minCases`,
      )
    }
    seen.add(b.minCases)
  })
  const best = selectPriceBreak(breaks, cases)
  if (best === null) {
    const message =
      breaks.length === 0
        ? 'This product has no price at this tier'
        : `No price for fewer than the first break's cases`
    throw new DomainError('no_price', message, field)
  }
  return best.unitPriceCents
}

export function validateShippingBands(bands: readonly ShippingBand[]): void {
  let previous = -Infinity
  bands.forEach((band, i) => {
    requireWhole(band.rateCents, 0, 'invalid_shipping_bands', `shippingBands.${i}.rateCents`, 'Shipping rate')
    if (band.maxWeightG === null) {
      if (i !== bands.length - 1) {
        throw new DomainError(
          'invalid_shipping_bands',
          'Only the last band may be open-ended',
          `shippingBands.${i}.maxWeightG`,
        )
      }
      return
    }
    requireWhole(band.maxWeightG, 1, 'invalid_shipping_bands', `shippingBands.${i}.maxWeightG`, 'Band weight')
    if (band.maxWeightG <= previous) {
      throw new DomainError(
        'invalid_shipping_bands',
        'Bands must rise in weight',
        `shippingBands.${i}.maxWeightG`,
      )
    }
    previous = band.maxWeightG
  })
}

/**
 * The first band whose maxWeightG ≥ weight. An order heavier than every band pays the last band
 * (normally the open-ended one; without one, the heaviest band's rate rather than refusing the
 * order). No bands configured: shipping is free.
 */
export function shippingFor(weightG: number, bands: readonly ShippingBand[]): number {
  validateShippingBands(bands)
  const band = bands.find((b) => b.maxWeightG === null || weightG <= b.maxWeightG) ?? bands.at(-1)
  return band?.rateCents ?? 0
}

/**
 * Prices a cart. Tax rule (common practice in US wholesale): a sale for resale with a valid
 * certificate on file is exempt; otherwise tax is charged on the merchandise subtotal only,
 * rounded half up to the cent. Whether shipping is taxable differs from state to state (some tax
 * delivery charges, some not when stated separately; from memory): this portal leaves shipping
 * untaxed, and the studio's own tax advice decides. Minimums apply to the merchandise subtotal,
 * before shipping and tax (common practice).
 */
export function priceOrder(input: OrderPricingInput): OrderPricing {
  validateOrderLines(input.lines)
  requireWhole(input.openingMinimumCents, 0, 'invalid_minimum', 'openingMinimumCents', 'Opening minimum')
  requireWhole(input.reorderMinimumCents, 0, 'invalid_minimum', 'reorderMinimumCents', 'Reorder minimum')
  const packagingG = input.packagingWeightPerCaseG ?? 0
  requireWhole(packagingG, 0, 'invalid_weight', 'packagingWeightPerCaseG', 'Packaging weight')
  if (typeof input.taxRatePct !== 'number' || !(input.taxRatePct >= 0 && input.taxRatePct <= 100)) {
    throw new DomainError(
      'invalid_tax_rate',
      `Tax rate must be between 0 and 100 % (got ${input.taxRatePct})`,
      'taxRatePct',
    )
  }

  const lines = input.lines.map((line, i): PricedLine => {
    requireWhole(line.casePack, 1, 'invalid_case_pack', `lines.${i}.casePack`, 'Case pack')
    requireWhole(line.netWeightG, 1, 'invalid_weight', `lines.${i}.netWeightG`, 'Net weight')
    const field = line.breaks.length === 0 ? `lines.${i}.productId` : `lines.${i}.cases`
    const unitPriceCents = unitPriceFor(line.breaks, line.cases, field)
    const bars = line.cases * line.casePack
    return {
      productId: line.productId,
      cases: line.cases,
      bars,
      unitPriceCents,
      lineTotalCents: bars * unitPriceCents,
      weightG: bars * line.netWeightG + line.cases * packagingG,
    }
  })

  const subtotalCents = lines.reduce((sum, l) => sum + l.lineTotalCents, 0)
  const weightG = lines.reduce((sum, l) => sum + l.weightG, 0)
  const shippingCents = shippingFor(weightG, input.shippingBands)
  const taxCents = input.taxExempt ? 0 : percentOf(subtotalCents, input.taxRatePct)
  const minimumCents = input.isOpeningOrder ? input.openingMinimumCents : input.reorderMinimumCents
  if (!Number.isSafeInteger(subtotalCents + shippingCents + taxCents)) {
    throw new DomainError('amount_too_large', 'The order total is too large to price exactly', 'lines')
  }
  return {
    lines,
    subtotalCents,
    weightG,
    shippingCents,
    taxCents,
    totalCents: subtotalCents + shippingCents + taxCents,
    minimumCents,
    belowMinimumByCents: Math.max(0, minimumCents - subtotalCents),
  }
}

/**
 * A resale certificate makes a shop's orders tax exempt while it is on file and not expired;
 * `expiresOn` is the last day it is good for, null when it has no expiry date.
 */
export function isCertificateValid(
  certificate: { onFile: boolean; expiresOn: string | null },
  today: string,
): boolean {
  if (!certificate.onFile) return false
  return certificate.expiresOn === null || compareIso(today, certificate.expiresOn) <= 0
}
