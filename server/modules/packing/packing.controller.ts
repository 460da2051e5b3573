import type { Request, Response } from 'express'
import {
  ClaimOrderSchema,
  MarkPackedSchema,
  PackingOrderParamsSchema,
  PickListQuerySchema,
} from '@shared/schemas/packing'
import { AppError } from '@server/lib/app-error'
import { currentUser } from '@server/middlewares/require-role'
import { body, params, query } from '@server/middlewares/validate'
import { packingQueue } from '@server/modules/packing/packing-queries'
import {
  packingSlipFilename,
  renderPackingSlipPdf,
  renderPickListPdf,
} from '@server/modules/packing/packing-documents'
import { claimOrder, markPacked, packingOrderFor, pickListFor } from '@server/modules/packing/packing.service'

export async function queue(_req: Request, res: Response) {
  res.json(await packingQueue())
}

export async function order(req: Request, res: Response) {
  res.json({ order: await packingOrderFor(params(req, PackingOrderParamsSchema).id, currentUser(req)) })
}

export async function claim(req: Request, res: Response) {
  const order = await claimOrder(
    params(req, PackingOrderParamsSchema).id,
    body(req, ClaimOrderSchema),
    currentUser(req),
  )
  res.json({ order })
}

export async function packed(req: Request, res: Response) {
  const order = await markPacked(
    params(req, PackingOrderParamsSchema).id,
    body(req, MarkPackedSchema),
    currentUser(req),
  )
  res.json({ order })
}

export async function packingSlipPdf(req: Request, res: Response) {
  const order = await packingOrderFor(params(req, PackingOrderParamsSchema).id, currentUser(req))
  if (order.status === 'cancelled') {
    throw AppError.conflict(
      'order_cancelled',
      `Order ${order.number} is cancelled: there is nothing to pack.`,
    )
  }
  const pdf = await renderPackingSlipPdf(order)
  res
    .type('application/pdf')
    .set('Content-Disposition', `inline; filename="${packingSlipFilename(order)}"`)
    .send(pdf)
}

export async function pickList(req: Request, res: Response) {
  res.json(await pickListFor(query(req, PickListQuerySchema).orders))
}

export async function pickListPdf(req: Request, res: Response) {
  const list = await pickListFor(query(req, PickListQuerySchema).orders)
  const pdf = await renderPickListPdf(list)
  const name = list.orders.length === 1 ? list.orders[0]!.number : `${list.orders.length}-orders`
  res.type('application/pdf').set('Content-Disposition', `inline; filename="pick-list-${name}.pdf"`).send(pdf)
}
