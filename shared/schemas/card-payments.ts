import { z } from 'zod'
import { recordId } from '@shared/schemas/record-id'
import { parseMoneyToCents } from '@shared/domain/money/money'

/** `GET /api/card-payments/status`: whether invoices can be paid by card here. */
export type CardPaymentsStatusDto = { enabled: boolean }

/** `POST /api/invoices/:id/card-checkout` → 201: where to send the buyer to pay. */
export type CardCheckoutDto = { sessionId: string; url: string; amountCents: number; currency: string }

export const CARD_CHECKOUT_STATUSES = ['open', 'paid', 'problem'] as const
export type CardCheckoutStatus = (typeof CARD_CHECKOUT_STATUSES)[number]

/** `GET /api/invoices/:id/card-checkouts/:sessionId`: how a checkout ended, for the return page. */
export type CardCheckoutStateDto = {
  sessionId: string
  invoiceId: number
  invoiceNumber: string
  status: CardCheckoutStatus
  amountCents: number
  currency: string
}

export const CardCheckoutParamsSchema = z.object({
  id: recordId('Not an invoice.'),
  sessionId: z
    .string()
    .trim()
    .min(1, 'Not a checkout.')
    .max(255, 'Not a checkout.')
    .regex(/^[A-Za-z0-9_]+$/, 'Not a checkout.'),
})

const reason = z
  .string({ error: 'Enter the reason as text.' })
  .trim()
  .max(200, 'A reason has at most 200 characters.')
  .nullish()
  .transform((v) => (v ? v : null))

/** `POST /api/payments/:id/refunds`: give back all or part of a card payment, through the card service. */
export const RefundSchema = z.object({
  amountCents: z
    .number({ error: 'Enter the amount in cents as a whole number.' })
    .int('Enter the amount in whole cents.')
    .positive('The amount must be more than zero.')
    .max(1_000_000_000, 'That amount is too large.'),
  reason,
})
export type RefundInput = z.input<typeof RefundSchema>
export type Refund = z.output<typeof RefundSchema>

/** The refund dialog: the same payload with the amount typed as money. */
export const RefundFormSchema = z
  .object({
    amount: z
      .string({ error: 'Enter the amount.' })
      .trim()
      .min(1, 'Enter the amount.')
      .refine((v) => parseMoneyToCents(v) !== null, 'Enter an amount like 25.00.')
      .refine((v) => (parseMoneyToCents(v) ?? 0) > 0, 'The amount must be more than zero.'),
    reason,
  })
  .transform(({ amount, reason }) => ({ amountCents: parseMoneyToCents(amount)!, reason }))
export type RefundFormInput = z.input<typeof RefundFormSchema>

export const PaymentIdParamsSchema = z.object({
  id: recordId('Not a payment.'),
})
export const ProblemIdParamsSchema = z.object({
  id: recordId('Not a problem.'),
})

export type RefundDto = {
  id: number
  paymentId: number
  invoiceId: number
  amountCents: number
  providerRefundId: string
  reason: string | null
  refundedOn: string
  createdBy: string | null
}

/** A completed card payment that was not recorded as a payment (amount or currency did not match). */
export type CardPaymentProblemDto = {
  id: number
  invoiceId: number | null
  invoiceNumber: string | null
  shopName: string | null
  sessionId: string
  paymentIntentId: string | null
  expectedCents: number | null
  expectedCurrency: string | null
  receivedCents: number
  receivedCurrency: string
  message: string
  createdAt: string
}
