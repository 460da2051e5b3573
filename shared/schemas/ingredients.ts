import { z } from 'zod'
import { recordId } from '@shared/schemas/record-id'
import { isValidIsoDate, isoToday, compareIso } from '@shared/domain/dates/dates'
import { LYE_PURITY_RANGE, sapKohToNaoh, sapNaohToKoh } from '@shared/domain/lye/lye'
import { formatCents, parseMoneyToCents, roundHalfUp } from '@shared/domain/money/money'
import { MASS_UNITS, gramsTo } from '@shared/domain/units/units'
import type { QuantityUnit } from '@shared/domain/units/units'

// ---------------------------------------------------------------------------------------------
// Words and units
// ---------------------------------------------------------------------------------------------

export const INGREDIENT_KINDS = [
  'oil',
  'lye',
  'liquid',
  'fragrance',
  'colourant',
  'additive',
  'packaging',
] as const
export type IngredientKind = (typeof INGREDIENT_KINDS)[number]
export const INGREDIENT_KIND_LABELS: Record<IngredientKind, string> = {
  oil: 'Oil or butter',
  lye: 'Lye',
  liquid: 'Liquid',
  fragrance: 'Fragrance',
  colourant: 'Colourant',
  additive: 'Additive',
  packaging: 'Packaging',
}

/** What stock and unit costs are counted in: grams, or items for packaging. */
export type BaseUnit = 'g' | 'each'
export const baseUnitFor = (kind: IngredientKind): BaseUnit => (kind === 'packaging' ? 'each' : 'g')

export const PURCHASE_UNITS = ['g', 'kg', 'oz', 'lb', 'each'] as const satisfies readonly QuantityUnit[]
export type PurchaseUnit = (typeof PURCHASE_UNITS)[number]
export const PURCHASE_UNIT_LABELS: Record<PurchaseUnit, string> = {
  g: 'g',
  kg: 'kg',
  oz: 'oz (avoirdupois)',
  lb: 'lb',
  each: 'each (items)',
}

/** The units a purchase of this kind may be entered in: items for packaging, mass for the rest. */
export function unitsFor(kind: IngredientKind): readonly PurchaseUnit[] {
  return kind === 'packaging' ? ['each'] : MASS_UNITS
}

/** Why `unit` does not fit an ingredient of `kind`, or null when it does. */
export function unitProblem(kind: IngredientKind, unit: PurchaseUnit): string | null {
  if (kind === 'packaging' && unit !== 'each') return 'Packaging is counted in items: use the unit "each".'
  if (kind !== 'packaging' && unit === 'each')
    return `${INGREDIENT_KIND_LABELS[kind]} is bought by weight: use g, kg, oz or lb ("each" is for packaging).`
  return null
}

/**
 * Saponification values a soap oil, butter or wax can have. Published values run from about 90
 * (beeswax, from memory) to 265 (coconut, Codex CXS 210-1999) mg KOH per g; anything outside
 * 50–300 is a typo or a value in the other unit (common practice).
 */
export const SAP_KOH_RANGE = Object.freeze({ min: 50, max: 300 })
/** The same bounds in g NaOH per g of oil, rounded outwards. */
export const SAP_NAOH_RANGE = Object.freeze({ min: 0.035, max: 0.215 })

/** The current-cost rule, stated the same way in API answers and on screen. */
export const COST_RULE =
  'Current cost is the average unit cost of the purchases still on hand, weighted by the quantity left in each; ' +
  'freight is part of a purchase’s cost, and used-up purchases no longer count.'

export const MAX_PURCHASE_QUANTITY = 1_000_000
export const MAX_PURCHASE_CENTS = 100_000_000
/** CSV imports: the file's size and its number of rows. */
export const IMPORT_MAX_BYTES = 1024 * 1024
export const IMPORT_MAX_ROWS = 2000

// ---------------------------------------------------------------------------------------------
// Field helpers: forms send text, the API sends numbers; both land here.
// ---------------------------------------------------------------------------------------------

const DECIMAL = /^[+-]?(\d+(\.\d*)?|\.\d+)$/

type NumberRule = {
  /** Names the value in messages: "the purity". */
  label: string
  min?: number
  /** Exclusive lower bound. */
  above?: number
  max?: number
  decimals?: number
  integer?: boolean
  /** The unit, for messages: "mg KOH per g". */
  unit?: string
}

function decimalsOf(n: number): number {
  const s = String(n)
  if (s.includes('e-')) return Number(s.split('e-')[1])
  return s.includes('.') ? s.split('.')[1]!.length : 0
}

/** A number, or null when left empty; range problems are reported with the bounds. */
function optionalNumber(rule: NumberRule) {
  const unit = rule.unit ? ` ${rule.unit}` : ''
  const fmt = (n: number) => n.toLocaleString('en-US', { maximumFractionDigits: 6 })
  return z
    .union([z.number(), z.string(), z.null()], { error: `Enter ${rule.label} as a number.` })
    .optional()
    .transform((raw, ctx): number | null => {
      if (raw === undefined || raw === null) return null
      let n: number
      if (typeof raw === 'string') {
        const t = raw.trim()
        if (t === '') return null
        if (!DECIMAL.test(t)) {
          ctx.addIssue({ code: 'custom', message: `Enter ${rule.label} as a number, such as 12.5.` })
          return z.NEVER
        }
        n = Number(t)
      } else n = raw
      const fail = (message: string) => {
        ctx.addIssue({ code: 'custom', message })
        return z.NEVER
      }
      if (!Number.isFinite(n)) return fail(`Enter ${rule.label} as a number.`)
      const between =
        rule.max !== undefined && (rule.min !== undefined || rule.above !== undefined)
          ? rule.above !== undefined
            ? `more than ${fmt(rule.above)} and at most ${fmt(rule.max)}${unit}`
            : `between ${fmt(rule.min!)} and ${fmt(rule.max)}${unit}`
          : null
      if (rule.above !== undefined && n <= rule.above)
        return fail(
          between
            ? `${cap(rule.label)} must be ${between}.`
            : `${cap(rule.label)} must be more than ${fmt(rule.above)}${unit}.`,
        )
      if (rule.min !== undefined && n < rule.min)
        return fail(
          between
            ? `${cap(rule.label)} must be ${between}.`
            : `${cap(rule.label)} cannot be below ${fmt(rule.min)}${unit}.`,
        )
      if (rule.max !== undefined && n > rule.max)
        return fail(
          between
            ? `${cap(rule.label)} must be ${between}.`
            : `${cap(rule.label)} must be at most ${fmt(rule.max)}${unit}.`,
        )
      if (rule.integer && !Number.isInteger(n)) return fail(`${cap(rule.label)} must be a whole number.`)
      if (rule.decimals !== undefined && decimalsOf(n) > rule.decimals)
        return fail(`${cap(rule.label)} takes at most ${rule.decimals} decimal places.`)
      return n
    })
}

function requiredNumber(rule: NumberRule) {
  return optionalNumber(rule).transform((n, ctx) => {
    if (n === null) {
      ctx.addIssue({ code: 'custom', message: `Enter ${rule.label}.` })
      return z.NEVER
    }
    return n
  })
}

const cap = (s: string) => s.charAt(0).toUpperCase() + s.slice(1)

function requiredText(label: string, max: number) {
  return z
    .string({ error: `Enter the ${label}.` })
    .trim()
    .min(1, `Enter the ${label}.`)
    .max(max, `At most ${max} characters.`)
}

/** Text that may be left empty; empty becomes null. */
function optionalText(max: number) {
  return z
    .string({ error: 'Enter text here, or leave it empty.' })
    .trim()
    .max(max, `At most ${max} characters.`)
    .nullish()
    .transform((s) => (s ? s : null))
}

// ---------------------------------------------------------------------------------------------
// Ingredients
// ---------------------------------------------------------------------------------------------

const IngredientFields = z.object({
  name: requiredText('name', 120),
  kind: z.enum(INGREDIENT_KINDS, {
    error: 'Choose a kind: oil, lye, liquid, fragrance, colourant, additive or packaging.',
  }),
  inci: optionalText(200),
  /** mg KOH per g of oil, as published tables give it. */
  // Their sane ranges depend on the kind, so checkIngredient holds them.
  sapKoh: optionalNumber({ label: 'SAP (KOH)' }),
  /** g NaOH per g of oil. */
  sapNaoh: optionalNumber({ label: 'SAP (NaOH)' }),
  purityPct: optionalNumber({
    label: 'the purity',
    min: LYE_PURITY_RANGE.min,
    max: LYE_PURITY_RANGE.max,
    decimals: 2,
    unit: '%',
  }),
  maxUsagePct: optionalNumber({ label: 'the maximum usage', above: 0, max: 100, decimals: 2, unit: '%' }),
  vanillinPct: optionalNumber({ label: 'the vanillin content', min: 0, max: 100, decimals: 2, unit: '%' }),
  reorderLevel: optionalNumber({ label: 'the reorder level', min: 0, max: 1_000_000_000, decimals: 3 }),
  notes: optionalText(2000),
})
type IngredientFieldsOut = z.output<typeof IngredientFields>

/** The rules that tie fields to the kind; shared by create and by an update merged onto the record. */
function checkIngredient(v: IngredientFieldsOut, ctx: z.RefinementCtx) {
  const issue = (path: keyof IngredientFieldsOut, message: string) =>
    ctx.addIssue({ code: 'custom', path: [path], message })
  if (v.kind === 'oil') {
    if (v.sapKoh === null && v.sapNaoh === null) {
      issue(
        'sapKoh',
        'An oil or butter needs its saponification value: enter SAP (KOH) in mg KOH per g, or SAP (NaOH) in g NaOH per g.',
      )
    }
    const kohOk = v.sapKoh !== null && v.sapKoh >= SAP_KOH_RANGE.min && v.sapKoh <= SAP_KOH_RANGE.max
    const naohOk = v.sapNaoh !== null && v.sapNaoh >= SAP_NAOH_RANGE.min && v.sapNaoh <= SAP_NAOH_RANGE.max
    if (v.sapKoh !== null && !kohOk) {
      issue(
        'sapKoh',
        v.sapKoh > 0 && v.sapKoh < 1
          ? `${v.sapKoh} looks like a NaOH value: enter it as SAP (NaOH) instead.`
          : `SAP (KOH) must be between ${SAP_KOH_RANGE.min} and ${SAP_KOH_RANGE.max} mg KOH per g.`,
      )
    }
    if (v.sapNaoh !== null && !naohOk) {
      issue(
        'sapNaoh',
        v.sapNaoh > 1
          ? `${v.sapNaoh} looks like a KOH value: enter it as SAP (KOH), in mg KOH per g.`
          : `SAP (NaOH) must be between ${SAP_NAOH_RANGE.min} and ${SAP_NAOH_RANGE.max} g NaOH per g.`,
      )
    }
    if (kohOk && naohOk) {
      const expected = sapKohToNaoh(v.sapKoh!)
      // Published tables round; 1 % apart means two different oils, not rounding.
      if (Math.abs(v.sapNaoh! - expected) / expected > 0.01) {
        issue(
          'sapNaoh',
          `SAP (NaOH) ${v.sapNaoh} does not match SAP (KOH) ${v.sapKoh}, which gives ${expected.toFixed(4)}. Enter just one of them.`,
        )
      }
    }
  } else {
    const kind = INGREDIENT_KIND_LABELS[v.kind].toLowerCase()
    if (v.sapKoh !== null)
      issue('sapKoh', `Only oils and butters have a saponification value, not a ${kind}.`)
    if (v.sapNaoh !== null)
      issue('sapNaoh', `Only oils and butters have a saponification value, not a ${kind}.`)
  }
  if (v.kind !== 'lye' && v.purityPct !== null) issue('purityPct', 'Purity is recorded for lye only.')
  if (v.kind !== 'fragrance') {
    if (v.maxUsagePct !== null) issue('maxUsagePct', 'A maximum usage is recorded for fragrances only.')
    if (v.vanillinPct !== null) issue('vanillinPct', 'Vanillin content is recorded for fragrances only.')
  }
}

/**
 * Either SAP value is enough: the other follows from the CIAAW molar masses (sapKohToNaoh). When
 * both are given, the KOH value (the form published tables use) is kept and NaOH derived from it.
 */
function completeIngredient(v: IngredientFieldsOut) {
  let { sapKoh, sapNaoh } = v
  if (sapKoh !== null) sapNaoh = sapKohToNaoh(sapKoh)
  else if (sapNaoh !== null) sapKoh = sapNaohToKoh(sapNaoh)
  return {
    ...v,
    sapKoh,
    sapNaoh,
    purityPct: v.kind === 'lye' ? (v.purityPct ?? 100) : null,
    unit: baseUnitFor(v.kind),
  }
}

export const CreateIngredientSchema =
  IngredientFields.superRefine(checkIngredient).transform(completeIngredient)
export type CreateIngredientInput = z.input<typeof CreateIngredientSchema>
export type IngredientValues = z.output<typeof CreateIngredientSchema>

/** Any of the fields; the result, merged onto the record, must pass the same rules as a new one. */
export const UpdateIngredientSchema = IngredientFields.partial().refine((v) => Object.keys(v).length > 0, {
  message: 'Change at least one field.',
})
export type UpdateIngredientInput = z.input<typeof UpdateIngredientSchema>
export type IngredientPatch = z.output<typeof UpdateIngredientSchema>

const booleanText = z
  .union([z.boolean(), z.enum(['true', 'false', '1', '0'])], { error: 'Use true or false.' })
  .optional()
  .transform((v) => v === true || v === 'true' || v === '1')

export const IngredientListQuerySchema = z.object({
  kind: z
    .enum(INGREDIENT_KINDS, {
      error: 'Choose a kind: oil, lye, liquid, fragrance, colourant, additive or packaging.',
    })
    .optional(),
  includeArchived: booleanText,
})
export type IngredientListQuery = z.output<typeof IngredientListQuerySchema>

export const IdParamsSchema = z.object({
  id: recordId('Not a record number.'),
})

export type IngredientRow = {
  id: number
  name: string
  kind: IngredientKind
  inci: string | null
  /** g NaOH per g of oil. */
  sapNaoh: number | null
  /** mg KOH per g of oil. */
  sapKoh: number | null
  purityPct: number | null
  maxUsagePct: number | null
  vanillinPct: number | null
  unit: BaseUnit
  /** In the base unit (g or each). */
  reorderLevel: number | null
  notes: string | null
  archived: boolean
  archivedAt: string | null
  /** Quantity left over all purchases, in the base unit. */
  onHand: number
  /** Cents per g (or per item), by COST_RULE; null when nothing is on hand. */
  currentUnitCost: number | null
  /** Number of purchases recorded. */
  lots: number
  lotsOnHand: number
  belowReorder: boolean
  /** Kind cannot change once purchases or recipes refer to it. */
  kindLocked: boolean
}

export type IngredientDetail = { ingredient: IngredientRow; lots: PurchaseRow[]; costRule: string }

// ---------------------------------------------------------------------------------------------
// Purchases (ingredient lots)
// ---------------------------------------------------------------------------------------------

/**
 * The received date may not lie ahead. The schema allows anything up to today at UTC+14, the
 * last place on Earth where a day begins, so no browser refuses a true date; the API then holds
 * it to today in the studio's own time zone.
 */
export function latestPossibleToday(now = new Date()): string {
  return isoToday(now, 'Pacific/Kiritimati')
}

const receivedOn = z
  .string({ error: 'Enter the date received, like 2026-11-30.' })
  .trim()
  .refine(isValidIsoDate, 'Enter the date received as YYYY-MM-DD, like 2026-11-30.')
  .refine(
    (d) => !isValidIsoDate(d) || compareIso(d, latestPossibleToday()) <= 0,
    'The date received cannot be in the future.',
  )

const cents = (label: string) =>
  z
    .number({ error: `Enter the ${label} in whole cents.` })
    .int(`The ${label} must be a whole number of cents.`)
    .min(0, `The ${label} cannot be negative.`)
    .max(MAX_PURCHASE_CENTS, `The ${label} must be at most ${formatCents(MAX_PURCHASE_CENTS)}.`)

const PurchaseFields = z.object({
  ingredientId: z
    .union([z.number(), z.string()], { error: 'Choose an ingredient.' })
    .transform((v) => (typeof v === 'string' && v.trim() === '' ? NaN : Number(v)))
    .pipe(
      z
        .number({ error: 'Choose an ingredient.' })
        .int('Choose an ingredient.')
        .positive('Choose an ingredient.')
        .max(2_147_483_647, 'Choose an ingredient.'),
    ),
  supplier: requiredText('supplier', 120),
  supplierLotCode: optionalText(60),
  receivedOn,
  quantity: requiredNumber({ label: 'the quantity', above: 0, max: MAX_PURCHASE_QUANTITY, decimals: 3 }),
  unit: z.enum(PURCHASE_UNITS, { error: 'Choose a unit: g, kg, oz, lb or each.' }),
  costCents: cents('cost'),
  // Not .default(0): a partial update must not read a missing freight as 0.
  freightCents: cents('freight')
    .optional()
    .transform((v) => v ?? 0),
  notes: optionalText(1000),
})

function checkPurchase(v: { unit: PurchaseUnit; quantity: number }, ctx: z.RefinementCtx) {
  if (v.unit === 'each' && !Number.isInteger(v.quantity)) {
    ctx.addIssue({
      code: 'custom',
      path: ['quantity'],
      message: 'Items are counted whole: enter a whole number.',
    })
  }
}

export const PurchaseSchema = PurchaseFields.superRefine(checkPurchase)
export type PurchaseInput = z.input<typeof PurchaseSchema>
export type PurchaseValues = z.output<typeof PurchaseSchema>

/** Only while nothing of the purchase has been used; merged onto the record and checked again. */
export const UpdatePurchaseSchema = PurchaseFields.partial().refine((v) => Object.keys(v).length > 0, {
  message: 'Change at least one field.',
})
export type UpdatePurchaseInput = z.input<typeof UpdatePurchaseSchema>
export type PurchasePatch = z.output<typeof UpdatePurchaseSchema>

const moneyText = (label: string, required: boolean) =>
  z
    .string()
    .trim()
    .transform((s, ctx) => {
      if (s === '' && !required) return 0
      const c = parseMoneyToCents(s)
      if (c === null) {
        ctx.addIssue({
          code: 'custom',
          message: s === '' ? `Enter the ${label}.` : `Enter the ${label} as an amount such as 12.50.`,
        })
        return z.NEVER
      }
      if (c > MAX_PURCHASE_CENTS) {
        ctx.addIssue({
          code: 'custom',
          message: `The ${label} must be at most ${formatCents(MAX_PURCHASE_CENTS)}.`,
        })
        return z.NEVER
      }
      return c
    })

/** The purchase form: the same fields, with cost and freight typed as money (parseMoneyToCents). */
export const PurchaseFormSchema = PurchaseFields.omit({ costCents: true, freightCents: true })
  .extend({ cost: moneyText('cost', true), freight: moneyText('freight', false) })
  .superRefine(checkPurchase)
  .transform(({ cost, freight, ...rest }) => ({ ...rest, costCents: cost, freightCents: freight }))
export type PurchaseFormInput = z.input<typeof PurchaseFormSchema>

export const PurchaseListQuerySchema = z
  .object({
    ingredientId: z.coerce
      .number({ error: 'Choose an ingredient.' })
      .int()
      .positive('Choose an ingredient.')
      .max(2_147_483_647, 'Choose an ingredient.')
      .optional(),
    from: z.string().refine(isValidIsoDate, 'Use a date like 2026-11-30.').optional(),
    to: z.string().refine(isValidIsoDate, 'Use a date like 2026-11-30.').optional(),
  })
  .refine(
    (q) =>
      !q.from || !q.to || !isValidIsoDate(q.from) || !isValidIsoDate(q.to) || compareIso(q.from, q.to) <= 0,
    {
      path: ['to'],
      message: 'The end date comes before the start date.',
    },
  )
export type PurchaseListQuery = z.output<typeof PurchaseListQuerySchema>

export type PurchaseRow = {
  id: number
  ingredientId: number
  ingredientName: string
  ingredientKind: IngredientKind
  /** The base unit that quantity, remaining and unitCost are counted in. */
  unit: BaseUnit
  supplier: string
  supplierLotCode: string | null
  receivedOn: string
  /** As entered: 11 lb stays 11 lb here. */
  enteredQuantity: number
  enteredUnit: PurchaseUnit
  /** In the base unit (g or each). */
  quantity: number
  remaining: number
  costCents: number
  freightCents: number
  totalCents: number
  /** Cents per g (or per item), freight included. */
  unitCost: number
  notes: string | null
  /** Something of it went into a batch: it can no longer be edited. */
  inUse: boolean
  createdAt: string
}

export type PurchaseBatchUse = {
  batchId: number
  lotCode: string
  pourDate: string
  productName: string | null
  /** In the base unit. */
  quantity: number
  costCents: number
}

export type PurchaseDetail = PurchaseRow & { batches: PurchaseBatchUse[] }

// ---------------------------------------------------------------------------------------------
// CSV import of purchases
// ---------------------------------------------------------------------------------------------

export const IMPORT_COLUMNS = [
  'ingredient',
  'supplier',
  'lot_code',
  'received_on',
  'quantity',
  'unit',
  'cost',
  'freight',
] as const
export type ImportColumn = (typeof IMPORT_COLUMNS)[number]
/** lot_code and freight may be left out of the header altogether. */
export const REQUIRED_IMPORT_COLUMNS: readonly ImportColumn[] = [
  'ingredient',
  'supplier',
  'received_on',
  'quantity',
  'unit',
  'cost',
]

/** JSON form of an import: the CSV text itself (a multipart upload sends it as the file `file`). */
export const ImportBodySchema = z.object({
  csv: z
    .string({ error: 'Paste the CSV text.' })
    .refine(
      (s) => new TextEncoder().encode(s).length <= IMPORT_MAX_BYTES,
      'The CSV is larger than 1 MB: split it into smaller files.',
    )
    .optional(),
})

export type ImportRowError = { field: ImportColumn | 'line'; message: string }
export type ImportRow = { line: number; values: Record<ImportColumn, string>; errors: ImportRowError[] }
export type ImportPreview = { rows: ImportRow[]; validCount: number; errorCount: number }
export type ImportResult = { purchases: PurchaseRow[]; count: number }

// ---------------------------------------------------------------------------------------------
// Display (no arithmetic beyond unit changes)
// ---------------------------------------------------------------------------------------------

const numberFormats = new Map<string, Intl.NumberFormat>()
function numberFormat(locale: string, max: number, min = 0, currency?: string) {
  const key = `${locale}|${min}|${max}|${currency ?? ''}`
  let f = numberFormats.get(key)
  if (!f) {
    f = new Intl.NumberFormat(locale, {
      minimumFractionDigits: min,
      maximumFractionDigits: max,
      ...(currency ? { style: 'currency', currency } : {}),
    })
    numberFormats.set(key, f)
  }
  return f
}

/** "19.6 kg", "450 g", "1,000 each". */
export function formatBaseQuantity(qty: number, unit: BaseUnit, locale = 'en-US'): string {
  if (unit === 'each') return `${numberFormat(locale, 0).format(qty)} each`
  if (Math.abs(qty) >= 1000)
    return `${numberFormat(locale, 3).format(gramsTo(Math.abs(qty), 'kg') * Math.sign(qty))} kg`
  return `${numberFormat(locale, 1).format(qty)} g`
}

/** "11 lb", "16 oz", "2,000 each": a quantity as it was entered. */
export function formatEnteredQuantity(qty: number, unit: PurchaseUnit, locale = 'en-US'): string {
  return `${numberFormat(locale, 3).format(qty)} ${unit}`
}

/**
 * A unit cost in cents per g shown per kg ("$8.40 / kg"); per item it keeps fractions of a cent
 * ("$0.025 each"), since labels often cost less than a cent apiece.
 */
export function formatUnitCost(
  centsPerBase: number,
  unit: BaseUnit,
  currency = 'USD',
  locale = 'en-US',
): string {
  if (unit === 'g') return `${formatCents(roundHalfUp(centsPerBase * 1000), currency, locale)} / kg`
  return `${numberFormat(locale, 4, 2, currency).format(centsPerBase / 100)} each`
}
