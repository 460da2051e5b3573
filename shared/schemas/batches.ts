import { z } from 'zod'
import { recordId } from '@shared/schemas/record-id'
import { WRITE_OFF_REASONS } from '@shared/domain/stock/ledger'
import type { MoveKind, WriteOffReason } from '@shared/domain/stock/ledger'
import { compareIso, isValidIsoDate, isoToday } from '@shared/domain/dates/dates'

export const BATCH_STATUSES = ['curing', 'ready', 'used_up'] as const
export type BatchStatus = (typeof BATCH_STATUSES)[number]
export const BATCH_STATUS_LABELS: Record<BatchStatus, string> = {
  curing: 'Curing',
  ready: 'Ready',
  used_up: 'Used up',
}

export const WRITE_OFF_REASON_LABELS: Record<WriteOffReason, string> = {
  damaged: 'Damaged',
  sweating: 'Sweating (glycerin dew)',
  spots: 'Spots (orange or soft spots)',
  sample: 'Given as samples',
  recount: 'Recount',
}

export const MOVE_KIND_LABELS: Record<MoveKind, string> = {
  made: 'Made',
  reserved: 'Reserved for an order',
  released: 'Released from an order',
  shipped: 'Shipped',
  written_off: 'Written off',
  adjusted: 'Count corrected',
}

/**
 * The latest calendar date anywhere on Earth (UTC+14). The schema runs in the browser and on the
 * server, neither of which knows the studio's time zone, so it only refuses dates that are in the
 * future everywhere; the server then checks against the studio's own today.
 */
export function latestTodayOnEarth(now: Date = new Date()): string {
  return isoToday(now, 'Etc/GMT-14')
}

const isoDate = (what: string) =>
  z
    .string({ error: `Enter the ${what}.` })
    .trim()
    .refine(isValidIsoDate, `Enter the ${what} as a calendar date (YYYY-MM-DD).`)
    .refine(
      (d) => !isValidIsoDate(d) || compareIso(d, '2000-01-01') >= 0,
      'Dates before 2000 are not accepted.',
    )

const wholeNumber = (what: string, min: number, max: number) =>
  z.coerce
    .number<string | number>({ error: `Enter the ${what}.` })
    .int(`The ${what} is a whole number.`)
    .min(min, `The ${what} must be at least ${min}.`)
    .max(max, `The ${what} must be at most ${max}.`)

const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `At most ${max} characters.`)
    .nullish()
    .transform((v) => (v ? v : null))

export const BatchLotInputSchema = z.object({
  ingredientLotId: z.coerce
    .number<string | number>()
    .int()
    .positive('Choose a lot.')
    .max(2_147_483_647, 'Choose a lot.'),
  quantity: z.coerce
    .number<string | number>({ error: 'Enter a quantity.' })
    .min(0, 'A quantity cannot be negative.')
    .max(10_000_000, 'That quantity is too large.'),
})
export type BatchLotInput = z.infer<typeof BatchLotInputSchema>

/**
 * Recording a poured batch. `lots` lists what was actually taken from which purchase (rows with
 * quantity 0 are dropped); without it the server takes the oldest lots first.
 */
export const RecordBatchSchema = z
  .object({
    productId: z.coerce
      .number<string | number>({ error: 'Choose a product.' })
      .int()
      .positive('Choose a product.'),
    pourDate: isoDate('pour date').refine(
      (d) => !isValidIsoDate(d) || compareIso(d, latestTodayOnEarth()) <= 0,
      'The pour date cannot be in the future.',
    ),
    oilWeightG: z
      .union([
        z.literal(''),
        z.null(),
        z.coerce
          .number<string | number>({ error: 'Enter the oil weight in grams.' })
          .positive('The oil weight must be above 0 g.')
          .max(200_000, 'At most 200 kg of oils in one batch.'),
      ])
      .optional()
      .transform((v) => (v === '' || v === null ? undefined : v)),
    lots: z.array(BatchLotInputSchema).max(100, 'At most 100 lots in one batch.').optional(),
    barsCut: wholeNumber('number of bars cut', 1, 10_000),
    barsKeptBack: wholeNumber('number of bars kept back', 0, 10_000).default(0),
    keptBackReason: optionalText(200),
    location: optionalText(60),
    notes: optionalText(2000),
    /** The planned pour this batch pours: recording it marks the plan poured. */
    plannedPourId: z.coerce
      .number<string | number>()
      .int('Not a planned pour.')
      .positive('Not a planned pour.')
      .nullish(),
  })
  .superRefine((v, ctx) => {
    if (v.barsKeptBack >= v.barsCut) {
      ctx.addIssue({
        code: 'custom',
        path: ['barsKeptBack'],
        message: 'Keep back fewer bars than you cut: at least one bar must be left to sell.',
      })
    }
    const seen = new Map<number, number>()
    v.lots?.forEach((lot, i) => {
      if (seen.has(lot.ingredientLotId)) {
        ctx.addIssue({
          code: 'custom',
          path: ['lots', i, 'ingredientLotId'],
          message: 'This lot is listed twice; put its whole quantity on one row.',
        })
      }
      seen.set(lot.ingredientLotId, i)
    })
  })
export type RecordBatchInput = z.infer<typeof RecordBatchSchema>
export type RecordBatchFormValues = z.input<typeof RecordBatchSchema>

/** Changing a batch after pouring: only where it sits and what the owner notes about it. */
export const UpdateBatchSchema = z
  .object({ location: optionalText(60).optional(), notes: optionalText(2000).optional() })
  .refine((v) => v.location !== undefined || v.notes !== undefined, {
    message: 'Send a location or notes to change.',
    path: ['location'],
  })
export type UpdateBatchInput = z.infer<typeof UpdateBatchSchema>

export const STOCK_MOVE_INPUT_KINDS = ['written_off', 'adjusted'] as const
export type StockMoveInputKind = (typeof STOCK_MOVE_INPUT_KINDS)[number]

const stockMoveFields = {
  kind: z.enum(STOCK_MOVE_INPUT_KINDS, { error: 'Choose a write-off or a count correction.' }),
  reason: z.enum(WRITE_OFF_REASONS, { error: 'Choose a reason.' }),
  bars: z.coerce
    .number<string | number>({ error: 'Enter the number of bars.' })
    .int('Bars are whole numbers.')
    .min(-100_000, 'That is more bars than a batch holds.')
    .max(100_000, 'That is more bars than a batch holds.'),
  note: optionalText(500),
}

function checkMove(
  v: { kind: StockMoveInputKind; reason: WriteOffReason; bars: number },
  ctx: z.RefinementCtx,
) {
  if (v.kind === 'written_off') {
    if (v.bars <= 0) ctx.addIssue({ code: 'custom', path: ['bars'], message: 'Write off at least 1 bar.' })
    if (v.reason === 'recount') {
      ctx.addIssue({
        code: 'custom',
        path: ['reason'],
        message: 'A recount that finds fewer bars is a count correction with a negative number.',
      })
    }
  } else {
    if (v.bars === 0) {
      ctx.addIssue({
        code: 'custom',
        path: ['bars'],
        message: 'A correction adds or removes at least 1 bar.',
      })
    }
    if (v.reason !== 'recount') {
      ctx.addIssue({
        code: 'custom',
        path: ['reason'],
        message: 'A count correction has the reason “recount”.',
      })
    }
  }
}

/** A write-off (bars > 0 lost) or a count correction (signed, not 0) on one batch, with its reason. */
export const StockMoveSchema = z
  .object({
    batchId: z.coerce.number<string | number>().int().positive().max(2_147_483_647),
    ...stockMoveFields,
  })
  .superRefine(checkMove)
export type StockMoveInput = z.infer<typeof StockMoveSchema>

/** The body of POST /api/batches/:id/moves: the batch comes from the path. */
export const StockMoveBodySchema = z.object(stockMoveFields).superRefine(checkMove)
export type StockMoveBody = z.infer<typeof StockMoveBodySchema>
export type StockMoveFormValues = z.input<typeof StockMoveBodySchema>

export const BatchIdParamsSchema = z.object({ id: recordId('Not a batch.') })
export const LotIdParamsSchema = z.object({ lotId: recordId('Not an ingredient lot.') })

const optionalId = z
  .union([z.literal(''), z.coerce.number().int().positive().max(2_147_483_647)])
  .optional()
  .transform((v) => (v === '' ? undefined : v))
const optionalDate = z
  .union([z.literal(''), z.string().refine(isValidIsoDate, 'Use a calendar date (YYYY-MM-DD).')])
  .optional()
  .transform((v) => (v === '' ? undefined : v))

export const ListBatchesQuerySchema = z
  .object({
    productId: optionalId,
    status: z
      .union([z.literal(''), z.enum(BATCH_STATUSES, { error: 'Use curing, ready or used_up.' })])
      .optional()
      .transform((v) => (v === '' ? undefined : v)),
    pouredFrom: optionalDate,
    pouredTo: optionalDate,
  })
  .refine((v) => !v.pouredFrom || !v.pouredTo || compareIso(v.pouredFrom, v.pouredTo) <= 0, {
    path: ['pouredTo'],
    message: 'The end of the range is before its start.',
  })
export type ListBatchesQuery = z.infer<typeof ListBatchesQuerySchema>
/** The same filters as the client builds them (every one optional). */
export type BatchFilter = Partial<ListBatchesQuery>

export const SuggestLotsQuerySchema = z.object({
  productId: z.coerce.number({ error: 'Choose a product.' }).int().positive().max(2_147_483_647),
  oilWeightG: z
    .union([z.literal(''), z.coerce.number().positive('The oil weight must be above 0 g.').max(200_000)])
    .optional()
    .transform((v) => (v === '' ? undefined : v)),
  pourDate: optionalDate,
  barsCut: z
    .union([z.literal(''), z.coerce.number().int().min(1).max(10_000)])
    .optional()
    .transform((v) => (v === '' ? undefined : v)),
  barsKeptBack: z
    .union([z.literal(''), z.coerce.number().int().min(0).max(10_000)])
    .optional()
    .transform((v) => (v === '' ? undefined : v)),
})
export type SuggestLotsQuery = z.infer<typeof SuggestLotsQuerySchema>

export const TraceLotsQuerySchema = z.object({
  q: z.string().trim().max(60).optional(),
})

// ---- Answers -------------------------------------------------------------------------------

/** A product that can be poured, with the figures the batch form starts from. */
export type PourableProduct = {
  id: number
  sku: string
  name: string
  active: boolean
  casePack: number
  cutWeightG: number
  recipeId: number
  recipeName: string
  cureDays: number
  mouldOilWeightG: number
  barsPerMould: number
  barsKeptBackPerMould: number
  barWeightG: number
}

export type StockFigures = { free: number; reserved: number; onHand: number }

export type BatchRow = StockFigures & {
  id: number
  lotCode: string
  productId: number
  sku: string
  productName: string
  casePack: number
  recipeId: number
  pourDate: string
  cureDays: number
  readyDate: string
  oilWeightG: number
  barsCut: number
  barsKeptBack: number
  sellableBars: number
  keptBackReason: string | null
  location: string | null
  notes: string | null
  status: BatchStatus
  daysLeft: number
  /** 0 on the pour date, 1 on the ready date. */
  progress: number
  createdAt: string
  /** Owner only: absent for packers. */
  ingredientCostCents?: number
  costPerBarCents?: number | null
}

export type BatchLotRow = {
  id: number
  ingredientLotId: number
  ingredientId: number
  ingredientName: string
  ingredientKind: string
  unit: 'g' | 'each'
  supplier: string
  supplierLotCode: string | null
  receivedOn: string
  quantity: number
  /** Owner only. */
  costCents?: number
}

export type StockMoveRow = {
  id: number
  batchId: number
  kind: MoveKind
  bars: number
  freeDelta: number
  reservedDelta: number
  reason: string | null
  note: string | null
  orderId: number | null
  userId: number | null
  userName: string | null
  createdAt: string
}

export type BatchShipment = {
  shopId: number
  shopName: string
  orderId: number
  orderNumber: string
  bars: number
  shippedOn: string
}

export type BatchDetail = BatchRow & {
  createdByName: string | null
  lots: BatchLotRow[]
  moves: StockMoveRow[]
  shipments: BatchShipment[]
  /** Owner only: the recipe as poured. */
  recipeSnapshot?: unknown
}

export type SuggestedTake = {
  ingredientLotId: number
  supplier: string
  supplierLotCode: string | null
  receivedOn: string
  remaining: number
  quantity: number
  costCents: number
}

export type SuggestionLine = {
  ingredientId: number
  name: string
  kind: string
  role: 'oil' | 'lye' | 'water' | 'fragrance' | 'additive' | 'packaging'
  unit: 'g' | 'each'
  needed: number
  /** Everything on hand that was received by the pour date. */
  available: number
  shortBy: number
  takes: SuggestedTake[]
  /** Every lot of the ingredient with something left, oldest first (for editing the takes). */
  lots: Omit<SuggestedTake, 'quantity' | 'costCents'>[]
}

export type BatchSuggestion = {
  productId: number
  sku: string
  recipeId: number
  recipeName: string
  pourDate: string
  oilWeightG: number
  moulds: number
  barsCut: number
  barsKeptBack: number
  sellableBars: number
  cureDays: number
  readyDate: string
  lotCode: string
  lines: SuggestionLine[]
  shortfalls: {
    ingredientId: number
    name: string
    unit: 'g' | 'each'
    needed: number
    available: number
    shortBy: number
  }[]
  warnings: { code: string; ingredientId: number; message: string }[]
  /** Untracked lines (lye or water with no ingredient on the recipe), for the batch sheet only. */
  untracked: { name: string; role: string; grams: number }[]
  estimatedCostPerBarCents: number | null
}

export type TraceLotOption = {
  id: number
  ingredientId: number
  ingredientName: string
  supplier: string
  supplierLotCode: string | null
  receivedOn: string
  batches: number
}

export type TraceRow = {
  lotId: number
  ingredientName: string
  supplierLotCode: string | null
  batchId: number
  batchLotCode: string
  pourDate: string
  productSku: string
  quantityUsed: number
  shopName: string | null
  orderNumber: string | null
  bars: number
  shipDate: string | null
}

export type TraceResult = {
  lot: TraceLotOption & { unit: 'g' | 'each'; quantity: number; remaining: number }
  batches: {
    batchId: number
    lotCode: string
    pourDate: string
    readyDate: string
    productId: number
    sku: string
    productName: string
    quantityUsed: number
    sellableBars: number
    free: number
    reserved: number
    shipments: BatchShipment[]
  }[]
  rows: TraceRow[]
}
