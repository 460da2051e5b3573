import type { Request, Response } from 'express'
import { buyerShopId } from '@server/middlewares/require-role'
import { catalogueJsonForShop } from '@server/modules/catalogue/catalogue.service'

/**
 * The body is a `CatalogueDto`, cached per tier as JSON and as gzip (catalogue.service.ts): a
 * client that takes gzip (every browser) gets the stored gzip bytes, any other the JSON.
 */
export async function list(req: Request, res: Response) {
  const body = await catalogueJsonForShop(buyerShopId(req))
  // The ETag made with the body: Express would otherwise hash the whole body on every answer.
  res.type('application/json').set('ETag', body.etag).vary('Accept-Encoding')
  if (req.acceptsEncodings('gzip', 'identity') === 'gzip') res.set('Content-Encoding', 'gzip').send(body.gzip)
  else res.send(body.json)
}
