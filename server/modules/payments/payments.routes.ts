import { Router } from 'express'
import { InvoiceIdParamsSchema } from '@shared/schemas/invoices'
import { PaymentListQuerySchema, RecordPaymentSchema } from '@shared/schemas/payments'
import { requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/payments/payments.controller'

/** Mounted at /api: money received, what is still owed, and the reminders (owner only). */
export function paymentsRoutes() {
  const r = Router()
  const manage = requireRight('payments.manage')
  const list = validate({ query: PaymentListQuerySchema })
  r.post(
    '/invoices/:id/payments',
    manage,
    validate({ params: InvoiceIdParamsSchema, body: RecordPaymentSchema }),
    c.record,
  )
  r.post('/invoices/:id/remind', manage, validate({ params: InvoiceIdParamsSchema }), c.remind)
  r.get('/payments', manage, list, c.list)
  r.get('/payments.csv', manage, list, c.csv)
  r.get('/receivables', manage, c.receivables)
  return r
}
