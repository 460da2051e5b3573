import { z } from 'zod'

export const SHOP_STATUSES = ['applied', 'active', 'on_hold', 'closed', 'declined'] as const
export type ShopStatus = (typeof SHOP_STATUSES)[number]
export const SHOP_STATUS_LABELS: Record<ShopStatus, string> = {
  applied: 'Applied',
  active: 'Active',
  on_hold: 'On hold',
  closed: 'Closed',
  declined: 'Declined',
}

export const PAYMENT_TERMS = ['prepay', 'net_15', 'net_30'] as const
export type PaymentTerms = (typeof PAYMENT_TERMS)[number]
export const PAYMENT_TERMS_LABELS: Record<PaymentTerms, string> = {
  prepay: 'Prepay',
  net_15: 'Net 15',
  net_30: 'Net 30',
}

const line = (label: string, max = 120) =>
  z.string({ error: `Enter the ${label}.` }).trim().min(1, `Enter the ${label}.`).max(max, `At most ${max} characters.`)

export const AddressSchema = z.object({
  line1: line('street address'),
  line2: z.string().trim().max(120, 'At most 120 characters.').optional().default(''),
  city: line('city', 80),
  region: line('state or region', 80),
  postalCode: line('postal code', 20),
  country: z.string().trim().length(2, 'Use the two-letter country code.').toUpperCase().default('US'),
})
export type Address = z.infer<typeof AddressSchema>

export function formatAddress(a: Address): string[] {
  return [a.line1, a.line2, `${a.city}, ${a.region} ${a.postalCode}`, a.country].filter((s): s is string => !!s)
}

/** What a buyer sees of their own shop: no tier margin, nothing of other shops. */
export type ShopSummary = {
  id: number
  legalName: string
  tradingName: string
  contactName: string
  contactEmail: string
  contactPhone: string | null
  billingAddress: Address
  shippingAddress: Address
  taxId: string | null
  tierName: string | null
  paymentTerms: PaymentTerms
  status: ShopStatus
  certificateOnFile: boolean
  certificateExpiresOn: string | null
}
