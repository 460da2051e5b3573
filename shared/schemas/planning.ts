import { z } from 'zod'
import { recordId } from '@shared/schemas/record-id'
import { compareIso, isValidIsoDate } from '@shared/domain/dates/dates'

const whole = (what: string, min: number, max: number) =>
  z.coerce
    .number<string | number>({ error: `Enter the ${what}.` })
    .int(`The ${what} is a whole number.`)
    .min(min, `The ${what} must be at least ${min}.`)
    .max(max, `The ${what} must be at most ${max}.`)

/** `GET /api/planning/plan`: the demand window and how far the plan looks. */
export const PlanQuerySchema = z.object({
  windowWeeks: whole('demand window in weeks', 1, 52).default(8),
  coverWeeks: whole('weeks a pour should cover', 1, 26).default(4),
  horizonWeeks: whole('plan horizon in weeks', 1, 26).default(8),
})
export type PlanQuery = z.infer<typeof PlanQuerySchema>
export type PlanQueryInput = z.input<typeof PlanQuerySchema>

/** Turning a suggested pour into a planned batch. */
export const CreatePlannedPourSchema = z.object({
  productId: z.coerce
    .number<string | number>({ error: 'Choose a product.' })
    .int('Choose a product.')
    .positive('Choose a product.')
    .max(2_147_483_647, 'Choose a product.'),
  pourDate: z
    .string({ error: 'Enter the pour date.' })
    .trim()
    .refine(isValidIsoDate, 'Enter the pour date as a calendar date (YYYY-MM-DD).')
    .refine(
      (d) => !isValidIsoDate(d) || compareIso(d, '2000-01-01') >= 0,
      'Dates before 2000 are not accepted.',
    ),
  moulds: whole('number of moulds', 1, 100),
  note: z
    .string()
    .trim()
    .max(500, 'At most 500 characters.')
    .nullish()
    .transform((v) => (v ? v : null)),
})
export type CreatePlannedPourInput = z.infer<typeof CreatePlannedPourSchema>

export const PlannedPourIdParamsSchema = z.object({
  id: recordId('Not a planned pour.'),
})

/** The pour lead time on the settings screen: days to spare between the cure's end and run-out. */
export const PlanningSettingsSchema = z.object({
  pourLeadTimeDays: whole('lead time in days', 0, 60),
})
export type PlanningSettingsInput = z.infer<typeof PlanningSettingsSchema>

export const PLANNED_POUR_STATUSES = ['planned', 'poured', 'dropped'] as const
export type PlannedPourStatus = (typeof PLANNED_POUR_STATUSES)[number]

export type PlannedPour = {
  id: number
  productId: number
  sku: string
  productName: string
  pourDate: string
  moulds: number
  oilWeightG: number
  expectedBars: number
  readyDate: string
  status: PlannedPourStatus
  batchId: number | null
  note: string | null
}

export type PlanIngredient = {
  ingredientId: number
  name: string
  kind: string
  unit: 'g' | 'each'
  needed: number
  onHand: number
  /** What to buy: needed − on hand, or 0. */
  toBuy: number
}

export type PlanProduct = {
  productId: number
  sku: string
  name: string
  casePack: number
  cureDays: number
  sellableBarsPerMould: number
  readyBars: number
  curingBars: number
  plannedBars: number
  /** Bars ordered in the demand window (open pre-orders excluded). */
  orderedBars: number
  weeklyDemandBars: number
  weeklyDemandCases: number
  preorderBars: number
  uncoveredPreorderBars: number
  runOutDate: string | null
  latestPourDate: string | null
  suggestion: { pourBy: string; late: boolean; moulds: number; bars: number; oilWeightG: number } | null
  /** Ingredients of this product's recipe that the whole plan is short of. */
  shortIngredients: string[]
  outlook: { weekStart: string; readyBars: number; curingBars: number }[]
}

export type PourPlan = {
  today: string
  windowStart: string
  windowEnd: string
  windowWeeks: number
  coverWeeks: number
  horizonWeeks: number
  leadTimeDays: number
  products: PlanProduct[]
  weeks: {
    weekStart: string
    pours: {
      productId: number
      sku: string
      name: string
      pourBy: string
      late: boolean
      moulds: number
      bars: number
    }[]
  }[]
  planned: PlannedPour[]
  ingredients: PlanIngredient[]
}
