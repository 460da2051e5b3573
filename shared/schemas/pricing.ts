import { z } from 'zod'
import { recordId } from '@shared/schemas/record-id'
import { MARGIN_RANGE, validatePriceBreaks } from '@shared/domain/pricing/pricing'
import type { PriceBreakProblemCode, PriceLevel } from '@shared/domain/pricing/pricing'

export const TIER_NAME_MAX = 60

const tierFields = {
  name: z
    .string({ error: 'Enter a name.' })
    .trim()
    .min(1, 'Enter a name.')
    .max(TIER_NAME_MAX, `At most ${TIER_NAME_MAX} characters.`),
  targetMarginPct: z
    .number({ error: 'Enter the target margin in percent.' })
    .min(MARGIN_RANGE.min, 'The margin cannot be negative.')
    .lt(MARGIN_RANGE.maxExclusive, 'A margin is a share of the price: it must be below 100 %.')
    .refine((n) => Math.abs(n * 100 - Math.round(n * 100)) < 1e-6, {
      message: 'Use at most two decimals.',
    }),
}

export const TierCreateSchema = z.object(tierFields)
export type TierCreateInput = z.output<typeof TierCreateSchema>
export const TierUpdateSchema = z.object(tierFields).partial()
export type TierUpdateInput = z.output<typeof TierUpdateSchema>
export const TierIdParamsSchema = z.object({ id: recordId('Not a price tier.') })

export type TierRow = {
  id: number
  name: string
  targetMarginPct: number
  sortOrder: number
  shopCount: number
}

const FIELD_OF: Record<PriceBreakProblemCode, 'minCases' | 'unitPriceCents' | null> = {
  min_cases_invalid: 'minCases',
  duplicate_min_cases: 'minCases',
  price_invalid: 'unitPriceCents',
  price_rises: 'unitPriceCents',
  no_single_case_break: null,
}

/**
 * Where a price-break problem belongs: `breaks.N.minCases` / `breaks.N.unitPriceCents` for one
 * row, `breaks.0.minCases` when no break starts at 1 case (that row is where it gets fixed).
 */
export function priceBreakProblemPath(
  code: PriceBreakProblemCode,
  index: number | null,
): (string | number)[] {
  const field = FIELD_OF[code]
  if (index === null || field === null) return ['breaks', 0, 'minCases']
  return ['breaks', index, field]
}

// Only the type is checked per row: the ranges, duplicates and the ladder are validatePriceBreaks'
// job, so each problem is reported once, with the domain's own words.
const BreakSchema = z.object({
  minCases: z.number({ error: 'Enter the number of cases.' }),
  unitPriceCents: z.number({ error: 'Enter the price per bar.' }),
})

export const PriceBreaksSchema = z
  .object({
    breaks: z.array(BreakSchema, { error: 'Send the list of breaks.' }).max(20, 'At most 20 breaks.'),
  })
  .superRefine(({ breaks }, ctx) => {
    for (const p of validatePriceBreaks(breaks)) {
      ctx.addIssue({ code: 'custom', path: priceBreakProblemPath(p.code, p.index), message: p.message })
    }
  })
export type PriceBreaksInput = z.output<typeof PriceBreaksSchema>

export const PricingParamsSchema = z.object({
  productId: recordId('Not a product.'),
  tierId: recordId('Not a price tier.'),
})

export const AcceptSuggestionsSchema = z
  .object({
    items: z
      .array(
        z.object({
          productId: z.number({ error: 'Name the product.' }).int().positive(),
          tierId: z.number({ error: 'Name the tier.' }).int().positive(),
          unitPriceCents: z
            .number({ error: 'Send the suggested price.' })
            .int('Send the price in whole cents.')
            .positive('The price must be more than 0.'),
        }),
        { error: 'Send the suggestions to accept.' },
      )
      .min(1, 'Choose at least one suggestion.')
      .max(1000, 'At most 1,000 suggestions at once.'),
  })
  .superRefine(({ items }, ctx) => {
    const seen = new Set<string>()
    items.forEach((it, i) => {
      const key = `${it.productId}:${it.tierId}`
      if (seen.has(key)) {
        ctx.addIssue({
          code: 'custom',
          path: ['items', i, 'tierId'],
          message: 'This product and tier are in the list twice.',
        })
      }
      seen.add(key)
    })
  })
export type AcceptSuggestionsInput = z.output<typeof AcceptSuggestionsSchema>

export type PriceBreakView = { minCases: number; unitPriceCents: number }

/** One product in one tier, on the pricing screen. */
export type PricingCell = {
  tierId: number
  breaks: PriceBreakView[]
  /** The 1-case break's price: what a shop in this tier pays for a single case; null when unpriced. */
  singleCasePriceCents: number | null
  /** Margin of the 1-case price on the cost per bar, percent; null without a price or a cost. */
  marginPct: number | null
  /** ok / under_margin / under_cost for the 1-case price; null without a price or a cost. */
  level: PriceLevel | null
  /** cost ÷ (1 − tier margin), up to the studio's price step; null without a cost. */
  suggestedUnitPriceCents: number | null
  /**
   * Why the suggestion cannot be accepted as it stands, or null when it can. `price_rises`: a
   * larger break costs more than the suggestion; `same_price`: the 1-case price already is it.
   */
  suggestionBlocked: 'price_rises' | 'same_price' | 'no_cost' | null
}

export type PricingItem = {
  productId: number
  sku: string
  name: string
  recipeName: string
  casePack: number
  msrpCents: number
  costPerBarCents: number | null
  missingCosts: string[]
  /** 2 × the keystone tier's 1-case price (Monash Business School, Marketing Dictionary). */
  keystoneMsrpCents: number | null
  cells: PricingCell[]
}

/** GET /api/pricing */
export type PricingOverview = {
  currency: string
  priceStepCents: number
  tiers: TierRow[]
  /** The tier whose 1-case price the keystone MSRP doubles: "Standard" when there is one, else the first. */
  keystoneTierId: number | null
  items: PricingItem[]
}

export type PriceWarning = { field: string; code: 'under_margin'; message: string; marginPct: number }
