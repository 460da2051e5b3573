import { Router } from 'express'
import type { Request, Response } from 'express'
import { buyerShopId, requireRight } from '@server/middlewares/require-role'
import * as shops from '@server/modules/shops/shops.service'

export function shopsRoutes() {
  const r = Router()
  r.get('/mine', requireRight('shop.own'), async (req: Request, res: Response) => {
    res.json({ shop: await shops.getShop(buyerShopId(req)) })
  })
  r.get('/', requireRight('shops.manage'), async (_req: Request, res: Response) => {
    res.json({ items: await shops.listShops() })
  })
  return r
}
