import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { DomainError } from '@shared/domain/errors'
import { applyAction } from '@shared/domain/orders/order-status'
import type { OrderAction, OrderRole, OrderStatus } from '@shared/domain/orders/order-status'
import type { z } from 'zod'
import type { EditOrderLinesSchema, OrderDto, ReorderResultDto } from '@shared/schemas/orders'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { studioToday } from '@server/modules/availability/availability.service'
import { recordStockMove } from '@server/modules/batches/stock-moves.service'
import { addLinesToCart } from '@server/modules/cart/cart.service'
import { sellableProducts } from '@server/modules/catalogue/catalogue.service'
import { Order } from '@server/modules/orders/order.model'
import { keepMail } from '@server/modules/mail/outbox'
import { price, pricingSettings, requireSellable } from '@server/modules/orders/order-pricing'
import { findOrder } from '@server/modules/orders/order-queries'
import type { OrderViewer } from '@server/modules/orders/order-queries'
import { orderingShop } from '@server/modules/orders/order-shop'
import { insertLines, newLine, planStock, reserve } from '@server/modules/orders/orders.service'
import { retryingTransaction } from '@server/modules/orders/transactions'
import { getSettings } from '@server/modules/settings/settings.service'
import { raiseInvoiceForOrder, voidInvoiceForOrder } from '@server/modules/invoices/invoices.service'

export type Actor = OrderViewer & { userId: number }

/** Lines may change while the studio has not started packing. */
export const EDITABLE_STATUSES: readonly OrderStatus[] = ['placed', 'confirmed']

/** The order's row, locked for this change; another shop's order (or none) is a 404. */
async function lockOrder(id: number, actor: Actor, t: Transaction): Promise<Order> {
  const order = await Order.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE })
  if (!order || (actor.role === 'buyer' && order.shopId !== actor.shopId))
    throw AppError.notFound('That order')
  return order
}

/** The status an action leads to, or 409 invalid_transition saying why not. */
function transition(status: OrderStatus, action: OrderAction, role: OrderRole): OrderStatus {
  try {
    return applyAction(status, action, role)
  } catch (err) {
    if (err instanceof DomainError) throw AppError.conflict('invalid_transition', err.message)
    throw err
  }
}

async function afterChange(id: number, actor: Actor): Promise<OrderDto> {
  const order = await findOrder(id, actor)
  if (!order) throw AppError.notFound('That order')
  return order
}

/** The order's allocations, oldest batch first (the order stock rows are locked in everywhere). */
async function allocationsOf(orderId: number, lineIds: number[] | null, t: Transaction) {
  return sequelize.query<{ id: number; order_line_id: number; batch_id: number; bars: number }>(
    `SELECT a.id, a.order_line_id, a.batch_id, a.bars
       FROM allocations a
       JOIN order_lines l ON l.id = a.order_line_id
       JOIN batches b ON b.id = a.batch_id
      WHERE l.order_id = $1 AND ($2::int[] IS NULL OR l.id = ANY($2::int[]))
      ORDER BY b.ready_date, b.id, a.id`,
    { bind: [orderId, lineIds], type: QueryTypes.SELECT, transaction: t },
  )
}

/** Gives reserved bars back to free stock: one `released` move per allocation, the allocation gone. */
async function release(
  orderId: number,
  lineIds: number[] | null,
  userId: number,
  t: Transaction,
): Promise<number> {
  const held = await allocationsOf(orderId, lineIds, t)
  for (const a of held) {
    await recordStockMove(
      { batchId: a.batch_id, kind: 'released', bars: a.bars, orderId, orderLineId: a.order_line_id, userId },
      t,
    )
  }
  if (held.length > 0) {
    await sequelize.query('DELETE FROM allocations WHERE id = ANY($1::int[])', {
      bind: [held.map((a) => a.id)],
      transaction: t,
    })
  }
  return held.reduce((n, a) => n + a.bars, 0)
}

/** Options of a change: `notify: false` sends no e-mail (demo data, imports). */
export type ChangeOptions = { notify?: boolean }

export async function confirmOrder(id: number, actor: Actor, opts: ChangeOptions = {}): Promise<OrderDto> {
  await retryingTransaction(async (t) => {
    const order = await lockOrder(id, actor, t)
    const status = transition(order.status, 'confirm', actor.role)
    await order.update({ status, confirmedAt: new Date(), confirmedBy: actor.userId }, { transaction: t })
    await audit({ userId: actor.userId, action: 'order.confirmed', entity: 'order', entityId: id }, t)
    // A prepay account is invoiced at confirmation; for any other account this writes nothing.
    await raiseInvoiceForOrder(id, t, { userId: actor.userId, notify: opts.notify })
    if (opts.notify !== false)
      await keepMail([{ kind: 'order', mail: { kind: 'confirmed', orderId: id } }], t)
  })
  return afterChange(id, actor)
}

/**
 * A buyer may cancel while the order is placed, the owner until it ships. Every reserved bar goes
 * back to free stock in the same transaction; waiting pre-orders simply stop waiting.
 */
export async function cancelOrder(
  id: number,
  actor: Actor,
  reason: string | undefined,
  opts: ChangeOptions = {},
): Promise<OrderDto> {
  await retryingTransaction(async (t) => {
    const order = await lockOrder(id, actor, t)
    const status = transition(order.status, 'cancel', actor.role)
    const bars = await release(id, null, actor.userId, t)
    // A prepay invoice raised at confirmation is voided with a credit note (409 if money came in).
    await voidInvoiceForOrder(id, reason?.trim() || `Order ${order.number} cancelled`, actor.userId, t, {
      notify: opts.notify,
    })
    await order.update(
      { status, cancelledAt: new Date(), cancelledBy: actor.userId, cancelReason: reason ?? null },
      { transaction: t },
    )
    await audit(
      {
        userId: actor.userId,
        action: 'order.cancelled',
        entity: 'order',
        entityId: id,
        data: { reason, releasedBars: bars },
      },
      t,
    )
    if (opts.notify !== false) {
      await keepMail(
        [{ kind: 'order', mail: { kind: 'cancelled', orderId: id, byStudio: actor.role === 'owner' } }],
        t,
      )
    }
  })
  return afterChange(id, actor)
}

type CurrentLine = {
  id: number
  product_id: number
  sku: string
  name: string
  cases: number
  case_pack: number
  bars: number
  unit_price_cents: number
  preorder: boolean
  net_weight_g: number
}

/**
 * The owner replaces an order's lines before packing starts, in one transaction: a line left as
 * it was keeps its frozen price and its bars; a changed or new line is priced at today's break of
 * the shop's tier and its stock is checked again (ready stock, or curing stock for a pre-order);
 * a line taken off is marked removed. Bars of changed and removed lines are released, the new
 * lines' bars reserved, the totals priced again with the order's own tax terms. Any line that
 * stock cannot cover refuses the whole edit (409) and nothing changes.
 */
export async function editOrderLines(
  id: number,
  actor: Actor,
  input: z.output<typeof EditOrderLinesSchema>,
): Promise<OrderDto> {
  const settings = await getSettings()
  await retryingTransaction(async (t) => {
    const order = await lockOrder(id, actor, t)
    if (!EDITABLE_STATUSES.includes(order.status)) {
      throw AppError.conflict(
        'invalid_transition',
        `Lines can change only before packing starts; this order is ${order.status}.`,
      )
    }
    const shop = await orderingShop(order.shopId, t)
    const today = await studioToday(t)
    const current = await sequelize.query<CurrentLine>(
      `SELECT l.id, l.product_id, l.sku, l.name, l.cases, l.case_pack, l.bars, l.unit_price_cents, l.preorder,
              p.net_weight_g
         FROM order_lines l JOIN products p ON p.id = l.product_id
        WHERE l.order_id = $1 AND l.removed_at IS NULL`,
      { bind: [id], type: QueryTypes.SELECT, transaction: t },
    )
    const byProduct = new Map(current.map((l) => [l.product_id, l]))
    const unchanged = (i: number) => {
      const line = input.lines[i]!
      const was = byProduct.get(line.productId)
      return !!was && was.cases === line.cases && was.preorder === line.preorder
    }
    const changedIdx = input.lines.map((_, i) => i).filter((i) => !unchanged(i))
    const products = shop.tierId
      ? await sellableProducts(
          { tierId: shop.tierId },
          changedIdx.map((i) => input.lines[i]!.productId),
          t,
        )
      : new Map()
    requireSellable(input.lines, products, unchanged)

    const pricing = price({
      lines: input.lines.map((l, i) => {
        const was = byProduct.get(l.productId)
        if (unchanged(i) && was) {
          // Its price was frozen when it was ordered.
          return {
            productId: l.productId,
            cases: l.cases,
            casePack: was.case_pack,
            netWeightG: was.net_weight_g,
            breaks: [{ minCases: 1, unitPriceCents: was.unit_price_cents }],
          }
        }
        const p = products.get(l.productId)!
        return {
          productId: l.productId,
          cases: l.cases,
          casePack: p.casePack,
          netWeightG: p.netWeightG,
          breaks: p.priceBreaks,
        }
      }),
      isOpeningOrder: order.isOpeningOrder,
      ...pricingSettings(settings),
      taxRatePct: order.taxRatePct,
      taxExempt: order.taxExempt,
    })

    const kept = new Set(input.lines.filter((_, i) => unchanged(i)).map((l) => l.productId))
    const letGo = current.filter((l) => !kept.has(l.product_id))
    const releasedBars = await release(
      id,
      letGo.map((l) => l.id),
      actor.userId,
      t,
    )
    const { allocations, promises } = await planStock(
      changedIdx.map((i) => ({
        index: i,
        productId: input.lines[i]!.productId,
        bars: pricing.lines[i]!.bars,
        preorder: input.lines[i]!.preorder,
      })),
      today,
      t,
      id,
    )

    const wanted = new Set(input.lines.map((l) => l.productId))
    const removed = current.filter((l) => !wanted.has(l.product_id)).map((l) => l.id)
    if (removed.length > 0) {
      await sequelize.query(
        'UPDATE order_lines SET removed_at = now(), removed_by = $2 WHERE id = ANY($1::int[])',
        {
          bind: [removed, actor.userId],
          transaction: t,
        },
      )
    }
    const lineIds = new Map<number, number>()
    const fresh: { index: number; line: Parameters<typeof insertLines>[1][number] }[] = []
    for (const [i, l] of input.lines.entries()) {
      const was = byProduct.get(l.productId)
      if (unchanged(i) && was) {
        lineIds.set(i, was.id)
        await sequelize.query('UPDATE order_lines SET sort_order = $2 WHERE id = $1', {
          bind: [was.id, i],
          transaction: t,
        })
        continue
      }
      const values = newLine(l, i, products, pricing, promises)
      if (was) {
        lineIds.set(i, was.id)
        await sequelize.query(
          `UPDATE order_lines SET sku = $2, name = $3, cases = $4, case_pack = $5, bars = $6, unit_price_cents = $7,
                  line_total_cents = $8, preorder = $9, promised_date = $10, sort_order = $11
            WHERE id = $1`,
          {
            bind: [
              was.id,
              values.sku,
              values.name,
              values.cases,
              values.casePack,
              values.bars,
              values.unitPriceCents,
              values.lineTotalCents,
              values.preorder,
              values.promisedDate,
              values.sortOrder,
            ],
            transaction: t,
          },
        )
      } else fresh.push({ index: i, line: values })
    }
    const freshIds = await insertLines(
      id,
      fresh.map((f) => f.line),
      t,
    )
    fresh.forEach((f, k) => lineIds.set(f.index, freshIds[k]!))
    await reserve(allocations, (i) => lineIds.get(i)!, id, actor.userId, t)

    await order.update(
      {
        subtotalCents: pricing.subtotalCents,
        shippingCents: pricing.shippingCents,
        taxCents: pricing.taxCents,
        totalCents: pricing.totalCents,
        weightG: pricing.weightG,
      },
      { transaction: t },
    )
    // A prepay invoice already raised no longer matches: void it and raise one for the new lines.
    const voided = await voidInvoiceForOrder(id, `Lines of order ${order.number} changed`, actor.userId, t)
    if (voided) await raiseInvoiceForOrder(id, t, { userId: actor.userId, required: true })
    await audit(
      {
        userId: actor.userId,
        action: 'order.lines_changed',
        entity: 'order',
        entityId: id,
        data: {
          before: current.map((l) => ({ productId: l.product_id, cases: l.cases, preorder: l.preorder })),
          after: input.lines,
          releasedBars,
          totalCents: pricing.totalCents,
        },
      },
      t,
    )
  })
  return afterChange(id, actor)
}

/**
 * "The same again": the order's lines go into the shop's cart at today's prices (the cart prices
 * them), with the lines today's ready stock cannot cover and the products no longer on sale.
 */
export async function reorder(id: number, actor: Actor): Promise<ReorderResultDto> {
  const source = await findOrder(id, actor)
  if (!source || actor.role !== 'buyer' || actor.shopId === null) throw AppError.notFound('That order')
  const { cart, skipped } = await addLinesToCart(
    actor.shopId,
    actor.userId,
    source.lines.map((l) => ({ productId: l.productId, sku: l.sku, name: l.name, cases: l.cases })),
  )
  const ordered = new Set(source.lines.map((l) => l.productId))
  const short = cart.lines
    .filter((l) => ordered.has(l.productId) && l.stock === 'short')
    .map((l) => ({
      productId: l.productId,
      sku: l.sku,
      name: l.name,
      cases: l.cases,
      readyCases: l.readyCases,
    }))
  return { cart, short, skipped }
}
