import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import type { OrderStatus } from '@shared/domain/orders/order-status'
import type { OrderDto, OrderLineDto, OrderListQuery } from '@shared/schemas/orders'
import { selectRows, sequelize } from '@server/db/sequelize'
import { awaitingPaymentSql } from '@server/modules/invoices/prepay-payment'
import { getSettings } from '@server/modules/settings/settings.service'

/** Who is asking decides what an order shows: a packer never sees a price. */
export type OrderViewer = { role: 'owner' | 'packer' | 'buyer'; shopId: number | null }

/** The statuses on a packer's list: orders to pack or being packed. */
export const PACKER_STATUSES: readonly OrderStatus[] = ['confirmed', 'packing', 'packed']

type OrderRow = {
  id: number
  number: string
  status: OrderStatus
  shop_id: number
  shop_name: string
  po_number: string | null
  note: string | null
  requested_ship_date: string | null
  is_opening_order: boolean
  subtotal_cents: number
  shipping_cents: number
  tax_cents: number
  total_cents: number
  tax_exempt: boolean
  weight_g: number
  created_at: Date
  placed_by_name: string | null
  confirmed_at: Date | null
  cancelled_at: Date | null
  cancel_reason: string | null
  packer_name: string | null
  packed_at: Date | null
  cartons: number | null
  shipped_at: Date | null
  invoice_id: number | null
  invoice_number: string | null
  invoice_void: boolean | null
  awaiting_payment: boolean
}

type LineRow = {
  id: number
  order_id: number
  product_id: number
  sku: string
  name: string
  cases: number
  case_pack: number
  bars: number
  unit_price_cents: number
  line_total_cents: number
  preorder: boolean
  promised_date: string | null
  allocations: { batchId: number; lotCode: string; bars: number }[]
}

const ORDER_SELECT = `
  SELECT o.id, o.number, o.status, o.shop_id, s.trading_name AS shop_name, o.po_number, o.note,
         o.requested_ship_date, o.is_opening_order, o.subtotal_cents, o.shipping_cents, o.tax_cents,
         o.total_cents, o.tax_exempt, o.weight_g, o.created_at, pu.name AS placed_by_name, o.confirmed_at,
         o.cancelled_at, o.cancel_reason, pk.name AS packer_name, o.packed_at, o.cartons, o.shipped_at,
         inv.id AS invoice_id, inv.number AS invoice_number, inv.void AS invoice_void,
         ${awaitingPaymentSql('o.id')} AS awaiting_payment
    FROM orders o
    JOIN shops s ON s.id = o.shop_id
    LEFT JOIN users pu ON pu.id = o.placed_by
    LEFT JOIN users pk ON pk.id = o.packer_id
    LEFT JOIN LATERAL (
      SELECT i.id, i.number, i.voided_at IS NOT NULL AS void
        FROM invoices i
       WHERE i.order_id = o.id AND i.kind = 'invoice'
       ORDER BY i.voided_at IS NULL DESC, i.id DESC
       LIMIT 1) inv ON true`

/** Every line of these orders with its allocations' lot codes, oldest batch first: one query. */
async function linesOf(orderIds: number[], transaction?: Transaction): Promise<Map<number, LineRow[]>> {
  const rows = await selectRows<LineRow>(
    `SELECT l.id, l.order_id, l.product_id, l.sku, l.name, l.cases, l.case_pack, l.bars, l.unit_price_cents,
            l.line_total_cents, l.preorder, l.promised_date,
            COALESCE(json_agg(json_build_object('batchId', a.batch_id, 'lotCode', b.lot_code, 'bars', a.bars)
                              ORDER BY b.ready_date, b.id) FILTER (WHERE a.id IS NOT NULL), '[]') AS allocations
       FROM order_lines l
       LEFT JOIN allocations a ON a.order_line_id = l.id
       LEFT JOIN batches b ON b.id = a.batch_id
      WHERE l.order_id = ANY($1::int[]) AND l.removed_at IS NULL
      GROUP BY l.id
      ORDER BY l.order_id, l.sort_order, l.id`,
    [orderIds],
    transaction,
  )
  const byOrder = new Map<number, LineRow[]>()
  for (const r of rows) {
    const list = byOrder.get(r.order_id) ?? []
    list.push(r)
    byOrder.set(r.order_id, list)
  }
  return byOrder
}

function toDto(o: OrderRow, lines: LineRow[], withPrices: boolean, currency: string): OrderDto {
  const lineDtos: OrderLineDto[] = lines.map((l) => ({
    id: l.id,
    productId: l.product_id,
    sku: l.sku,
    name: l.name,
    cases: l.cases,
    casePack: l.case_pack,
    bars: l.bars,
    ...(withPrices ? { unitPriceCents: l.unit_price_cents, lineTotalCents: l.line_total_cents } : {}),
    preorder: l.preorder,
    promisedDate: l.promised_date,
    allocations: l.allocations,
  }))
  return {
    id: o.id,
    number: o.number,
    status: o.status,
    shopId: o.shop_id,
    shopName: o.shop_name,
    poNumber: o.po_number,
    note: o.note,
    requestedShipDate: o.requested_ship_date,
    isOpeningOrder: o.is_opening_order,
    lines: lineDtos,
    ...(withPrices
      ? {
          subtotalCents: o.subtotal_cents,
          shippingCents: o.shipping_cents,
          taxCents: o.tax_cents,
          totalCents: o.total_cents,
          taxExempt: o.tax_exempt,
          invoice:
            o.invoice_id !== null
              ? { id: o.invoice_id, number: o.invoice_number!, void: o.invoice_void === true }
              : null,
        }
      : {}),
    awaitingPayment: o.awaiting_payment,
    currency,
    weightG: o.weight_g,
    waitingForStock: lineDtos.some((l) => l.preorder && l.allocations.length === 0),
    placedAt: o.created_at.toISOString(),
    placedBy: o.placed_by_name,
    confirmedAt: o.confirmed_at ? o.confirmed_at.toISOString() : null,
    cancelledAt: o.cancelled_at ? o.cancelled_at.toISOString() : null,
    cancelReason: o.cancel_reason,
    packerName: o.packer_name,
    packedAt: o.packed_at ? o.packed_at.toISOString() : null,
    cartons: o.cartons,
    shippedAt: o.shipped_at ? o.shipped_at.toISOString() : null,
  }
}

async function dtos(rows: OrderRow[], viewer: OrderViewer, transaction?: Transaction): Promise<OrderDto[]> {
  if (rows.length === 0) return []
  const lines = await linesOf(
    rows.map((r) => r.id),
    transaction,
  )
  const { currency } = await getSettings(transaction)
  return rows.map((r) => toDto(r, lines.get(r.id) ?? [], viewer.role !== 'packer', currency))
}

/** The conditions a viewer's list is confined to, whatever filters they send. */
function scope(viewer: OrderViewer, filter: Partial<OrderListQuery>) {
  const where: string[] = []
  const bind: unknown[] = []
  const add = (sql: (n: string) => string, value: unknown) => {
    bind.push(value)
    where.push(sql(`$${bind.length}`))
  }
  if (viewer.role === 'buyer') add((n) => `o.shop_id = ${n}`, viewer.shopId)
  else if (filter.shopId) add((n) => `o.shop_id = ${n}`, filter.shopId)
  const allowed = viewer.role === 'packer' ? PACKER_STATUSES : null
  const statuses = filter.status?.length
    ? filter.status.filter((s) => !allowed || allowed.includes(s))
    : allowed
  if (statuses) add((n) => `o.status = ANY(${n}::text[])`, statuses)
  return { where, bind, add }
}

/** One order as the viewer may see it; null when it is not theirs to see (the caller answers 404). */
export async function findOrder(
  id: number,
  viewer: OrderViewer,
  transaction?: Transaction,
): Promise<OrderDto | null> {
  const { where, bind, add } = scope(viewer, {})
  add((n) => `o.id = ${n}`, id)
  const rows = await selectRows<OrderRow>(`${ORDER_SELECT} WHERE ${where.join(' AND ')}`, bind, transaction)
  return (await dtos(rows, viewer, transaction))[0] ?? null
}

function like(text: string) {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`
}

/**
 * A page of orders, newest first (the created_at indexes serve each scope), lines loaded for the
 * whole page in one query. `from`/`to` are placed dates in the studio's time zone.
 */
export async function listOrders(
  viewer: OrderViewer,
  filter: OrderListQuery,
  timeZone: string,
  limit = filter.pageSize,
): Promise<{ items: OrderDto[]; total: number }> {
  const { where, bind, add } = scope(viewer, filter)
  if (filter.from || filter.to) bind.push(timeZone)
  const tz = `$${bind.length}`
  if (filter.from) add((n) => `o.created_at >= (${n}::date::timestamp AT TIME ZONE ${tz})`, filter.from)
  if (filter.to) add((n) => `o.created_at < ((${n}::date + 1)::timestamp AT TIME ZONE ${tz})`, filter.to)
  if (filter.q) add((n) => `(o.number ILIKE ${n} OR o.po_number ILIKE ${n})`, like(filter.q))
  const whereSql = where.length ? `WHERE ${where.join(' AND ')}` : ''
  // The page's orders are picked first (on the created_at indexes) and only they are joined to their
  // shop, people and invoice: with the joins outside, an OFFSET deep into a long history built every
  // skipped row too. The count runs beside it on a second connection.
  const order = 'ORDER BY o.created_at DESC, o.id DESC'
  const page = `SELECT o.id FROM orders o ${whereSql} ${order} LIMIT ${Number(limit)} OFFSET ${Number((filter.page - 1) * filter.pageSize)}`
  const [[countRow], rows] = await Promise.all([
    sequelize.query<{ n: number }>(`SELECT count(*)::int AS n FROM orders o ${whereSql}`, {
      bind,
      type: QueryTypes.SELECT,
    }),
    sequelize.query<OrderRow>(
      `${ORDER_SELECT.replace('FROM orders o', `FROM (${page}) page JOIN orders o ON o.id = page.id`)} ${order}`,
      {
        bind,
        type: QueryTypes.SELECT,
      },
    ),
  ])
  return { items: await dtos(rows, viewer), total: countRow?.n ?? 0 }
}
