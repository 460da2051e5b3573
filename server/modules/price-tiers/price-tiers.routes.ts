import { Router } from 'express'
import { TierCreateSchema, TierIdParamsSchema, TierUpdateSchema } from '@shared/schemas/pricing'
import { requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/price-tiers/price-tiers.controller'

export function priceTiersRoutes() {
  const r = Router()
  r.use(requireRight('pricing.manage'))
  r.get('/', c.list)
  r.post('/', validate({ body: TierCreateSchema }), c.create)
  r.patch('/:id', validate({ params: TierIdParamsSchema, body: TierUpdateSchema }), c.update)
  return r
}
