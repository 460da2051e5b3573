import type { Request, Response } from 'express'
import { CartLineInputSchema, CartProductParamsSchema } from '@shared/schemas/orders'
import { buyerShopId, currentUser } from '@server/middlewares/require-role'
import { body, params } from '@server/middlewares/validate'
import * as cart from '@server/modules/cart/cart.service'

export async function get(req: Request, res: Response) {
  res.json({ cart: await cart.getCart(buyerShopId(req)) })
}

export async function putLine(req: Request, res: Response) {
  const { productId } = params(req, CartProductParamsSchema)
  res.json({
    cart: await cart.setCartLine(
      buyerShopId(req),
      currentUser(req).id,
      productId,
      body(req, CartLineInputSchema),
    ),
  })
}

export async function removeLine(req: Request, res: Response) {
  res.json({
    cart: await cart.removeCartLine(buyerShopId(req), params(req, CartProductParamsSchema).productId),
  })
}

export async function clear(req: Request, res: Response) {
  res.json({ cart: await cart.clearCart(buyerShopId(req)) })
}
