import express, { Router } from 'express'
import {
  CardCheckoutParamsSchema,
  PaymentIdParamsSchema,
  ProblemIdParamsSchema,
  RefundSchema,
} from '@shared/schemas/card-payments'
import { InvoiceIdParamsSchema } from '@shared/schemas/invoices'
import { requireAuth, requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/card-payments/card-payments.controller'

/**
 * Mounted at /api/webhooks/card before the JSON parser: the service's signed events, read as the
 * raw bytes the signature covers. Exempt from CSRF (under /webhooks/), authenticated by signature.
 */
export function cardWebhookRoutes() {
  const r = Router()
  r.post('/', express.raw({ type: () => true, limit: '256kb' }), c.webhook)
  return r
}

/** Mounted at /api: paying an invoice by card (buyer), refunds and problems (owner). */
export function cardPaymentsRoutes() {
  const r = Router()
  const pay = requireRight('invoices.pay')
  const manage = requireRight('payments.manage')
  r.get('/card-payments/status', requireAuth, c.status)
  r.post('/invoices/:id/card-checkout', pay, validate({ params: InvoiceIdParamsSchema }), c.checkout)
  r.get(
    '/invoices/:id/card-checkouts/:sessionId',
    pay,
    validate({ params: CardCheckoutParamsSchema }),
    c.checkoutState,
  )
  r.post(
    '/payments/:id/refunds',
    manage,
    validate({ params: PaymentIdParamsSchema, body: RefundSchema }),
    c.refund,
  )
  r.get('/card-payments/problems', manage, c.problems)
  r.post(
    '/card-payments/problems/:id/dismiss',
    manage,
    validate({ params: ProblemIdParamsSchema }),
    c.dismiss,
  )
  return r
}
