import { z } from 'zod'
import { recordId } from '@shared/schemas/record-id'
import type { OrderStatus } from '@shared/domain/orders/order-status'

// The packer's side of an order: the queue, claiming, the pick list and recording what was packed.
// Nothing here carries a price or a cost: packers never see them.

export const PackingOrderParamsSchema = z.object({
  id: recordId('Not an order number.'),
})

/** `POST /api/orders/:id/claim`; an owner may take over an order another person has claimed. */
export const ClaimOrderSchema = z.object({
  takeOver: z.boolean({ error: 'Say true or false.' }).optional().default(false),
})
export type ClaimOrderInput = z.input<typeof ClaimOrderSchema>

export const PICK_LIST_MAX_ORDERS = 40

/** `GET /api/pick-list?orders=1,2,3` (and `.pdf`): the orders to pull bars for, each once. */
export const PickListQuerySchema = z.object({
  orders: z.preprocess(
    (v) =>
      typeof v === 'string'
        ? v
            .split(',')
            .map((s) => s.trim())
            .filter(Boolean)
        : v,
    z
      .array(
        z.coerce
          .number<string | number>({ error: 'Order ids are whole numbers.' })
          .int('Order ids are whole numbers.')
          .positive('Order ids are whole numbers.')
          .max(2_147_483_647, 'Order ids are whole numbers.'),
        { error: 'Choose at least one order.' },
      )
      .min(1, 'Choose at least one order.')
      .max(PICK_LIST_MAX_ORDERS, `At most ${PICK_LIST_MAX_ORDERS} orders on one pick list.`)
      .refine((ids) => new Set(ids).size === ids.length, 'An order is listed twice.'),
  ),
})
export type PickListQuery = z.output<typeof PickListQuerySchema>

const whole = (what: string, min: number, max: number) =>
  z.coerce
    .number<string | number>({ error: `Enter the ${what}.` })
    .int(`The ${what} is a whole number.`)
    .min(min, `The ${what} must be at least ${min}.`)
    .max(max, `The ${what} must be at most ${max.toLocaleString('en-US')}.`)

/**
 * `POST /api/orders/:id/packed`: the cartons, the packed weight and the bars put in for every line.
 * The server compares the bars with the line's allocations; they must match exactly.
 */
export const MarkPackedSchema = z.object({
  cartons: whole('number of cartons', 1, 500),
  weightG: whole('packed weight in grams', 1, 2_000_000),
  lines: z
    .array(
      z.object({
        orderLineId: whole('order line', 1, 2_147_483_647),
        bars: whole('number of bars', 0, 1_000_000),
      }),
      { error: 'List the bars packed for every line.' },
    )
    .min(1, 'List the bars packed for every line.')
    .max(200, 'At most 200 lines.')
    .superRefine((lines, ctx) => {
      const seen = new Set<number>()
      lines.forEach((l, i) => {
        if (seen.has(l.orderLineId)) {
          ctx.addIssue({ code: 'custom', path: [i, 'orderLineId'], message: 'This line is listed twice.' })
        }
        seen.add(l.orderLineId)
      })
    }),
})
export type MarkPackedInput = z.input<typeof MarkPackedSchema>
export type MarkPacked = z.output<typeof MarkPackedSchema>

export type PackerRef = { id: number; name: string }

/** One row of `GET /api/packing/queue`. */
export type PackingQueueItem = {
  orderId: number
  number: string
  status: Extract<OrderStatus, 'confirmed' | 'packing' | 'packed'>
  shopId: number
  shopName: string
  poNumber: string | null
  requestedShipDate: string | null
  placedAt: string
  confirmedAt: string | null
  lineCount: number
  cases: number
  bars: number
  /** Every line has its bars allocated (a pre-order still waiting for curing stock has not). */
  readyToPack: boolean
  /** A prepay account's invoice is not yet paid in full: the order may be packed, not shipped. */
  awaitingPayment: boolean
  packer: PackerRef | null
  packingStartedAt: string | null
}
/**
 * `items`: confirmed and packing orders, oldest first. `awaitingShipment`: packed orders waiting for
 * the carrier, oldest packed first.
 */
export type PackingQueueDto = { items: PackingQueueItem[]; awaitingShipment: PackingQueueItem[] }

export type PickLot = {
  batchId: number
  lotCode: string
  location: string | null
  readyDate: string
  bars: number
  orders: { orderId: number; number: string; bars: number }[]
}

export type PickProduct = {
  productId: number
  sku: string
  name: string
  casePack: number
  bars: number
  cases: number
  /** Oldest ready batch first, as the bars were allocated. */
  lots: PickLot[]
}

/** One lot to pull from on the walk: a product's batch lot where it sits, and the orders it goes to. */
export type PickStop = PickLot & { productId: number; sku: string; name: string; casePack: number }

/**
 * `GET /api/pick-list`: every bar to pull for the chosen orders, by product and by batch lot
 * (`products`, by SKU), and the same lots in the order to walk the shelves (`stops`: by location,
 * then SKU, then lot age; lots without a location last).
 */
export type PickListDto = {
  orders: {
    orderId: number
    number: string
    shopName: string
    poNumber: string | null
    status: OrderStatus
  }[]
  products: PickProduct[]
  stops: PickStop[]
  totalBars: number
  totalCases: number
}

export type PackingLineLot = { batchId: number; lotCode: string; location: string | null; bars: number }

export type PackingLine = {
  orderLineId: number
  productId: number
  sku: string
  name: string
  cases: number
  casePack: number
  bars: number
  /** Bars allocated to the line; equal to `bars` once the line is ready to pack. */
  allocatedBars: number
  lots: PackingLineLot[]
}

export type ShipmentDto = {
  carrier: string
  trackingNumber: string
  shipDate: string
  cartons: number
  weightG: number
  createdBy: string | null
}

/** `GET /api/packing/orders/:id`: an order as the packing bench sees it (no prices). */
export type PackingOrderDto = {
  id: number
  number: string
  status: OrderStatus
  shopId: number
  shopName: string
  poNumber: string | null
  note: string | null
  requestedShipDate: string | null
  placedAt: string
  shipTo: { name: string; contactName: string; contactPhone: string | null; lines: string[] }
  lines: PackingLine[]
  readyToPack: boolean
  /** A prepay account's invoice is not yet paid in full: the order may be packed, not shipped. */
  awaitingPayment: boolean
  packer: PackerRef | null
  packingStartedAt: string | null
  packedAt: string | null
  cartons: number | null
  packedWeightG: number | null
  /** The weight of the bars by their declared net weight, a guide for the scale. */
  estimatedWeightG: number
  shipment: ShipmentDto | null
}

/** `422 packed_mismatch` details: one entry per line at fault. */
export type PackedMismatchDetail = {
  field: string
  message: string
  orderLineId: number
  expectedBars: number
  packedBars: number | null
}
