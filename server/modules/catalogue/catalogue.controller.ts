import type { Request, Response } from 'express'
import type { CatalogueDto } from '@shared/schemas/catalogue'
import { buyerShopId } from '@server/middlewares/require-role'
import { catalogue } from '@server/modules/catalogue/catalogue.service'

export async function list(req: Request, res: Response) {
  const body: CatalogueDto = { items: await catalogue({ shopId: buyerShopId(req) }) }
  res.json(body)
}
