import { z } from 'zod'
import { compareIso, isValidIsoDate } from '@shared/domain/dates/dates'

export const SALES_GROUPS = ['product', 'tier', 'shop'] as const
export type SalesGroup = (typeof SALES_GROUPS)[number]
export const SALES_GROUP_LABELS: Record<SalesGroup, string> = {
  product: 'Product',
  tier: 'Price tier',
  shop: 'Shop',
}

const isoDate = (what: string) =>
  z
    .string({ error: `Enter the ${what}.` })
    .trim()
    .refine(isValidIsoDate, `Enter the ${what} as a calendar date (YYYY-MM-DD).`)

/** `GET /api/sales` and `/api/sales.csv`: shipped sales between two ship dates, both included. */
export const SalesQuerySchema = z
  .object({
    from: isoDate('first day'),
    to: isoDate('last day'),
    by: z.enum(SALES_GROUPS, { error: 'Group by product, tier or shop.' }).default('product'),
  })
  .superRefine((v, ctx) => {
    if (isValidIsoDate(v.from) && isValidIsoDate(v.to) && compareIso(v.from, v.to) > 0) {
      ctx.addIssue({ code: 'custom', path: ['to'], message: 'The last day is before the first day.' })
    }
  })
export type SalesQuery = z.infer<typeof SalesQuerySchema>
export type SalesQueryInput = z.input<typeof SalesQuerySchema>

export type SalesRow = {
  key: number | null
  label: string
  orders: number
  bars: number
  revenueCents: number
  costCents: number
  marginCents: number
  /** Margin as a share of revenue, in percent; null without revenue. */
  marginPct: number | null
}

export type SalesReport = {
  from: string
  to: string
  by: SalesGroup
  rows: SalesRow[]
  totals: Omit<SalesRow, 'key' | 'label'>
}
