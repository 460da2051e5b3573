import { QueryTypes } from 'sequelize'
import type { Address, PaymentTerms, ShopStatus, ShopSummary } from '@shared/schemas/shops'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'

type Row = {
  id: number
  legal_name: string
  trading_name: string
  contact_name: string
  contact_email: string
  contact_phone: string | null
  billing_address: Address
  shipping_address: Address
  tax_id: string | null
  tier_name: string | null
  payment_terms: PaymentTerms
  status: ShopStatus
  certificate_upload_id: number | null
  certificate_expires_on: string | null
}

const SELECT = `SELECT s.id, s.legal_name, s.trading_name, s.contact_name, s.contact_email, s.contact_phone,
       s.billing_address, s.shipping_address, s.tax_id, t.name AS tier_name, s.payment_terms, s.status,
       s.certificate_upload_id, s.certificate_expires_on
  FROM shops s LEFT JOIN price_tiers t ON t.id = s.tier_id`

function toSummary(r: Row): ShopSummary {
  return {
    id: r.id,
    legalName: r.legal_name,
    tradingName: r.trading_name,
    contactName: r.contact_name,
    contactEmail: r.contact_email,
    contactPhone: r.contact_phone,
    billingAddress: r.billing_address,
    shippingAddress: r.shipping_address,
    taxId: r.tax_id,
    tierName: r.tier_name,
    paymentTerms: r.payment_terms,
    status: r.status,
    certificateOnFile: r.certificate_upload_id != null,
    certificateExpiresOn: r.certificate_expires_on,
  }
}

export async function listShops(): Promise<ShopSummary[]> {
  const rows = await sequelize.query<Row>(`${SELECT} ORDER BY s.trading_name`, { type: QueryTypes.SELECT })
  return rows.map(toSummary)
}

export async function getShop(id: number): Promise<ShopSummary> {
  const rows = await sequelize.query<Row>(`${SELECT} WHERE s.id = $1`, { bind: [id], type: QueryTypes.SELECT })
  if (!rows[0]) throw AppError.notFound('That shop')
  return toSummary(rows[0])
}
