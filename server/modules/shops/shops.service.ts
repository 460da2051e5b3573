import { QueryTypes } from 'sequelize'
import type { InferAttributes, Transaction } from 'sequelize'
import { isoToday } from '@shared/domain/dates/dates'
import { certificateStatus } from '@shared/domain/shops/certificate'
import type {
  AccountStatus,
  Address,
  ApproveShopInput,
  CertificateFieldsInput,
  DeclineShopInput,
  InviteBuyerInput,
  PaymentTerms,
  ShopAccount,
  ShopStatus,
  ShopSummary,
  ShopUpdateInput,
} from '@shared/schemas/shops'
import { SHOP_STATUS_LABELS } from '@shared/schemas/shops'
import type { UserRow } from '@shared/schemas/users'
import { accountOpenedEmail, applicationDeclinedEmail, certificateRenewedEmail } from '@templates/email/shops'
import { env } from '@server/config/env'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { sendMail } from '@server/lib/mailer'
import type { OutgoingMail } from '@server/lib/mailer'
import { audit } from '@server/modules/audit/audit.service'
import { getSettings } from '@server/modules/settings/settings.service'
import type { CertificateUpload } from '@server/modules/shops/certificate-file'
import { storeCertificate } from '@server/modules/shops/certificate.service'
import { Shop } from '@server/modules/shops/shop.model'
import { inviteUser, listUsers } from '@server/modules/users/users.service'
import { invalidateCatalogue } from '@server/modules/catalogue/catalogue-cache'

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
  tier_id: number | null
  tier_name: string | null
  payment_terms: PaymentTerms
  status: ShopStatus
  certificate_upload_id: number | null
  certificate_expires_on: string | null
  certificate_filename: string | null
  store_type: string | null
  website: string | null
  opening_order_done: boolean
  buyer_count: number
  created_at: Date
}

const SELECT = `SELECT s.id, s.legal_name, s.trading_name, s.contact_name, s.contact_email, s.contact_phone,
       s.billing_address, s.shipping_address, s.tax_id, s.tier_id, t.name AS tier_name, s.payment_terms, s.status,
       s.certificate_upload_id, s.certificate_expires_on, u.filename AS certificate_filename,
       s.store_type, s.website, s.opening_order_done, s.created_at,
       (SELECT count(*)::int FROM users b WHERE b.shop_id = s.id AND b.active) AS buyer_count
  FROM shops s
  LEFT JOIN price_tiers t ON t.id = s.tier_id
  LEFT JOIN uploads u ON u.id = s.certificate_upload_id`

/** The studio's calendar date: certificates expire by the studio's clock. */
async function today() {
  return isoToday(new Date(), (await getSettings()).timeZone)
}

function toSummary(r: Row, on: string): ShopSummary {
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
    tierId: r.tier_id,
    storeType: r.store_type,
    website: r.website,
    openingOrderDone: r.opening_order_done,
    buyerCount: r.buyer_count,
    appliedAt: r.created_at.toISOString(),
    certificateStatus: certificateStatus(r.certificate_upload_id != null, r.certificate_expires_on, on),
    certificateFilename: r.certificate_filename,
  }
}

/** Every account, applications first; optionally of one status. */
export async function listShops(filter: { status?: ShopStatus } = {}): Promise<ShopSummary[]> {
  const rows = await sequelize.query<Row>(
    `${SELECT} WHERE ($1::text IS NULL OR s.status = $1)
      ORDER BY CASE s.status WHEN 'applied' THEN 0 ELSE 1 END, s.trading_name, s.id`,
    { bind: [filter.status ?? null], type: QueryTypes.SELECT },
  )
  const on = await today()
  return rows.map((r) => toSummary(r, on))
}

/** One shop as its buyer sees it (and as the owner's list shows it). */
export async function getShop(id: number): Promise<ShopSummary> {
  const rows = await sequelize.query<Row>(`${SELECT} WHERE s.id = $1`, {
    bind: [id],
    type: QueryTypes.SELECT,
  })
  if (!rows[0]) throw AppError.notFound('That shop')
  return toSummary(rows[0], await today())
}

/** The owner's full view: the summary with notes, buyers, the certificate file and the history. */
export async function getShopAccount(id: number): Promise<ShopAccount> {
  const summary = await getShop(id)
  const [extra] = await sequelize.query<{
    notes: string | null
    decline_reason: string | null
    updated_at: Date
    filename: string | null
    content_type: string | null
    size_bytes: number | null
    sha256: string | null
    uploaded_at: Date | null
  }>(
    `SELECT s.notes, s.decline_reason, s.updated_at, u.filename, u.content_type, u.size_bytes, u.sha256,
            u.created_at AS uploaded_at
       FROM shops s LEFT JOIN uploads u ON u.id = s.certificate_upload_id
      WHERE s.id = $1`,
    { bind: [id], type: QueryTypes.SELECT },
  )
  const buyers = (await listUsers({ shopId: id })).map((u) => ({
    id: u.id,
    name: u.name,
    email: u.email,
    active: u.active,
    invitationPending: u.invitationPending,
    lastLoginAt: u.lastLoginAt,
  }))
  const events = await sequelize.query<{
    action: string
    created_at: Date
    by_name: string | null
    data: unknown
  }>(
    `SELECT e.action, e.created_at, u.name AS by_name, e.data
       FROM audit_events e LEFT JOIN users u ON u.id = e.user_id
      WHERE e.entity = 'shop' AND e.entity_id = $1
      ORDER BY e.created_at DESC, e.id DESC
      LIMIT 50`,
    { bind: [id], type: QueryTypes.SELECT },
  )
  return {
    ...summary,
    notes: extra!.notes,
    declineReason: extra!.decline_reason,
    updatedAt: extra!.updated_at.toISOString(),
    buyers,
    certificate:
      extra!.filename && extra!.sha256
        ? {
            filename: extra!.filename,
            contentType: extra!.content_type ?? 'application/octet-stream',
            sizeBytes: extra!.size_bytes ?? 0,
            sha256: extra!.sha256,
            uploadedAt: extra!.uploaded_at!.toISOString(),
          }
        : null,
    events: events.map((e) => ({
      action: e.action,
      at: e.created_at.toISOString(),
      byName: e.by_name,
      note: noteOf(e.data),
    })),
  }
}

function noteOf(data: unknown): string | null {
  if (data && typeof data === 'object' && 'note' in data && typeof data.note === 'string') return data.note
  return null
}

/**
 * Whether the shop may place orders now: only an active account. Held, closed, declined and
 * not-yet-approved shops may not (their buyers can still sign in and look). Reads inside the
 * caller's transaction when one is given; takes no lock.
 */
export async function isShopOrderable(shopId: number, transaction?: Transaction): Promise<boolean> {
  const [row] = await sequelize.query<{ status: ShopStatus }>('SELECT status FROM shops WHERE id = $1', {
    bind: [shopId],
    type: QueryTypes.SELECT,
    transaction,
  })
  return row?.status === 'active'
}

async function lockShop(id: number, t: Transaction) {
  const shop = await Shop.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE })
  if (!shop) throw AppError.notFound('That shop')
  return shop
}

async function assertTier(tierId: number, t: Transaction) {
  const [tier] = await sequelize.query<{ id: number }>('SELECT id FROM price_tiers WHERE id = $1', {
    bind: [tierId],
    type: QueryTypes.SELECT,
    transaction: t,
  })
  if (!tier) throw AppError.field('tierId', 'Choose one of the price tiers.')
}

function wrongStatus(shop: Shop, doing: string) {
  const now = SHOP_STATUS_LABELS[shop.status as ShopStatus].toLowerCase()
  return AppError.conflict('invalid_status', `This account is ${now}: it cannot be ${doing}.`, [
    { field: 'status', message: `The account is ${now}.` },
  ])
}

/** Opens an account: tier and terms, status active, and its first buyer invited, all or nothing. */
export async function approveShop(
  id: number,
  input: ApproveShopInput,
  byUserId: number,
): Promise<{ shop: ShopAccount; buyer: UserRow }> {
  const { buyer, mail } = await sequelize
    .transaction(async (t) => {
      const shop = await lockShop(id, t)
      if (shop.status !== 'applied') throw wrongStatus(shop, 'approved')
      await assertTier(input.tierId, t)
      await shop.update(
        {
          status: 'active',
          tierId: input.tierId,
          paymentTerms: input.paymentTerms,
          certificateExpiresOn: input.certificateExpiresOn ?? shop.certificateExpiresOn,
          declineReason: null,
        },
        { transaction: t },
      )
      invalidateCatalogue(t)
      const email = input.buyerEmail ?? shop.contactEmail.toLowerCase()
      const name = input.buyerName ?? shop.contactName
      const buyer = await inviteUser({ email, name, role: 'buyer', shopId: id }, byUserId, { transaction: t })
      await audit(
        {
          userId: byUserId,
          action: 'shop.approved',
          entity: 'shop',
          entityId: id,
          data: { tierId: input.tierId, paymentTerms: input.paymentTerms, buyerId: buyer.id },
        },
        t,
      )
      let mail: OutgoingMail | null = null
      if (email !== shop.contactEmail.toLowerCase()) {
        const studioName = (await getSettings()).studio.name
        mail = {
          to: shop.contactEmail,
          ...accountOpenedEmail({
            studioName,
            contactName: shop.contactName,
            tradingName: shop.tradingName,
            buyerName: buyer.name,
            buyerEmail: buyer.email,
          }),
        }
      }
      return { buyer, mail }
    })
    .catch((err: unknown) => {
      // The buyer's address is this form's buyerEmail, not the invitation's email.
      if (err instanceof AppError && err.code === 'email_taken') {
        throw AppError.field(
          'buyerEmail',
          'Someone with this e-mail address already has an account.',
          409,
          'email_taken',
        )
      }
      throw err
    })
  if (mail) await sendMail(mail)
  return { shop: await getShopAccount(id), buyer }
}

export async function declineShop(
  id: number,
  input: DeclineShopInput,
  byUserId: number,
): Promise<ShopAccount> {
  const mail = await sequelize.transaction(async (t) => {
    const shop = await lockShop(id, t)
    if (shop.status !== 'applied') throw wrongStatus(shop, 'declined')
    await shop.update({ status: 'declined', declineReason: input.reason }, { transaction: t })
    await audit(
      {
        userId: byUserId,
        action: 'shop.declined',
        entity: 'shop',
        entityId: id,
        data: { note: input.reason },
      },
      t,
    )
    const studioName = (await getSettings()).studio.name
    return {
      to: shop.contactEmail,
      ...applicationDeclinedEmail({
        studioName,
        contactName: shop.contactName,
        tradingName: shop.tradingName,
        reason: input.reason,
      }),
    }
  })
  await sendMail(mail)
  return getShopAccount(id)
}

const MOVES = {
  hold: { from: ['active'], to: 'on_hold', doing: 'put on hold', action: 'shop.held' },
  close: { from: ['active', 'on_hold'], to: 'closed', doing: 'closed', action: 'shop.closed' },
  reactivate: { from: ['on_hold', 'closed'], to: 'active', doing: 'reactivated', action: 'shop.reactivated' },
} as const satisfies Record<string, { from: ShopStatus[]; to: AccountStatus; doing: string; action: string }>
export type StatusMove = keyof typeof MOVES

/** Hold, close or reactivate an open account. Buyers keep signing in; only ordering stops. */
export async function moveShop(id: number, move: StatusMove, byUserId: number): Promise<ShopAccount> {
  const m = MOVES[move]
  await sequelize.transaction(async (t) => {
    const shop = await lockShop(id, t)
    const from = shop.status
    if (!(m.from as readonly ShopStatus[]).includes(from as ShopStatus)) throw wrongStatus(shop, m.doing)
    await shop.update({ status: m.to }, { transaction: t })
    await audit({ userId: byUserId, action: m.action, entity: 'shop', entityId: id, data: { from } }, t)
  })
  return getShopAccount(id)
}

const OPEN: readonly ShopStatus[] = ['active', 'on_hold', 'closed']

export async function updateShop(id: number, patch: ShopUpdateInput, byUserId: number): Promise<ShopAccount> {
  await sequelize.transaction(async (t) => {
    const shop = await lockShop(id, t)
    if (
      patch.status !== undefined &&
      patch.status !== shop.status &&
      !OPEN.includes(shop.status as ShopStatus)
    ) {
      throw AppError.conflict(
        'invalid_status',
        `This is an application (${SHOP_STATUS_LABELS[shop.status as ShopStatus].toLowerCase()}): approve or decline it instead.`,
        [{ field: 'status', message: 'Approve or decline the application instead.' }],
      )
    }
    if (patch.tierId !== undefined) await assertTier(patch.tierId, t)
    const changes = Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined))
    await shop.update(changes as Partial<InferAttributes<Shop>>, { transaction: t })
    if (patch.tierId !== undefined) invalidateCatalogue(t)
    await audit(
      {
        userId: byUserId,
        action: 'shop.updated',
        entity: 'shop',
        entityId: id,
        data: { fields: Object.keys(changes) },
      },
      t,
    )
  })
  return getShopAccount(id)
}

/** Another buyer for an open account; they get the invitation e-mail. */
export async function inviteBuyer(id: number, input: InviteBuyerInput, byUserId: number): Promise<UserRow> {
  const shop = await Shop.findByPk(id)
  if (!shop) throw AppError.notFound('That shop')
  if (!OPEN.includes(shop.status as ShopStatus)) {
    throw AppError.conflict('invalid_status', 'Approve the application before inviting buyers.', [
      { field: 'status', message: 'The account is not open yet.' },
    ])
  }
  const buyer = await inviteUser({ ...input, role: 'buyer', shopId: id }, byUserId)
  await audit({
    userId: byUserId,
    action: 'shop.buyer_invited',
    entity: 'shop',
    entityId: id,
    data: { note: buyer.email },
  })
  return buyer
}

/**
 * A new certificate file replaces the one on file (the old upload stays in `uploads`: a
 * certificate covered the sales made while it was valid). The expiry date is the new file's.
 */
export async function replaceCertificate(
  id: number,
  file: CertificateUpload,
  fields: CertificateFieldsInput,
  by: { id: number; name: string; role: 'owner' | 'buyer' },
): Promise<void> {
  const shop = await sequelize.transaction(async (t) => {
    const shop = await lockShop(id, t)
    const previous = shop.certificateUploadId
    const uploadId = await storeCertificate(file, by.id, t)
    await shop.update(
      { certificateUploadId: uploadId, certificateExpiresOn: fields.certificateExpiresOn ?? null },
      { transaction: t },
    )
    await audit(
      {
        userId: by.id,
        action: 'shop.certificate_replaced',
        entity: 'shop',
        entityId: id,
        data: { uploadId, previousUploadId: previous, note: file.filename },
      },
      t,
    )
    return shop
  })
  if (by.role === 'buyer') {
    const settings = await getSettings()
    const owners = await ownerAddresses()
    if (owners.length > 0) {
      await sendMail({
        to: owners,
        ...certificateRenewedEmail({
          studioName: settings.studio.name,
          tradingName: shop.tradingName,
          buyerName: by.name,
          expiresOn: fields.certificateExpiresOn ?? null,
          link: `${env.APP_URL}/studio/accounts/${id}`,
        }),
      })
    }
  }
}

/** The active owners' e-mail addresses. */
export async function ownerAddresses(transaction?: Transaction): Promise<string[]> {
  const rows = await sequelize.query<{ email: string }>(
    `SELECT email FROM users WHERE role = 'owner' AND active ORDER BY id`,
    { type: QueryTypes.SELECT, transaction },
  )
  return rows.map((r) => r.email)
}
