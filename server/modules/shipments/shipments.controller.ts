import type { Request, Response } from 'express'
import { PackingOrderParamsSchema } from '@shared/schemas/packing'
import { ShipOrderSchema } from '@shared/schemas/shipments'
import { currentUser } from '@server/middlewares/require-role'
import { body, params } from '@server/middlewares/validate'
import { shipOrder } from '@server/modules/shipments/shipments.service'

export async function ship(req: Request, res: Response) {
  res.json(
    await shipOrder(params(req, PackingOrderParamsSchema).id, body(req, ShipOrderSchema), currentUser(req)),
  )
}
