import { Router } from 'express'
import {
  BatchIdParamsSchema,
  ListBatchesQuerySchema,
  RecordBatchSchema,
  StockMoveBodySchema,
  SuggestLotsQuerySchema,
  UpdateBatchSchema,
} from '@shared/schemas/batches'
import { requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/batches/batches.controller'

export function batchesRoutes() {
  const r = Router()
  r.get('/products', requireRight('batches.view'), c.products)
  r.get(
    '/suggest-lots',
    requireRight('batches.manage'),
    validate({ query: SuggestLotsQuerySchema }),
    c.suggest,
  )
  r.get('/', requireRight('batches.view'), validate({ query: ListBatchesQuerySchema }), c.list)
  r.post('/', requireRight('batches.manage'), validate({ body: RecordBatchSchema }), c.record)
  r.get('/:id', requireRight('batches.view'), validate({ params: BatchIdParamsSchema }), c.detail)
  r.patch(
    '/:id',
    requireRight('batches.manage'),
    validate({ params: BatchIdParamsSchema, body: UpdateBatchSchema }),
    c.update,
  )
  r.post(
    '/:id/moves',
    requireRight('stock.adjust'),
    validate({ params: BatchIdParamsSchema, body: StockMoveBodySchema }),
    c.move,
  )
  return r
}
