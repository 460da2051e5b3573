import { Router } from 'express'
import { PackingOrderParamsSchema } from '@shared/schemas/packing'
import { ShipOrderSchema } from '@shared/schemas/shipments'
import { requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/shipments/shipments.controller'

/** Mounted at /api: `POST /orders/:id/ship` (packer or owner). */
export function shipmentsRoutes() {
  const r = Router()
  r.post(
    '/orders/:id/ship',
    requireRight('packing.work'),
    validate({ params: PackingOrderParamsSchema, body: ShipOrderSchema }),
    c.ship,
  )
  return r
}
