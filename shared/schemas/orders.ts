import { z } from 'zod'
import { ORDER_STATUSES } from '@shared/domain/orders/order-status'

export const PO_NUMBER_MAX = 40

/** `POST /api/orders` body (DESIGN.md contract). Header `Idempotency-Key` is required. */
export const PlaceOrderSchema = z.object({
  lines: z
    .array(
      z.object({
        productId: z.number({ error: 'Choose a product.' }).int('Choose a product.').positive('Choose a product.'),
        cases: z
          .number({ error: 'Enter a whole number of cases.' })
          .int('Order whole cases only.')
          .min(1, 'Order at least one case.')
          .max(10000, 'At most 10,000 cases on a line.'),
        /** Ask for curing stock, promised for its ready date. */
        preorder: z.boolean().optional().default(false),
      }),
      { error: 'Add at least one line.' },
    )
    .min(1, 'Add at least one line.')
    .max(200, 'At most 200 lines in one order.'),
  poNumber: z
    .string()
    .trim()
    .max(PO_NUMBER_MAX, `A PO number has at most ${PO_NUMBER_MAX} characters.`)
    .optional()
    .transform((v) => (v ? v : undefined)),
  note: z.string().trim().max(1000, 'At most 1,000 characters.').optional(),
  requestedShipDate: z.iso.date('Use a date like 2026-12-24.').optional(),
})
export type PlaceOrderInput = z.input<typeof PlaceOrderSchema>
export type PlaceOrder = z.output<typeof PlaceOrderSchema>

export const IdempotencyKeySchema = z
  .string({ error: 'Send an Idempotency-Key header.' })
  .min(1, 'Send an Idempotency-Key header.')
  .max(200, 'An Idempotency-Key has at most 200 characters.')

export type OrderStatus = (typeof ORDER_STATUSES)[number]

export const ORDER_STATUS_LABELS: Record<OrderStatus, string> = {
  placed: 'Placed',
  confirmed: 'Confirmed',
  packing: 'Packing',
  packed: 'Packed',
  shipped: 'Shipped',
  cancelled: 'Cancelled',
}

/** An order line as the contract gives it; price fields are absent for packers. */
export type OrderLineDto = {
  id: number
  productId: number
  sku: string
  name: string
  cases: number
  casePack: number
  bars: number
  unitPriceCents?: number
  lineTotalCents?: number
  preorder: boolean
  promisedDate: string | null
  /** the batch lots behind the line, oldest first (empty until a pre-order is allocated) */
  allocations: { batchId: number; lotCode: string; bars: number }[]
}

/** An order as the contract gives it (`{ order }` from POST and GET /api/orders/:id). */
export type OrderDto = {
  id: number
  number: string
  status: OrderStatus
  shopId: number
  shopName: string
  poNumber: string | null
  note: string | null
  requestedShipDate: string | null
  isOpeningOrder: boolean
  lines: OrderLineDto[]
  subtotalCents?: number
  shippingCents?: number
  taxCents?: number
  totalCents?: number
  taxExempt?: boolean
  weightG: number
  placedAt: string
  placedBy: string | null
  confirmedAt: string | null
  cancelledAt: string | null
  cancelReason: string | null
  packerName: string | null
  packedAt: string | null
  cartons: number | null
  shippedAt: string | null
}

/** `GET /api/orders` → `{ items: OrderDto[], page, pageSize, total }`: full orders with their lines, paged. */
export type OrderListDto = { items: OrderDto[]; page: number; pageSize: number; total: number }
