import { z } from 'zod'
import { recordId } from '@shared/schemas/record-id'
import { GTIN_LENGTHS, gtinCheckDigit, isValidGtin } from '@shared/domain/gtin/gtin'

/** Capitals and digits in groups joined by single hyphens, at most 12 characters: LAV, HNY-XL. */
export const SKU_PATTERN = /^[A-Z0-9]+(-[A-Z0-9]+)*$/
export const SKU_MAX_LENGTH = 12
export const CASE_PACK_RANGE = Object.freeze({ min: 1, max: 500 })

/** What is wrong with a SKU (one message, the first that applies), or null. */
export function skuProblem(sku: string): string | null {
  if (sku === '') return 'Enter a SKU.'
  if (sku.length > SKU_MAX_LENGTH) return `A SKU has at most ${SKU_MAX_LENGTH} characters.`
  if (!SKU_PATTERN.test(sku)) {
    return 'Use capital letters and digits, with single hyphens between groups (e.g. LAV-MINI).'
  }
  return null
}

export const SkuSchema = z
  .string({ error: 'Enter a SKU.' })
  .trim()
  .superRefine((sku, ctx) => {
    const problem = skuProblem(sku)
    if (problem) ctx.addIssue({ code: 'custom', message: problem })
  })

/** What is wrong with a typed GTIN, or null when it is a valid GTIN-8, -12, -13 or -14 (GS1 check digit). */
export function gtinProblem(code: string): string | null {
  if (!/^\d+$/.test(code)) return 'A GTIN has digits only.'
  if (!GTIN_LENGTHS.includes(code.length)) return 'A GTIN has 8, 12, 13 or 14 digits.'
  if (!isValidGtin(code)) {
    return `The check digit is wrong: for these digits it should be ${gtinCheckDigit(code.slice(0, -1))}.`
  }
  return null
}

/** Spaces are how people copy a barcode's number; they are dropped. An empty value means no GTIN. */
export const GtinSchema = z
  .string({ error: 'Enter the GTIN as digits.' })
  .transform((s) => s.replace(/\s+/g, ''))
  .superRefine((code, ctx) => {
    if (code === '') return
    const problem = gtinProblem(code)
    if (problem) ctx.addIssue({ code: 'custom', message: problem })
  })
  .transform((code) => (code === '' ? null : code))

const optionalText = (max: number) =>
  z
    .string({ error: 'Enter text.' })
    .trim()
    .max(max, `At most ${max} characters.`)
    .transform((s) => (s === '' ? null : s))

const grams = (label: string) =>
  z
    .number({ error: `Enter the ${label} in whole grams.` })
    .int(`Enter the ${label} in whole grams.`)
    .positive(`The ${label} must be more than 0 g.`)
    .max(10_000, `The ${label} must be at most 10,000 g.`)

const productFields = {
  sku: SkuSchema,
  name: z
    .string({ error: 'Enter a name.' })
    .trim()
    .min(1, 'Enter a name.')
    .max(120, 'At most 120 characters.'),
  scentNotes: optionalText(200).nullish(),
  description: optionalText(2000).nullish(),
  recipeId: z.number({ error: 'Choose a recipe.' }).int('Choose a recipe.').positive('Choose a recipe.'),
  /** Declared on the label, after the cure. */
  netWeightG: grams('net weight'),
  /** Cut from the loaf, before the cure. */
  cutWeightG: grams('cut weight'),
  casePack: z
    .number({ error: 'Enter the bars per case.' })
    .int('Enter a whole number of bars.')
    .min(CASE_PACK_RANGE.min, `A case holds at least ${CASE_PACK_RANGE.min} bar.`)
    .max(CASE_PACK_RANGE.max, `A case holds at most ${CASE_PACK_RANGE.max} bars.`),
  msrpCents: z
    .number({ error: 'Enter the suggested retail price.' })
    .int('Enter the price in whole cents.')
    .min(0, 'The price cannot be negative.')
    .max(100_000_000, 'That price is too large.'),
  gtin: GtinSchema.nullish(),
  active: z.boolean({ error: 'Say whether the product is on sale.' }),
}

/** The fields without the cross-field rule, for forms that edit some of them in another shape. */
export const ProductBaseSchema = z.object(productFields)

const NET_OVER_CUT = 'The net weight cannot be more than the cut weight: bars lose water as they cure.'

export const ProductCreateSchema = z
  .object({ ...productFields, active: productFields.active.default(true) })
  .refine((p) => p.netWeightG <= p.cutWeightG, { path: ['netWeightG'], message: NET_OVER_CUT })
export type ProductCreateInput = z.output<typeof ProductCreateSchema>

/** Any subset of the fields; net ≤ cut is checked against the stored values too (by the service). */
export const ProductUpdateSchema = z
  .object(productFields)
  .partial()
  .refine((p) => p.netWeightG === undefined || p.cutWeightG === undefined || p.netWeightG <= p.cutWeightG, {
    path: ['netWeightG'],
    message: NET_OVER_CUT,
  })
export type ProductUpdateInput = z.output<typeof ProductUpdateSchema>
export const NET_OVER_CUT_MESSAGE = NET_OVER_CUT

export const ProductIdParamsSchema = z.object({ id: recordId('Not a product.') })

export const DeclarationConfirmSchema = z.object({
  text: z
    .string({ error: 'Enter the declaration text.' })
    .trim()
    .min(1, 'Enter the declaration text.')
    .max(4000, 'At most 4,000 characters.'),
})
export type DeclarationConfirmInput = z.output<typeof DeclarationConfirmSchema>

/** The photo rules, shared by the upload form and the server. */
export const PHOTO_MAX_BYTES = 2 * 1024 * 1024
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const
export type PhotoType = (typeof PHOTO_TYPES)[number]

export type ProductPhoto = {
  url: string
  sha256: string
  contentType: PhotoType
  sizeBytes: number
  filename: string
}

/** A product as the owner's screens show it. */
export type ProductRow = {
  id: number
  sku: string
  name: string
  scentNotes: string | null
  description: string | null
  recipeId: number
  recipeName: string
  netWeightG: number
  cutWeightG: number
  casePack: number
  msrpCents: number
  gtin: string | null
  active: boolean
  photo: ProductPhoto | null
  /** At current lot prices; null when the recipe has no cost yet. */
  costPerBarCents: number | null
  /** Ingredients of the recipe with no price on hand (their cost is missing from the figure). */
  missingCosts: string[]
  priceBreakCount: number
  pricedTierCount: number
  declarationConfirmedAt: string | null
  updatedAt: string
}

export type RecipeOption = { id: number; name: string; barWeightG: number }

export type DeclarationEntryView = { label: string; grams: number; pct: number; minor: boolean }

/** GET /api/products/:id/declaration */
export type ProductDeclaration = {
  productId: number
  recipeName: string
  /** The oil weight of one mould of the recipe, the batch the weights below are for. */
  oilWeightG: number
  netWeightG: number
  netWeightOz: number
  draft: { text: string; entries: DeclarationEntryView[] }
  /** Points a person must check before confirming (a fallback name, a missing INCI). */
  notes: string[]
  confirmed: { text: string; confirmedAt: string } | null
}
