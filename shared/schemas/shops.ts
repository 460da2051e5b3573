import { z } from 'zod'
import { recordId } from '@shared/schemas/record-id'
import { isValidIsoDate } from '@shared/domain/dates/dates'

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
  z
    .string({ error: `Enter the ${label}.` })
    .trim()
    .min(1, `Enter the ${label}.`)
    .max(max, `At most ${max} characters.`)

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
  return [a.line1, a.line2, `${a.city}, ${a.region} ${a.postalCode}`, a.country].filter(
    (s): s is string => !!s,
  )
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
  /** Added with the accounts pages; none of it is private to the studio. */
  tierId: number | null
  storeType: string | null
  website: string | null
  openingOrderDone: boolean
  /** Active buyers who may sign in for the shop. */
  buyerCount: number
  /** When the application came in (ISO timestamp). */
  appliedAt: string
  certificateStatus: CertificateStatus
  certificateFilename: string | null
}

// ---------------------------------------------------------------------------------------------
// Wholesale applications and the owner's shop accounts
// ---------------------------------------------------------------------------------------------

/** The kinds of store a wholesale account may be; the application form offers these. */
export const STORE_TYPES = [
  'Gift shop',
  'General store',
  'Bath and body shop',
  'Spa or salon',
  'Grocery or co-op',
  'Boutique',
  'Market stall',
  'Online shop',
  'Distributor',
  'Other',
] as const
export type StoreType = (typeof STORE_TYPES)[number]

/** The resale certificate: one file, PDF, JPEG or PNG, at most 5 MB (the server sniffs the bytes). */
export const CERTIFICATE_MAX_BYTES = 5 * 1024 * 1024
export const CERTIFICATE_CONTENT_TYPES = ['application/pdf', 'image/jpeg', 'image/png'] as const
export type CertificateContentType = (typeof CERTIFICATE_CONTENT_TYPES)[number]
/** For a file input's `accept`; only a hint to the browser's picker. */
export const CERTIFICATE_ACCEPT = '.pdf,.jpg,.jpeg,.png,application/pdf,image/jpeg,image/png'
/** The multipart field that carries the file. */
export const CERTIFICATE_FIELD = 'certificate'
/** The application form's trap for robots: people never see it, so it must stay empty. */
export const HONEYPOT_FIELD = 'company_fax'

const text = (label: string, max: number) =>
  z
    .string({ error: `Enter the ${label}.` })
    .trim()
    .min(1, `Enter the ${label}.`)
    .max(max, `At most ${max} characters.`)

const PhoneSchema = z
  .string({ error: 'Enter a phone number.' })
  .trim()
  .min(1, 'Enter a phone number.')
  .max(30, 'At most 30 characters.')
  .refine((v) => /^[0-9+().\-\s/x]+$/i.test(v) && (v.match(/\d/g)?.length ?? 0) >= 7, {
    message: 'Enter a phone number with at least 7 digits.',
  })

const ContactEmailSchema = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .toLowerCase()
  .min(1, 'Enter an e-mail address.')
  .max(254, 'An e-mail address has at most 254 characters.')
  .pipe(z.email({ error: 'Enter a valid e-mail address.' }))

/** Optional e-mail: '' means "not given". */
const OptionalEmailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .max(254, 'An e-mail address has at most 254 characters.')
  .refine((v) => v === '' || z.email().safeParse(v).success, { message: 'Enter a valid e-mail address.' })
  .optional()
  .transform((v) => (v ? v : undefined))

/** A shop's website: optional; "shop.example" is read as https://shop.example. */
const WebsiteSchema = z
  .string()
  .trim()
  .max(200, 'At most 200 characters.')
  .optional()
  .transform((v) => (v ? (/^[a-z][a-z0-9+.-]*:/i.test(v) ? v : `https://${v}`) : null))
  .refine(
    (v) => {
      if (v === null) return true
      try {
        const u = new URL(v)
        return (u.protocol === 'https:' || u.protocol === 'http:') && u.hostname.includes('.')
      } catch {
        return false
      }
    },
    { message: 'Enter a web address such as https://yourshop.example, or leave it empty.' },
  )

/** An optional calendar date ('' or null: none). */
const OptionalDateSchema = z
  .string()
  .trim()
  .nullish()
  .transform((v) => (v ? v : null))
  .refine((v) => v === null || isValidIsoDate(v), { message: 'Enter a date as YYYY-MM-DD.' })

/** A checkbox as a JSON boolean or as multipart text ('true', 'on', '1'). */
const CheckboxSchema = z
  .union([z.boolean(), z.string()], { error: 'Tick or untick the box.' })
  .transform((v) => v === true || v === 'true' || v === 'on' || v === '1')

const TierIdSchema = z.coerce
  .number<string | number>({ error: 'Choose a price tier.' })
  .int('Choose a price tier.')
  .positive('Choose a price tier.')

const PaymentTermsSchema = z.enum(PAYMENT_TERMS, { error: 'Choose the payment terms.' })

/**
 * The public wholesale application (multipart text fields; the certificate file travels beside
 * them in the `certificate` field). With `shippingSameAsBilling` ticked the shipping address is
 * the billing address and whatever was typed into the hidden shipping fields is ignored.
 */
const truthy = (v: unknown) => v === true || v === 'true' || v === 'on' || v === '1'
const shipsToBilling = (v: { shippingSameAsBilling?: unknown; shippingAddress?: unknown }) =>
  v.shippingSameAsBilling === undefined ? v.shippingAddress === undefined : truthy(v.shippingSameAsBilling)

export const ApplicationSchema = z
  .object({
    legalName: text('legal business name', 160),
    tradingName: text('shop name', 160),
    contactName: text('contact name', 120),
    contactEmail: ContactEmailSchema,
    contactPhone: PhoneSchema,
    // A missing address is reported line by line, like an incomplete one.
    billingAddress: z.preprocess((v) => v ?? {}, AddressSchema),
    shippingSameAsBilling: CheckboxSchema.optional(),
    // Checked below, and only when the shipping address differs from the billing one.
    shippingAddress: z.unknown().optional(),
    taxId: text('resale or tax number', 40),
    storeType: z.enum(STORE_TYPES, { error: 'Choose the kind of store.' }),
    website: WebsiteSchema,
    [HONEYPOT_FIELD]: z.string().max(0, 'Leave this field empty.').optional(),
  })
  // Runs even when other fields failed, so every problem is reported at once.
  .superRefine(
    (v, ctx) => {
      if (shipsToBilling(v)) return
      const r = AddressSchema.safeParse(v.shippingAddress ?? {})
      if (r.success) return
      for (const i of r.error.issues)
        ctx.addIssue({ code: 'custom', path: ['shippingAddress', ...i.path.map(String)], message: i.message })
    },
    { when: (payload) => typeof payload.value === 'object' && payload.value !== null },
  )
  .transform((v) => {
    const same = shipsToBilling(v)
    return {
      legalName: v.legalName,
      tradingName: v.tradingName,
      contactName: v.contactName,
      contactEmail: v.contactEmail,
      contactPhone: v.contactPhone,
      billingAddress: v.billingAddress,
      shippingAddress: same ? v.billingAddress : AddressSchema.parse(v.shippingAddress),
      shippingSameAsBilling: same,
      taxId: v.taxId,
      storeType: v.storeType,
      website: v.website,
    }
  })
export type ApplicationInput = z.output<typeof ApplicationSchema>

/** What the applicant is told; a robot caught by the honeypot is told exactly the same. */
export type ApplicationReceipt = { tradingName: string; contactEmail: string; status: 'applied' }

/** Approving an application: tier and terms; the first buyer defaults to the applicant's contact. */
export const ApproveShopSchema = z.object({
  tierId: TierIdSchema,
  paymentTerms: PaymentTermsSchema,
  certificateExpiresOn: OptionalDateSchema.optional(),
  buyerEmail: OptionalEmailSchema,
  buyerName: z
    .string()
    .trim()
    .max(120, 'At most 120 characters.')
    .optional()
    .transform((v) => (v ? v : undefined)),
})
export type ApproveShopInput = z.output<typeof ApproveShopSchema>

export const DeclineShopSchema = z.object({
  reason: z
    .string({ error: 'Say why, in a sentence the applicant will read.' })
    .trim()
    .min(3, 'Say why, in a sentence the applicant will read.')
    .max(1000, 'At most 1000 characters.'),
})
export type DeclineShopInput = z.output<typeof DeclineShopSchema>

/** The states the owner can set on an open account (applications are approved or declined instead). */
export const ACCOUNT_STATUSES = ['active', 'on_hold', 'closed'] as const
export type AccountStatus = (typeof ACCOUNT_STATUSES)[number]

/** Editing an account; every field is optional, at least one must be sent. */
export const ShopUpdateSchema = z
  .object({
    tierId: TierIdSchema.optional(),
    paymentTerms: PaymentTermsSchema.optional(),
    status: z.enum(ACCOUNT_STATUSES, { error: 'Choose active, on hold or closed.' }).optional(),
    notes: z
      .string()
      .trim()
      .max(2000, 'At most 2000 characters.')
      .nullish()
      .transform((v) => (v === undefined ? undefined : v ? v : null)),
    certificateExpiresOn: OptionalDateSchema.optional(),
    legalName: text('legal business name', 160).optional(),
    tradingName: text('shop name', 160).optional(),
    contactName: text('contact name', 120).optional(),
    contactEmail: ContactEmailSchema.optional(),
    contactPhone: PhoneSchema.optional(),
    billingAddress: AddressSchema.optional(),
    shippingAddress: AddressSchema.optional(),
    taxId: text('resale or tax number', 40).optional(),
    storeType: z.enum(STORE_TYPES, { error: 'Choose the kind of store.' }).optional(),
    website: WebsiteSchema.optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), {
    path: ['(body)'],
    message: 'Send at least one field to change.',
  })
export type ShopUpdateInput = z.output<typeof ShopUpdateSchema>

export const InviteBuyerSchema = z.object({
  name: text('name', 120),
  email: ContactEmailSchema,
})
export type InviteBuyerInput = z.output<typeof InviteBuyerSchema>

/** The text fields beside a replaced or renewed certificate. */
export const CertificateFieldsSchema = z.object({ certificateExpiresOn: OptionalDateSchema.optional() })
export type CertificateFieldsInput = z.output<typeof CertificateFieldsSchema>

export const ShopIdParamsSchema = z.object({ id: recordId('Not a shop.') })
export const ShopListQuerySchema = z.object({
  status: z.enum(SHOP_STATUSES, { error: `Use one of: ${SHOP_STATUSES.join(', ')}.` }).optional(),
})

/** none: no file; on_file: valid (or no expiry known); expiring: within 30 days; expired. */
export const CERTIFICATE_STATUSES = ['none', 'on_file', 'expiring', 'expired'] as const
export type CertificateStatus = (typeof CERTIFICATE_STATUSES)[number]
export const CERTIFICATE_STATUS_LABELS: Record<CertificateStatus, string> = {
  none: 'None',
  on_file: 'On file',
  expiring: 'Expires soon',
  expired: 'Expired',
}

export type ShopBuyer = {
  id: number
  name: string
  email: string
  active: boolean
  invitationPending: boolean
  lastLoginAt: string | null
}

export type CertificateFile = {
  filename: string
  contentType: string
  sizeBytes: number
  sha256: string
  uploadedAt: string
}

export type ShopEvent = { action: string; at: string; byName: string | null; note: string | null }

/** The owner's full view of one account. */
export type ShopAccount = ShopSummary & {
  notes: string | null
  declineReason: string | null
  updatedAt: string
  buyers: ShopBuyer[]
  certificate: CertificateFile | null
  events: ShopEvent[]
}
