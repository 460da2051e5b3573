import { z } from 'zod'
import { recordId } from '@shared/schemas/record-id'
import { ORDER_STATUSES } from '@shared/domain/orders/order-status'

export const PO_NUMBER_MAX = 40

/** `POST /api/orders` body (DESIGN.md contract). Header `Idempotency-Key` is required. */
const CasesSchema = z
  .number({ error: 'Enter a whole number of cases.' })
  .int('Order whole cases only.')
  .min(1, 'Order at least one case.')
  .max(10000, 'At most 10,000 cases on a line.')

/** The lines of an order: each product once (the cart merges cases of one product into one line). */
export const OrderLinesSchema = z
  .array(
    z.object({
      productId: z
        .number({ error: 'Choose a product.' })
        .int('Choose a product.')
        .positive('Choose a product.'),
      cases: CasesSchema,
      /** Ask for curing stock, promised for its ready date. */
      preorder: z.boolean().optional().default(false),
    }),
    { error: 'Add at least one line.' },
  )
  .min(1, 'Add at least one line.')
  .max(200, 'At most 200 lines in one order.')
  .superRefine((lines, ctx) => {
    const seen = new Set<number>()
    lines.forEach((line, i) => {
      if (seen.has(line.productId)) {
        ctx.addIssue({
          code: 'custom',
          path: [i, 'productId'],
          message: 'This product is already on the order (duplicate): change the cases on its first line.',
        })
      }
      seen.add(line.productId)
    })
  })

/** `POST /api/orders` body (DESIGN.md contract). Header `Idempotency-Key` is required. */
export const PlaceOrderSchema = z.object({
  lines: OrderLinesSchema,
  poNumber: z
    .string()
    .trim()
    .max(PO_NUMBER_MAX, `A PO number has at most ${PO_NUMBER_MAX} characters.`)
    .optional()
    .transform((v) => (v ? v : undefined)),
  note: z
    .string()
    .trim()
    .max(1000, 'At most 1,000 characters.')
    .optional()
    .transform((v) => (v ? v : undefined)),
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
  /**
   * The order's invoice (the live one, else the latest void one); null before it is raised. Not
   * given to packers.
   */
  invoice?: { id: number; number: string; void: boolean } | null
  /** A prepay account's invoice is not yet paid in full: the order cannot ship until it is. */
  awaitingPayment: boolean
  /** The studio's currency (ISO 4217), in which every amount is given. */
  currency: string
  weightG: number
  /** A pre-order line still waits for its curing stock (no bars allocated yet). */
  waitingForStock: boolean
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

export const OrderIdParamsSchema = z.object({
  id: recordId('Not an order number.'),
})

const idList = (v: unknown) => (typeof v === 'string' ? v.split(',').filter(Boolean) : v)

/** `GET /api/orders` and `GET /api/orders.csv` filters; `status` may be repeated or comma-separated. */
export const OrderListQuerySchema = z
  .object({
    status: z
      .preprocess(idList, z.array(z.enum(ORDER_STATUSES, { error: 'Choose a known status.' })))
      .optional(),
    shopId: z.coerce
      .number({ error: 'Choose a shop.' })
      .int('Choose a shop.')
      .positive('Choose a shop.')
      .max(2_147_483_647, 'Choose a shop.')
      .optional(),
    from: z.iso.date('Use a date like 2026-12-01.').optional(),
    to: z.iso.date('Use a date like 2026-12-31.').optional(),
    q: z
      .string()
      .trim()
      .max(60, 'At most 60 characters.')
      .optional()
      .transform((v) => (v ? v : undefined)),
    page: z.coerce
      .number({ error: 'Pages are numbered 1, 2, 3…' })
      .int()
      .min(1, 'Pages start at 1.')
      .default(1),
    pageSize: z.coerce
      .number({ error: 'Enter how many orders a page shows.' })
      .int()
      .min(1, 'At least 1 order a page.')
      .max(100, 'At most 100 orders a page.')
      .default(25),
  })
  .refine((f) => !f.from || !f.to || f.from <= f.to, {
    path: ['to'],
    message: 'The end date is before the start date.',
  })
export type OrderListQuery = z.output<typeof OrderListQuerySchema>
export type OrderListQueryInput = z.input<typeof OrderListQuerySchema>

export const CancelOrderSchema = z.object({
  reason: z
    .string({ error: 'Enter the reason as text.' })
    .trim()
    .max(500, 'At most 500 characters.')
    .optional()
    .transform((v) => (v ? v : undefined)),
})
export type CancelOrderInput = z.input<typeof CancelOrderSchema>

/** `PATCH /api/orders/:id/lines`: the order's new lines, replacing the old ones. */
export const EditOrderLinesSchema = z.object({ lines: OrderLinesSchema })
export type EditOrderLinesInput = z.input<typeof EditOrderLinesSchema>

/** `PUT /api/cart/lines/:productId` */
export const CartLineInputSchema = z.object({
  cases: CasesSchema,
  preorder: z.boolean({ error: 'Say whether this is a pre-order.' }).optional().default(false),
})
export type CartLineInput = z.input<typeof CartLineInputSchema>

export const CartProductParamsSchema = z.object({
  productId: recordId('Not a product.'),
})

export type PriceBreakDto = { minCases: number; unitPriceCents: number }

/**
 * Whether today's stock covers a cart line: `ready` (ready bars cover it), `short` (they do not;
 * pre-order may be offered), `preorder` (a pre-order curing stock covers, see `promisedDate`),
 * `preorder_short` (a pre-order more than curing stock can promise), `unavailable` (no longer
 * on sale or not priced for the shop).
 */
export type CartLineStock = 'ready' | 'short' | 'preorder' | 'preorder_short' | 'unavailable'

export type CartLineDto = {
  productId: number
  sku: string
  name: string
  casePack: number
  netWeightG: number
  photoUrl: string | null
  cases: number
  bars: number
  preorder: boolean
  priceBreaks: PriceBreakDto[]
  /** The break this line's case count pays; null when the product is unavailable. */
  priceBreak: PriceBreakDto | null
  /** The next break up, so the screen can say how many more cases lower the price. */
  nextBreak: PriceBreakDto | null
  unitPriceCents: number
  lineTotalCents: number
  readyBars: number
  readyCases: number
  nextReady: { date: string; bars: number } | null
  stock: CartLineStock
  /** For pre-order lines: the ready date curing stock covers them by. For short lines: the date a pre-order would get. */
  promisedDate: string | null
}

export type CartDto = {
  lines: CartLineDto[]
  cases: number
  subtotalCents: number
  weightG: number
  shippingCents: number
  taxCents: number
  totalCents: number
  taxRatePct: number
  taxExempt: boolean
  minimumKind: 'opening' | 'reorder'
  minimumCents: number
  belowMinimumByCents: number
  /** Every line available and covered, the minimum met, the account open for orders. */
  canPlace: boolean
  accountOrderable: boolean
  currency: string
}

/** `POST /api/orders/:id/reorder` */
export type ReorderResultDto = {
  cart: CartDto
  /** Lines put in the cart that today's ready stock cannot cover (pre-order may cover them). */
  short: { productId: number; sku: string; name: string; cases: number; readyCases: number }[]
  /** Lines left out: the product is no longer on sale or not priced for the shop. */
  skipped: { productId: number; sku: string; name: string }[]
}

/** `409 insufficient_stock` details: one entry per product that stock cannot cover. */
export type StockShortfallDto = {
  productId: number
  requestedBars: number
  readyBars: number
  /** Present for pre-order lines: the curing bars not yet promised to earlier pre-orders. */
  preorder?: true
  curingBars?: number
}

/** `POST /api/orders/preorders/allocate` (owner) and the daily run. */
export type PreorderRunDto = {
  allocated: { orderId: number; number: string; lineId: number; productId: number; bars: number }[]
  waiting: number
}
