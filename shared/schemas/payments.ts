import { z } from 'zod'
import type { AgeingBucket, PaymentTerms } from '@shared/domain/invoices/terms'
import { compareIso, isValidIsoDate } from '@shared/domain/dates/dates'
import { parseMoneyToCents } from '@shared/domain/money/money'
import { latestTodayOnEarth } from '@shared/schemas/batches'

export const PAYMENT_METHODS = ['bank_transfer', 'cheque', 'card'] as const
export type PaymentMethod = (typeof PAYMENT_METHODS)[number]
export const PAYMENT_METHOD_LABELS: Record<PaymentMethod, string> = {
  bank_transfer: 'Bank transfer',
  cheque: 'Cheque',
  card: 'Card',
}

export const AGEING_BUCKET_LABELS: Record<AgeingBucket, string> = {
  current: 'Current',
  '1_30': '1–30 days',
  '31_60': '31–60 days',
  '61_90': '61–90 days',
  over_90: 'Over 90 days',
}

const receivedOn = z
  .string({ error: 'Enter the date the money arrived.' })
  .trim()
  .refine(isValidIsoDate, 'Enter the date as a calendar date (YYYY-MM-DD).')
  .refine(
    (d) => !isValidIsoDate(d) || compareIso(d, latestTodayOnEarth()) <= 0,
    'The date cannot be in the future.',
  )

const reference = z
  .string({ error: 'Enter the reference as text.' })
  .trim()
  .max(80, 'A reference has at most 80 characters.')
  .nullish()
  .transform((v) => (v ? v : null))

/**
 * `POST /api/invoices/:id/payments`: money received against an invoice, whole or part. More than
 * the invoice still owes is refused by the server (422 overpayment).
 */
export const RecordPaymentSchema = z.object({
  method: z.enum(PAYMENT_METHODS, { error: 'Choose how the money came: bank transfer, cheque or card.' }),
  amountCents: z
    .number({ error: 'Enter the amount in cents as a whole number.' })
    .int('Enter the amount in whole cents.')
    .positive('The amount must be more than zero.')
    .max(1_000_000_000, 'That amount is too large.'),
  receivedOn,
  reference,
})
export type RecordPaymentInput = z.input<typeof RecordPaymentSchema>
export type RecordPayment = z.output<typeof RecordPaymentSchema>

/**
 * The record-a-payment form: the same payload, with the amount typed as money ("1,234.50").
 * It turns into RecordPaymentSchema's `amountCents`.
 */
export const PaymentFormSchema = z
  .object({
    method: RecordPaymentSchema.shape.method,
    amount: z
      .string({ error: 'Enter the amount.' })
      .trim()
      .min(1, 'Enter the amount.')
      .refine((v) => parseMoneyToCents(v) !== null, 'Enter an amount like 125.50.')
      .refine((v) => (parseMoneyToCents(v) ?? 0) > 0, 'The amount must be more than zero.'),
    receivedOn,
    reference,
  })
  .transform(({ amount, ...rest }) => ({ ...rest, amountCents: parseMoneyToCents(amount)! }))
export type PaymentFormInput = z.input<typeof PaymentFormSchema>

export const PaymentListQuerySchema = z
  .object({
    shopId: z.coerce
      .number<string | number>()
      .int()
      .positive('Choose a shop.')
      .max(2_147_483_647, 'Choose a shop.')
      .optional(),
    invoiceId: z.coerce
      .number<string | number>()
      .int()
      .positive('Choose an invoice.')
      .max(2_147_483_647, 'Choose an invoice.')
      .optional(),
    method: z.enum(PAYMENT_METHODS, { error: 'Choose a known method.' }).optional(),
    from: z.string().trim().refine(isValidIsoDate, 'Use a date like 2026-12-01.').optional(),
    to: z.string().trim().refine(isValidIsoDate, 'Use a date like 2026-12-31.').optional(),
  })
  .refine((f) => !f.from || !f.to || f.from <= f.to, {
    path: ['to'],
    message: 'The end date is before the start date.',
  })
export type PaymentListQuery = z.output<typeof PaymentListQuerySchema>

export type PaymentDto = {
  id: number
  invoiceId: number
  invoiceNumber: string
  orderId: number
  orderNumber: string
  shopId: number
  shopName: string
  method: PaymentMethod
  amountCents: number
  receivedOn: string
  reference: string | null
  recordedBy: string | null
  createdAt: string
  /** Card refunds given back from this payment so far. */
  refundedCents: number
}
export type PaymentListDto = { items: PaymentDto[] }

export type AgeingBucketDto = { bucket: AgeingBucket; label: string; cents: number; invoices: number }

export type ReceivablesShopDto = {
  shopId: number
  shopName: string
  terms: PaymentTerms
  byBucket: Record<AgeingBucket, number>
  outstandingCents: number
  overdueCents: number
  openInvoices: number
  oldestDueDate: string | null
}

/** `GET /api/receivables`: what shops owe, by how late it is (domain `ageing`). */
export type ReceivablesDto = {
  asOf: string
  currency: string
  buckets: AgeingBucketDto[]
  outstandingCents: number
  overdueCents: number
  shops: ReceivablesShopDto[]
}

/** `POST /api/invoices/:id/remind` → 200 */
export type ReminderDto = { invoiceId: number; sentOn: string; sentTo: string[] }
