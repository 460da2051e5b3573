import { Router } from 'express'
import { InvoiceIdParamsSchema, InvoiceListQuerySchema, VoidInvoiceSchema } from '@shared/schemas/invoices'
import { PackingOrderParamsSchema } from '@shared/schemas/packing'
import { requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/invoices/invoices.controller'

/** Mounted at /api: invoices and credit notes (owner: all; buyer: their shop's; packer: none). */
export function invoicesRoutes() {
  const r = Router()
  const view = requireRight('invoices.view')
  const manage = requireRight('invoices.manage')
  const one = validate({ params: InvoiceIdParamsSchema })
  r.get('/invoices', view, validate({ query: InvoiceListQuerySchema }), c.list)
  r.get('/invoices.csv', manage, validate({ query: InvoiceListQuerySchema }), c.csv)
  r.get('/invoices/:id', view, one, c.detail)
  r.get('/invoices/:id/pdf', view, one, c.pdf)
  r.post(
    '/invoices/:id/void',
    manage,
    validate({ params: InvoiceIdParamsSchema, body: VoidInvoiceSchema }),
    c.voidOne,
  )
  r.post('/invoices/:id/send', manage, one, c.send)
  r.post('/orders/:id/invoice', manage, validate({ params: PackingOrderParamsSchema }), c.raise)
  return r
}
