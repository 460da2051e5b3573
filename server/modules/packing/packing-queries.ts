import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import type { OrderStatus } from '@shared/domain/orders/order-status'
import { walkOrder } from '@shared/domain/packing/walk-order'
import type {
  PackingLine,
  PackingOrderDto,
  PackingQueueItem,
  PickListDto,
  PickProduct,
} from '@shared/schemas/packing'
import { formatAddress } from '@shared/schemas/shops'
import type { Address } from '@shared/schemas/shops'
import { sequelize } from '@server/db/sequelize'
import { awaitingPaymentSql } from '@server/modules/invoices/prepay-payment'

// Read paths of the packing bench. None of these selects a price, a cost or a margin: what they
// return goes to packers as it is.

type QueueRow = {
  id: number
  number: string
  status: 'confirmed' | 'packing' | 'packed'
  shop_id: number
  shop_name: string
  po_number: string | null
  requested_ship_date: string | null
  created_at: Date
  confirmed_at: Date | null
  packer_id: number | null
  packer_name: string | null
  packing_started_at: Date | null
  packed_at: Date | null
  line_count: number
  cases: number
  bars: number
  allocated_bars: number
  unallocated_lines: number
  awaiting_payment: boolean
}

const iso = (d: Date | null) => (d ? d.toISOString() : null)

/** Orders on the bench: confirmed and packing ones oldest first, then packed ones waiting to ship. */
export async function packingQueue(): Promise<{
  items: PackingQueueItem[]
  awaitingShipment: PackingQueueItem[]
}> {
  const rows = await sequelize.query<QueueRow>(
    `SELECT o.id, o.number, o.status, o.shop_id, s.trading_name AS shop_name, o.po_number, o.requested_ship_date,
            o.created_at, o.confirmed_at, o.packer_id, pk.name AS packer_name, o.packing_started_at, o.packed_at,
            count(l.id)::int AS line_count, COALESCE(sum(l.cases), 0)::int AS cases, COALESCE(sum(l.bars), 0)::int AS bars,
            COALESCE(sum(al.bars), 0)::int AS allocated_bars,
            count(l.id) FILTER (WHERE COALESCE(al.bars, 0) <> l.bars)::int AS unallocated_lines,
            ${awaitingPaymentSql('o.id')} AS awaiting_payment
       FROM orders o
       JOIN shops s ON s.id = o.shop_id
       LEFT JOIN users pk ON pk.id = o.packer_id
       JOIN order_lines l ON l.order_id = o.id AND l.removed_at IS NULL
       LEFT JOIN LATERAL (SELECT sum(a.bars)::int AS bars FROM allocations a WHERE a.order_line_id = l.id) al ON true
      WHERE o.status IN ('confirmed', 'packing', 'packed')
      GROUP BY o.id, s.trading_name, pk.name
      ORDER BY o.created_at, o.id`,
    { type: QueryTypes.SELECT },
  )
  const toItem = (r: QueueRow): PackingQueueItem => ({
    orderId: r.id,
    number: r.number,
    status: r.status,
    shopId: r.shop_id,
    shopName: r.shop_name,
    poNumber: r.po_number,
    requestedShipDate: r.requested_ship_date,
    placedAt: r.created_at.toISOString(),
    confirmedAt: iso(r.confirmed_at),
    lineCount: r.line_count,
    cases: r.cases,
    bars: r.bars,
    readyToPack: r.unallocated_lines === 0,
    awaitingPayment: r.awaiting_payment,
    packer: r.packer_id !== null ? { id: r.packer_id, name: r.packer_name ?? '' } : null,
    packingStartedAt: iso(r.packing_started_at),
  })
  const packed = rows
    .filter((r) => r.status === 'packed')
    .sort((a, b) => (a.packed_at?.getTime() ?? 0) - (b.packed_at?.getTime() ?? 0) || a.id - b.id)
  return {
    items: rows.filter((r) => r.status !== 'packed').map(toItem),
    awaitingShipment: packed.map(toItem),
  }
}

type LineRow = {
  id: number
  product_id: number
  sku: string
  name: string
  cases: number
  case_pack: number
  bars: number
  lots: { batchId: number; lotCode: string; location: string | null; bars: number }[]
}

/** An order's live lines with the batch lots behind them, oldest ready batch first. */
export async function packingLines(orderId: number, transaction?: Transaction): Promise<PackingLine[]> {
  const rows = await sequelize.query<LineRow>(
    `SELECT l.id, l.product_id, l.sku, l.name, l.cases, l.case_pack, l.bars,
            COALESCE(json_agg(json_build_object('batchId', b.id, 'lotCode', b.lot_code, 'location', b.location, 'bars', a.bars)
                              ORDER BY b.ready_date, b.id) FILTER (WHERE a.id IS NOT NULL), '[]') AS lots
       FROM order_lines l
       LEFT JOIN allocations a ON a.order_line_id = l.id
       LEFT JOIN batches b ON b.id = a.batch_id
      WHERE l.order_id = $1 AND l.removed_at IS NULL
      GROUP BY l.id
      ORDER BY l.sort_order, l.id`,
    { bind: [orderId], type: QueryTypes.SELECT, transaction },
  )
  return rows.map((r) => ({
    orderLineId: r.id,
    productId: r.product_id,
    sku: r.sku,
    name: r.name,
    cases: r.cases,
    casePack: r.case_pack,
    bars: r.bars,
    allocatedBars: r.lots.reduce((n, l) => n + l.bars, 0),
    lots: r.lots,
  }))
}

type OrderRow = {
  id: number
  number: string
  status: OrderStatus
  shop_id: number
  shop_name: string
  contact_name: string
  contact_phone: string | null
  shipping_address: Address
  po_number: string | null
  note: string | null
  requested_ship_date: string | null
  created_at: Date
  packer_id: number | null
  packer_name: string | null
  packing_started_at: Date | null
  packed_at: Date | null
  cartons: number | null
  packed_weight_g: number | null
  weight_g: number
  carrier: string | null
  tracking_number: string | null
  ship_date: string | null
  ship_cartons: number | null
  ship_weight_g: number | null
  shipped_by: string | null
  awaiting_payment: boolean
}

/** The order as the packing bench sees it; null when there is no such order. */
export async function packingOrder(
  orderId: number,
  transaction?: Transaction,
): Promise<PackingOrderDto | null> {
  const [o] = await sequelize.query<OrderRow>(
    `SELECT o.id, o.number, o.status, o.shop_id, s.trading_name AS shop_name, s.contact_name, s.contact_phone,
            s.shipping_address, o.po_number, o.note, o.requested_ship_date, o.created_at, o.packer_id,
            pk.name AS packer_name, o.packing_started_at, o.packed_at, o.cartons, o.packed_weight_g, o.weight_g,
            sh.carrier, sh.tracking_number, sh.ship_date, sh.cartons AS ship_cartons, sh.weight_g AS ship_weight_g,
            su.name AS shipped_by, ${awaitingPaymentSql('o.id')} AS awaiting_payment
       FROM orders o
       JOIN shops s ON s.id = o.shop_id
       LEFT JOIN users pk ON pk.id = o.packer_id
       LEFT JOIN shipments sh ON sh.order_id = o.id
       LEFT JOIN users su ON su.id = sh.created_by
      WHERE o.id = $1`,
    { bind: [orderId], type: QueryTypes.SELECT, transaction },
  )
  if (!o) return null
  const lines = await packingLines(orderId, transaction)
  return {
    id: o.id,
    number: o.number,
    status: o.status,
    shopId: o.shop_id,
    shopName: o.shop_name,
    poNumber: o.po_number,
    note: o.note,
    requestedShipDate: o.requested_ship_date,
    placedAt: o.created_at.toISOString(),
    shipTo: {
      name: o.shop_name,
      contactName: o.contact_name,
      contactPhone: o.contact_phone,
      lines: formatAddress(o.shipping_address),
    },
    lines,
    readyToPack: lines.length > 0 && lines.every((l) => l.allocatedBars === l.bars),
    awaitingPayment: o.awaiting_payment,
    packer: o.packer_id !== null ? { id: o.packer_id, name: o.packer_name ?? '' } : null,
    packingStartedAt: iso(o.packing_started_at),
    packedAt: iso(o.packed_at),
    cartons: o.cartons,
    packedWeightG: o.packed_weight_g,
    estimatedWeightG: o.weight_g,
    shipment:
      o.carrier !== null
        ? {
            carrier: o.carrier,
            trackingNumber: o.tracking_number!,
            shipDate: o.ship_date!,
            cartons: o.ship_cartons!,
            weightG: o.ship_weight_g!,
            createdBy: o.shipped_by,
          }
        : null,
  }
}

type PickRow = {
  order_id: number
  product_id: number
  sku: string
  name: string
  case_pack: number
  batch_id: number
  lot_code: string
  location: string | null
  ready_date: string
  bars: number
}

/**
 * The bars to pull for these orders: per product (by SKU), then per batch lot in the order the
 * bars were allocated (oldest ready batch first), each lot with its shelf location and the orders
 * its bars go to; and the same lots as stops in walking order (`walkOrder`).
 */
export async function pickList(
  orders: {
    orderId: number
    number: string
    shopName: string
    poNumber: string | null
    status: OrderStatus
  }[],
): Promise<PickListDto> {
  const ids = orders.map((o) => o.orderId)
  const rows = await sequelize.query<PickRow>(
    `SELECT l.order_id, l.product_id, l.sku, l.name, l.case_pack, a.batch_id, b.lot_code, b.location, b.ready_date,
            a.bars
       FROM allocations a
       JOIN order_lines l ON l.id = a.order_line_id AND l.removed_at IS NULL
       JOIN batches b ON b.id = a.batch_id
      WHERE l.order_id = ANY($1::int[])
      ORDER BY l.sku, l.product_id, b.ready_date, b.id, l.order_id`,
    { bind: [ids], type: QueryTypes.SELECT },
  )
  const numberOf = new Map(orders.map((o) => [o.orderId, o.number]))
  const products = new Map<number, PickProduct>()
  for (const r of rows) {
    let p = products.get(r.product_id)
    if (!p) {
      p = {
        productId: r.product_id,
        sku: r.sku,
        name: r.name,
        casePack: r.case_pack,
        bars: 0,
        cases: 0,
        lots: [],
      }
      products.set(r.product_id, p)
    }
    p.bars += r.bars
    let lot = p.lots.find((x) => x.batchId === r.batch_id)
    if (!lot) {
      lot = {
        batchId: r.batch_id,
        lotCode: r.lot_code,
        location: r.location,
        readyDate: r.ready_date,
        bars: 0,
        orders: [],
      }
      p.lots.push(lot)
    }
    lot.bars += r.bars
    const forOrder = lot.orders.find((x) => x.orderId === r.order_id)
    if (forOrder) forOrder.bars += r.bars
    else lot.orders.push({ orderId: r.order_id, number: numberOf.get(r.order_id) ?? '', bars: r.bars })
  }
  const list = [...products.values()].map((p) => ({ ...p, cases: Math.floor(p.bars / p.casePack) }))
  const stops = walkOrder(
    list.flatMap((p) =>
      p.lots.map((lot) => ({
        ...lot,
        productId: p.productId,
        sku: p.sku,
        name: p.name,
        casePack: p.casePack,
      })),
    ),
  )
  return {
    orders,
    products: list,
    stops,
    totalBars: list.reduce((n, p) => n + p.bars, 0),
    totalCases: list.reduce((n, p) => n + p.cases, 0),
  }
}
