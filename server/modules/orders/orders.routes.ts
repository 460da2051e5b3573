import { Router } from 'express'
import type { RequestHandler } from 'express'
import {
  CancelOrderSchema,
  EditOrderLinesSchema,
  IdempotencyKeySchema,
  OrderIdParamsSchema,
  OrderListQuerySchema,
  PlaceOrderSchema,
} from '@shared/schemas/orders'
import { AppError } from '@server/lib/app-error'
import { requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/orders/orders.controller'

/** The contract's `Idempotency-Key` header: required on placing, 1–200 characters. */
const idempotencyKey: RequestHandler = (req, _res, next) => {
  const r = IdempotencyKeySchema.safeParse(req.get('Idempotency-Key'))
  if (r.success) return next()
  const message = r.error.issues[0]?.message ?? 'Send an Idempotency-Key header.'
  next(AppError.field('Idempotency-Key', message))
}

export function ordersRoutes() {
  const r = Router()
  const id = validate({ params: OrderIdParamsSchema })
  r.get('/', requireRight('orders.view'), validate({ query: OrderListQuerySchema }), c.list)
  r.post('/', requireRight('orders.place'), idempotencyKey, validate({ body: PlaceOrderSchema }), c.place)
  r.post('/preorders/allocate', requireRight('orders.manage'), c.allocatePreorders)
  r.get('/:id', requireRight('orders.view'), id, c.detail)
  r.post('/:id/confirm', requireRight('orders.manage'), id, c.confirm)
  r.post(
    '/:id/cancel',
    requireRight('orders.view'),
    validate({ params: OrderIdParamsSchema, body: CancelOrderSchema }),
    c.cancel,
  )
  r.get('/:id/product-options', requireRight('orders.manage'), id, c.productOptions)
  r.patch(
    '/:id/lines',
    requireRight('orders.manage'),
    validate({ params: OrderIdParamsSchema, body: EditOrderLinesSchema }),
    c.editLines,
  )
  r.post('/:id/reorder', requireRight('orders.place'), id, c.reorder)
  return r
}

/** `GET /api/orders.csv`, mounted beside `/orders` (a dot is not a path segment). */
export function ordersCsvRoutes() {
  const r = Router()
  r.get('/', requireRight('orders.view'), validate({ query: OrderListQuerySchema }), c.csv)
  return r
}
