import { Router } from 'express'
import { AcceptSuggestionsSchema, PriceBreaksSchema, PricingParamsSchema } from '@shared/schemas/pricing'
import { requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/pricing/pricing.controller'

export function pricingRoutes() {
  const r = Router()
  r.use(requireRight('pricing.manage'))
  r.get('/', c.overview)
  r.post('/accept', validate({ body: AcceptSuggestionsSchema }), c.accept)
  r.put(
    '/:productId/:tierId',
    validate({ params: PricingParamsSchema, body: PriceBreaksSchema }),
    c.saveBreaks,
  )
  return r
}
