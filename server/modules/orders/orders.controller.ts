import type { Request, Response } from 'express'
import {
  CancelOrderSchema,
  EditOrderLinesSchema,
  OrderIdParamsSchema,
  OrderListQuerySchema,
  PlaceOrderSchema,
} from '@shared/schemas/orders'
import type { CatalogueDto } from '@shared/schemas/catalogue'
import type { OrderListDto } from '@shared/schemas/orders'
import { AppError } from '@server/lib/app-error'
import { buyerShopId, currentUser } from '@server/middlewares/require-role'
import { body, params, query } from '@server/middlewares/validate'
import { studioToday } from '@server/modules/availability/availability.service'
import { catalogue } from '@server/modules/catalogue/catalogue.service'
import { csvAttachment } from '@server/modules/invoices/spreadsheet'
import {
  cancelOrder,
  confirmOrder,
  editOrderLines,
  reorder as reorderLines,
} from '@server/modules/orders/order-changes.service'
import type { Actor } from '@server/modules/orders/order-changes.service'
import { ordersCsv } from '@server/modules/orders/order-csv'
import { findOrder, listOrders } from '@server/modules/orders/order-queries'
import { placeOrder } from '@server/modules/orders/orders.service'
import { allocateDuePreorders } from '@server/modules/orders/preorders.service'
import { getSettings } from '@server/modules/settings/settings.service'

function actor(req: Request): Actor {
  const u = currentUser(req)
  return { role: u.role, shopId: u.role === 'buyer' ? buyerShopId(req) : null, userId: u.id }
}

/** Packers work from the packing queue; they do not cancel orders or export them. */
function notPacker(req: Request): Actor {
  const a = actor(req)
  if (a.role === 'packer') throw AppError.forbidden()
  return a
}

export async function place(req: Request, res: Response) {
  const { order, created } = await placeOrder({
    shopId: buyerShopId(req),
    userId: currentUser(req).id,
    idempotencyKey: req.get('Idempotency-Key')!,
    input: body(req, PlaceOrderSchema),
  })
  res.status(created ? 201 : 200).json({ order })
}

export async function list(req: Request, res: Response) {
  const filter = query(req, OrderListQuerySchema)
  const { timeZone } = await getSettings()
  const { items, total } = await listOrders(actor(req), filter, timeZone)
  const page: OrderListDto = { items, page: filter.page, pageSize: filter.pageSize, total }
  res.json(page)
}

export async function csv(req: Request, res: Response) {
  const viewer = notPacker(req)
  const { timeZone } = await getSettings()
  csvAttachment(res, 'orders', await ordersCsv(viewer, query(req, OrderListQuerySchema), timeZone))
}

export async function detail(req: Request, res: Response) {
  const order = await findOrder(params(req, OrderIdParamsSchema).id, actor(req))
  if (!order) throw AppError.notFound('That order')
  res.json({ order })
}

export async function confirm(req: Request, res: Response) {
  res.json({ order: await confirmOrder(params(req, OrderIdParamsSchema).id, actor(req)) })
}

export async function cancel(req: Request, res: Response) {
  const { reason } = body(req, CancelOrderSchema)
  res.json({ order: await cancelOrder(params(req, OrderIdParamsSchema).id, notPacker(req), reason) })
}

export async function editLines(req: Request, res: Response) {
  res.json({
    order: await editOrderLines(
      params(req, OrderIdParamsSchema).id,
      actor(req),
      body(req, EditOrderLinesSchema),
    ),
  })
}

export async function reorder(req: Request, res: Response) {
  res.json(await reorderLines(params(req, OrderIdParamsSchema).id, actor(req)))
}

/** What the owner may put on the order while editing it: the shop's catalogue at its tier, with stock. */
export async function productOptions(req: Request, res: Response) {
  const order = await findOrder(params(req, OrderIdParamsSchema).id, actor(req))
  if (!order) throw AppError.notFound('That order')
  const items: CatalogueDto['items'] = await catalogue({ shopId: order.shopId })
  res.json({ items })
}

export async function allocatePreorders(req: Request, res: Response) {
  res.json(await allocateDuePreorders(await studioToday(), currentUser(req).id))
}
