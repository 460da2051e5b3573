import { z } from 'zod'
import { recordId } from '@shared/schemas/record-id'
import type { InvoiceStatus, PaymentTerms } from '@shared/domain/invoices/terms'
import { isValidIsoDate } from '@shared/domain/dates/dates'
import type { PaymentMethod } from '@shared/schemas/payments'

export const INVOICE_KINDS = ['invoice', 'credit_note'] as const
export type InvoiceKind = (typeof INVOICE_KINDS)[number]

/** An invoice's status (computed at read from its amounts and due date); a credit note's is `credit`. */
export const DOCUMENT_STATUSES = ['open', 'part_paid', 'paid', 'overdue', 'void', 'credit'] as const
export type DocumentStatus = InvoiceStatus | 'credit'

export const DOCUMENT_STATUS_LABELS: Record<DocumentStatus, string> = {
  open: 'Open',
  part_paid: 'Part paid',
  paid: 'Paid',
  overdue: 'Overdue',
  void: 'Void',
  credit: 'Credit note',
}

export const INVOICE_KIND_LABELS: Record<InvoiceKind, string> = {
  invoice: 'Invoice',
  credit_note: 'Credit note',
}

export const InvoiceIdParamsSchema = z.object({
  id: recordId('Not an invoice.'),
})

const list = (v: unknown) => (typeof v === 'string' ? v.split(',').filter(Boolean) : v)
const isoDate = (example: string) => z.string().trim().refine(isValidIsoDate, `Use a date like ${example}.`)

/** `GET /api/invoices` and `GET /api/invoices.csv`; `from`/`to` bound the issue date. */
export const InvoiceListQuerySchema = z
  .object({
    status: z
      .preprocess(list, z.array(z.enum(DOCUMENT_STATUSES, { error: 'Choose a known status.' })))
      .optional(),
    kind: z.enum(INVOICE_KINDS, { error: 'Choose invoice or credit_note.' }).optional(),
    shopId: z.coerce
      .number<string | number>({ error: 'Choose a shop.' })
      .int('Choose a shop.')
      .positive('Choose a shop.')
      .max(2_147_483_647, 'Choose a shop.')
      .optional(),
    from: isoDate('2026-12-01').optional(),
    to: isoDate('2026-12-31').optional(),
  })
  .refine((f) => !f.from || !f.to || f.from <= f.to, {
    path: ['to'],
    message: 'The end date is before the start date.',
  })
export type InvoiceListQuery = z.output<typeof InvoiceListQuerySchema>
export type InvoiceListQueryInput = z.input<typeof InvoiceListQuerySchema>

/** `POST /api/invoices/:id/void` */
export const VoidInvoiceSchema = z.object({
  reason: z
    .string({ error: 'Say why the invoice is void.' })
    .trim()
    .min(3, 'Say why the invoice is void (at least 3 characters).')
    .max(500, 'At most 500 characters.'),
})
export type VoidInvoiceInput = z.input<typeof VoidInvoiceSchema>

/** One row of `GET /api/invoices` (DESIGN.md contract, with the allowed extra fields). */
export type InvoiceListItem = {
  id: number
  number: string
  orderId: number
  shopId: number
  status: DocumentStatus
  issueDate: string
  dueDate: string
  totalCents: number
  paidCents: number
  orderNumber: string
  shopName: string
  kind: InvoiceKind
  outstandingCents: number
}
export type InvoiceListDto = { items: InvoiceListItem[] }

export type InvoiceLineDto = {
  id: number
  sku: string
  description: string
  cases: number
  casePack: number
  bars: number
  unitPriceCents: number
  lineTotalCents: number
}

export type InvoicePaymentDto = {
  id: number
  method: PaymentMethod
  amountCents: number
  receivedOn: string
  reference: string | null
  recordedBy: string | null
  /** Card refunds given back from this payment so far. */
  refundedCents: number
  /** A card payment taken through the card service, which the owner may refund. */
  refundable: boolean
}

export type BillTo = {
  legalName: string
  tradingName: string
  contactName: string
  contactEmail: string
  taxId: string | null
  lines: string[]
}

/** `GET /api/invoices/:id` → `{ invoice }`. */
export type InvoiceDto = InvoiceListItem & {
  year: number
  seq: number
  terms: PaymentTerms
  poNumber: string | null
  billTo: BillTo
  subtotalCents: number
  shippingCents: number
  taxCents: number
  taxRatePct: number
  taxExempt: boolean
  lines: InvoiceLineDto[]
  payments: InvoicePaymentDto[]
  voidedAt: string | null
  voidReason: string | null
  /** For a credit note: the invoice it cancels. */
  creditsInvoice: { id: number; number: string } | null
  /** For a void invoice: the credit note issued for it. */
  creditNote: { id: number; number: string } | null
  shipment: { carrier: string; trackingNumber: string; shipDate: string } | null
  /** Reminders sent (owner only; a buyer's view leaves this empty). */
  reminders: { sentOn: string; sentTo: string; source: 'owner' | 'daily'; sentBy: string | null }[]
  currency: string
}
