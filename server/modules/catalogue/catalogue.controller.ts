import type { Request, Response } from 'express'
import { buyerShopId } from '@server/middlewares/require-role'
import { catalogueJsonForShop } from '@server/modules/catalogue/catalogue.service'

/** The body is a `CatalogueDto`, cached per tier as JSON (catalogue.service.ts). */
export async function list(req: Request, res: Response) {
  res.type('application/json').send(await catalogueJsonForShop(buyerShopId(req)))
}
