import { Router } from 'express'
import {
  ClaimOrderSchema,
  MarkPackedSchema,
  PackingOrderParamsSchema,
  PickListQuerySchema,
} from '@shared/schemas/packing'
import { requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/packing/packing.controller'

/** Mounted at /api: the packing bench (packers and the owner; nothing here shows a price). */
export function packingRoutes() {
  const r = Router()
  const work = requireRight('packing.work')
  const order = validate({ params: PackingOrderParamsSchema })
  const pick = validate({ query: PickListQuerySchema })
  r.get('/packing/queue', work, c.queue)
  r.get('/packing/orders/:id', work, order, c.order)
  r.post(
    '/orders/:id/claim',
    work,
    validate({ params: PackingOrderParamsSchema, body: ClaimOrderSchema }),
    c.claim,
  )
  r.post(
    '/orders/:id/packed',
    work,
    validate({ params: PackingOrderParamsSchema, body: MarkPackedSchema }),
    c.packed,
  )
  r.get('/orders/:id/packing-slip.pdf', work, order, c.packingSlipPdf)
  r.get('/pick-list', work, pick, c.pickList)
  r.get('/pick-list.pdf', work, pick, c.pickListPdf)
  return r
}
