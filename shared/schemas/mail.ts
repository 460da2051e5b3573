import { z } from 'zod'
import { recordId } from './record-id'

/** `POST /api/unsent-mail/:id/send` and `…/dismiss`. */
export const UnsentMailParamsSchema = z.object({
  id: recordId('Not an e-mail of the outbox.'),
})

export const UNSENT_MAIL_KINDS = ['order', 'invoice', 'shipment', 'card_receipt', 'card_refund'] as const
export type UnsentMailKind = (typeof UNSENT_MAIL_KINDS)[number]

/**
 * An e-mail a change owed that the mail relay refused at least once (`GET /api/unsent-mail`):
 * still being tried (`nextAttemptAt`) or given up after the last try (`gaveUp`).
 */
export type UnsentMailDto = {
  id: number
  kind: UnsentMailKind
  /** What the e-mail is about, in the owner's words: "Invoice LC-2026-000007", "Order O26-00016 shipped". */
  about: string
  orderId: number | null
  invoiceId: number | null
  shopName: string | null
  attempts: number
  lastError: string | null
  gaveUp: boolean
  /** When it is tried again by itself; null once given up. */
  nextAttemptAt: string | null
  createdAt: string
}

/** `POST /api/unsent-mail/:id/send`: sent, or still unsent with the relay's answer. */
export type SendUnsentMailResult = { sent: true } | { sent: false; item: UnsentMailDto }
