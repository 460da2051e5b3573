import { Router } from 'express'
import { LotIdParamsSchema, TraceLotsQuerySchema } from '@shared/schemas/batches'
import { requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/trace/trace.controller'

export function traceRoutes() {
  const r = Router()
  r.use(requireRight('batches.manage'))
  r.get('/ingredient-lots', validate({ query: TraceLotsQuerySchema }), c.lots)
  // Before the JSON route: '/:lotId' alone would also match "12.csv".
  r.get('/ingredient-lots/:lotId.csv', validate({ params: LotIdParamsSchema }), c.csv)
  r.get('/ingredient-lots/:lotId', validate({ params: LotIdParamsSchema }), c.show)
  return r
}
