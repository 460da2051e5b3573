import { Router } from 'express'
import { CartLineInputSchema, CartProductParamsSchema } from '@shared/schemas/orders'
import { requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/cart/cart.controller'

export function cartRoutes() {
  const r = Router()
  r.use(requireRight('cart.use'))
  r.get('/', c.get)
  r.delete('/', c.clear)
  r.put(
    '/lines/:productId',
    validate({ params: CartProductParamsSchema, body: CartLineInputSchema }),
    c.putLine,
  )
  r.delete('/lines/:productId', validate({ params: CartProductParamsSchema }), c.removeLine)
  return r
}
