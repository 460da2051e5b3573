import type { Transaction } from 'sequelize'
import { QueryTypes } from 'sequelize'
import { DomainError } from '@shared/domain/errors'
import { priceOrder } from '@shared/domain/orders/order-pricing'
import type { OrderPricing, OrderPricingInput } from '@shared/domain/orders/order-pricing'
import { formatCents } from '@shared/domain/money/money'
import type { ErrorDetail } from '@shared/schemas/errors'
import type { Settings } from '@shared/schemas/settings'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import type { SellableProduct } from '@server/modules/catalogue/catalogue.service'

const NOT_IN_CATALOGUE =
  'This product is not in your catalogue: it is unknown, no longer on sale, or not priced for your shop.'

/** 400 with every line whose product the shop cannot order (`lines.N.productId`). */
export function requireSellable(
  lines: readonly { productId: number }[],
  products: ReadonlyMap<number, SellableProduct>,
  skip: (index: number) => boolean = () => false,
): void {
  const details: ErrorDetail[] = []
  lines.forEach((line, i) => {
    if (!skip(i) && !products.has(line.productId))
      details.push({ field: `lines.${i}.productId`, message: NOT_IN_CATALOGUE })
  })
  if (details.length > 0) {
    throw AppError.invalid(
      details.length === 1 ? `${details[0]!.field}: ${NOT_IN_CATALOGUE}` : 'Some lines need attention.',
      details,
    )
  }
}

/** priceOrder, with a problem of the buyer's input (a count below the first break) as a 400 on its field. */
export function price(input: OrderPricingInput): OrderPricing {
  try {
    return priceOrder(input)
  } catch (err) {
    if (err instanceof DomainError && err.field?.startsWith('lines.'))
      throw AppError.field(err.field, err.message)
    throw err
  }
}

export function pricingSettings(settings: Settings) {
  return {
    openingMinimumCents: settings.openingMinimumCents,
    reorderMinimumCents: settings.reorderMinimumCents,
    shippingBands: settings.shippingBands,
    taxRatePct: settings.taxRatePct,
  }
}

/** 422 below_minimum: the merchandise subtotal is under the opening or reorder minimum. */
export function requireMinimum(pricing: OrderPricing, isOpeningOrder: boolean, currency: string): void {
  if (pricing.belowMinimumByCents === 0) return
  const kind = isOpeningOrder ? 'An opening order' : 'A reorder'
  throw AppError.unprocessable(
    'below_minimum',
    `${kind} needs at least ${formatCents(pricing.minimumCents, currency)} of merchandise; this one has ${formatCents(pricing.subtotalCents, currency)}. Add ${formatCents(pricing.belowMinimumByCents, currency)} more.`,
    {
      minimumKind: isOpeningOrder ? 'opening' : 'reorder',
      minimumCents: pricing.minimumCents,
      subtotalCents: pricing.subtotalCents,
      belowMinimumByCents: pricing.belowMinimumByCents,
    },
  )
}

/**
 * Good standing, for confirming orders at once: no live invoice of the shop is unpaid past its
 * due date (overdue from the day after it is due, as shared/domain/invoices/terms says).
 */
export async function hasOverdueInvoices(
  shopId: number,
  today: string,
  transaction: Transaction,
): Promise<boolean> {
  const [row] = await sequelize.query<{ overdue: boolean }>(
    `SELECT EXISTS (
       SELECT 1 FROM invoices
        WHERE shop_id = $1 AND kind = 'invoice' AND voided_at IS NULL AND paid_cents < total_cents
          AND due_date < $2::date
     ) AS overdue`,
    { bind: [shopId, today], type: QueryTypes.SELECT, transaction },
  )
  return row?.overdue ?? false
}
