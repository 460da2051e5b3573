import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { DomainError } from '@shared/domain/errors'
import { applyAction } from '@shared/domain/orders/order-status'
import type { OrderAction, OrderStatus } from '@shared/domain/orders/order-status'
import type { SessionUser } from '@shared/schemas/auth'
import type {
  ClaimOrderInput,
  MarkPacked,
  PackedMismatchDetail,
  PackingOrderDto,
  PickListDto,
} from '@shared/schemas/packing'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { packingLines, packingOrder, pickList } from '@server/modules/packing/packing-queries'

export type PackingUser = Pick<SessionUser, 'id' | 'role' | 'name'>

/** What a packer may open: orders from confirmation on (never placed or cancelled ones). */
const PACKER_VISIBLE: readonly OrderStatus[] = ['confirmed', 'packing', 'packed', 'shipped']
const PICKABLE: readonly OrderStatus[] = ['confirmed', 'packing']

type LockedOrder = {
  id: number
  number: string
  status: OrderStatus
  packer_id: number | null
  packer_name: string | null
  packing_started_at: Date | null
}

export async function lockOrder(orderId: number, t: Transaction): Promise<LockedOrder> {
  const [o] = await sequelize.query<LockedOrder>(
    `SELECT o.id, o.number, o.status, o.packer_id, pk.name AS packer_name, o.packing_started_at
       FROM orders o LEFT JOIN users pk ON pk.id = o.packer_id
      WHERE o.id = $1
        FOR UPDATE OF o`,
    { bind: [orderId], type: QueryTypes.SELECT, transaction: t },
  )
  if (!o) throw AppError.notFound('That order')
  return o
}

/**
 * The status an action leads to, or 409 `invalid_transition` naming the status the order is in
 * (the domain's rule; a wrong role for the step is a 403).
 */
export function nextStatus(
  order: { number: string; status: OrderStatus },
  action: OrderAction,
  user: PackingUser,
) {
  try {
    return applyAction(order.status, action, user.role)
  } catch (err) {
    if (err instanceof DomainError && err.code === 'invalid_transition') {
      throw AppError.conflict(
        'invalid_transition',
        `Order ${order.number} is ${order.status}: ${describe(action)}`,
        [{ field: 'status', message: `The order is ${order.status}.`, status: order.status }],
      )
    }
    if (err instanceof DomainError) throw AppError.forbidden(err.message)
    throw err
  }
}

function describe(action: OrderAction): string {
  switch (action) {
    case 'start_packing':
      return 'only a confirmed order can be claimed for packing.'
    case 'finish_packing':
      return 'only an order being packed can be recorded as packed.'
    case 'ship':
      return 'only a packed order can be shipped.'
    default:
      return `it cannot ${action.replace('_', ' ')}.`
  }
}

function alreadyClaimed(o: LockedOrder) {
  return AppError.conflict(
    'already_claimed',
    `${o.packer_name ?? 'Someone else'} is packing order ${o.number}.`,
    [
      {
        field: 'orderId',
        message: `Claimed by ${o.packer_name ?? 'someone else'}.`,
        packerId: o.packer_id,
        packerName: o.packer_name,
        since: o.packing_started_at?.toISOString() ?? null,
      },
    ],
  )
}

async function unallocatedLines(orderId: number, t: Transaction) {
  return (await packingLines(orderId, t)).filter((l) => l.allocatedBars !== l.bars)
}

/**
 * A packer (or the owner) claims a confirmed order: it moves to `packing` with them as its packer.
 * Claiming one's own claim again changes nothing; someone else's is refused with 409
 * `already_claimed` naming who has it, unless the owner takes it over.
 */
export async function claimOrder(
  orderId: number,
  input: ClaimOrderInput,
  user: PackingUser,
): Promise<PackingOrderDto> {
  if (input.takeOver && user.role !== 'owner') {
    throw AppError.forbidden('Only the studio owner can take over an order another person is packing.')
  }
  await sequelize.transaction(async (t) => {
    const o = await lockOrder(orderId, t)
    if (o.status === 'packing') {
      if (o.packer_id === user.id) return
      if (!input.takeOver) throw alreadyClaimed(o)
      await sequelize.query(
        'UPDATE orders SET packer_id = $2, packing_started_at = now(), updated_at = now() WHERE id = $1',
        { bind: [orderId, user.id], transaction: t },
      )
      await audit(
        {
          userId: user.id,
          action: 'order.packing_taken_over',
          entity: 'order',
          entityId: orderId,
          data: { from: o.packer_id },
        },
        t,
      )
      return
    }
    const to = nextStatus(o, 'start_packing', user)
    const waiting = await unallocatedLines(orderId, t)
    if (waiting.length > 0) {
      throw AppError.conflict(
        'awaiting_stock',
        `Order ${o.number} is waiting for curing stock on ${waiting.map((l) => l.sku).join(', ')}; it can be packed once its bars are set aside.`,
        waiting.map((l) => ({
          field: `lines.${l.orderLineId}`,
          message: `${l.sku}: ${l.allocatedBars} of ${l.bars} bars set aside.`,
        })),
      )
    }
    await sequelize.query(
      `UPDATE orders SET status = $2, packer_id = $3, packing_started_at = now(), updated_at = now() WHERE id = $1`,
      { bind: [orderId, to, user.id], transaction: t },
    )
    await audit({ userId: user.id, action: 'order.packing_started', entity: 'order', entityId: orderId }, t)
  })
  return (await packingOrder(orderId))!
}

/**
 * Records an order as packed: the bars put in for every line must be exactly its allocations
 * (422 `packed_mismatch` names each line at fault); only from `packing` (409 `invalid_transition`);
 * a packer records only an order they claimed.
 */
export async function markPacked(
  orderId: number,
  input: MarkPacked,
  user: PackingUser,
): Promise<PackingOrderDto> {
  await sequelize.transaction(async (t) => {
    const o = await lockOrder(orderId, t)
    const to = nextStatus(o, 'finish_packing', user)
    if (user.role === 'packer' && o.packer_id !== user.id) throw alreadyClaimed(o)
    const lines = await packingLines(orderId, t)
    const byId = new Map(lines.map((l) => [l.orderLineId, l]))
    const mismatches: PackedMismatchDetail[] = []
    input.lines.forEach((given, i) => {
      const line = byId.get(given.orderLineId)
      if (!line) {
        mismatches.push({
          field: `lines.${i}.orderLineId`,
          message: `Line ${given.orderLineId} is not on order ${o.number}.`,
          orderLineId: given.orderLineId,
          expectedBars: 0,
          packedBars: given.bars,
        })
      } else if (given.bars !== line.allocatedBars) {
        mismatches.push({
          field: `lines.${i}.bars`,
          message: `${line.sku}: ${line.allocatedBars} bars are allocated (${line.lots.map((l) => `${l.lotCode} × ${l.bars}`).join(', ') || 'none'}), ${given.bars} packed.`,
          orderLineId: line.orderLineId,
          expectedBars: line.allocatedBars,
          packedBars: given.bars,
        })
      }
    })
    const given = new Set(input.lines.map((l) => l.orderLineId))
    for (const line of lines) {
      if (!given.has(line.orderLineId)) {
        mismatches.push({
          field: 'lines',
          message: `${line.sku} (${line.allocatedBars} bars) is missing from what was packed.`,
          orderLineId: line.orderLineId,
          expectedBars: line.allocatedBars,
          packedBars: null,
        })
      }
    }
    if (mismatches.length > 0) {
      throw AppError.unprocessable(
        'packed_mismatch',
        mismatches.length === 1
          ? `What was packed does not match the allocations: ${mismatches[0]!.message}`
          : `What was packed does not match the allocations on ${mismatches.length} lines.`,
        mismatches,
      )
    }
    const short = lines.filter((l) => l.allocatedBars !== l.bars)
    if (short.length > 0) {
      throw AppError.conflict(
        'awaiting_stock',
        `Order ${o.number} still waits for bars on ${short.map((l) => l.sku).join(', ')}.`,
      )
    }
    await sequelize.query(
      `UPDATE orders SET status = $2, packed_at = now(), cartons = $3, packed_weight_g = $4, updated_at = now()
        WHERE id = $1`,
      { bind: [orderId, to, input.cartons, input.weightG], transaction: t },
    )
    await audit(
      {
        userId: user.id,
        action: 'order.packed',
        entity: 'order',
        entityId: orderId,
        data: { cartons: input.cartons, weightG: input.weightG, lines: input.lines },
      },
      t,
    )
  })
  return (await packingOrder(orderId))!
}

/** The packing view of an order, or 404 (a packer does not see placed or cancelled orders). */
export async function packingOrderFor(orderId: number, user: PackingUser): Promise<PackingOrderDto> {
  const order = await packingOrder(orderId)
  if (!order || (user.role === 'packer' && !PACKER_VISIBLE.includes(order.status))) {
    throw AppError.notFound('That order')
  }
  return order
}

/** The pick list of confirmed and packing orders; any other order named is refused. */
export async function pickListFor(orderIds: number[]): Promise<PickListDto> {
  const rows = await sequelize.query<{
    id: number
    number: string
    status: OrderStatus
    shop_name: string
    po_number: string | null
  }>(
    `SELECT o.id, o.number, o.status, s.trading_name AS shop_name, o.po_number
       FROM orders o JOIN shops s ON s.id = o.shop_id
      WHERE o.id = ANY($1::int[])`,
    { bind: [orderIds], type: QueryTypes.SELECT },
  )
  const found = new Map(rows.map((r) => [r.id, r]))
  const missing = orderIds.filter((id) => !found.has(id))
  if (missing.length > 0) {
    throw new AppError(
      404,
      'not_found',
      missing.length === 1
        ? `Order ${missing[0]} was not found.`
        : `Orders ${missing.join(', ')} were not found.`,
      missing.map((id) => ({ field: 'orders', message: `No order ${id}.`, orderId: id })),
    )
  }
  const wrong = rows.filter((r) => !PICKABLE.includes(r.status))
  if (wrong.length > 0) {
    throw AppError.conflict(
      'not_pickable',
      `A pick list is for confirmed orders and orders being packed: ${wrong.map((r) => `${r.number} is ${r.status}`).join(', ')}.`,
      wrong.map((r) => ({
        field: 'orders',
        message: `${r.number} is ${r.status}.`,
        orderId: r.id,
        status: r.status,
      })),
    )
  }
  return pickList(
    orderIds.map((id) => {
      const r = found.get(id)!
      return {
        orderId: r.id,
        number: r.number,
        shopName: r.shop_name,
        poNumber: r.po_number,
        status: r.status,
      }
    }),
  )
}
