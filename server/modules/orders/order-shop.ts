import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { isCertificateValid } from '@shared/domain/orders/order-pricing'
import type { ShopStatus } from '@shared/schemas/shops'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'

/** What ordering needs to know of a shop: its tier, its standing, its certificate, its first order. */
export type OrderingShop = {
  id: number
  tradingName: string
  contactEmail: string
  tierId: number | null
  status: ShopStatus
  paymentTerms: string
  openingOrderDone: boolean
  certificateOnFile: boolean
  certificateExpiresOn: string | null
}

/** The shop, with its row locked against other writers when `lock` (the order that ends its opening order). */
export async function orderingShop(
  shopId: number,
  transaction?: Transaction,
  lock = false,
): Promise<OrderingShop> {
  const [r] = await sequelize.query<{
    id: number
    trading_name: string
    contact_email: string
    tier_id: number | null
    status: ShopStatus
    payment_terms: string
    opening_order_done: boolean
    certificate_upload_id: number | null
    certificate_expires_on: string | null
  }>(
    `SELECT id, trading_name, contact_email, tier_id, status, payment_terms, opening_order_done, certificate_upload_id,
            certificate_expires_on
       FROM shops WHERE id = $1 ${lock ? 'FOR NO KEY UPDATE' : ''}`,
    { bind: [shopId], type: QueryTypes.SELECT, transaction },
  )
  if (!r) throw AppError.notFound('That shop')
  return {
    id: r.id,
    tradingName: r.trading_name,
    contactEmail: r.contact_email,
    tierId: r.tier_id,
    status: r.status,
    paymentTerms: r.payment_terms,
    openingOrderDone: r.opening_order_done,
    certificateOnFile: r.certificate_upload_id !== null,
    certificateExpiresOn: r.certificate_expires_on,
  }
}

/** A valid resale certificate on file makes the shop's orders tax exempt. */
export function taxExemptOn(shop: OrderingShop, today: string): boolean {
  return isCertificateValid({ onFile: shop.certificateOnFile, expiresOn: shop.certificateExpiresOn }, today)
}
