import bcrypt from 'bcryptjs'
import type { Migration } from '@server/db/migrator'
import { DEMO_PASSWORDS, DEMO_SHOPS, DEMO_STAFF, DEMO_STUDIO, DEMO_TIERS } from './demo/scenario'

const rounds = Number(process.env.BCRYPT_ROUNDS ?? 12)

// A one-page PDF standing in for a scanned resale certificate in the demo.
const DEMO_CERTIFICATE = Buffer.from(
  '%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[3 0 R]/Count 1>>endobj\n' +
    '3 0 obj<</Type/Page/Parent 2 0 R/MediaBox[0 0 612 792]>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n',
)

export const up: Migration = async ({ context: { sequelize } }) => {
  const q = (sql: string, bind: unknown[] = []) => sequelize.query(sql, { bind })
  await q(
    `INSERT INTO settings (key, value) VALUES ('studio', $1) ON CONFLICT (key) DO UPDATE SET value = EXCLUDED.value`,
    [JSON.stringify(DEMO_STUDIO)],
  )
  const tierIds = new Map<string, number>()
  for (const t of DEMO_TIERS) {
    const [rows] = await q(
      'INSERT INTO price_tiers (name, target_margin_pct, sort_order) VALUES ($1, $2, $3) RETURNING id',
      [t.name, t.targetMarginPct, t.sortOrder],
    )
    tierIds.set(t.name, (rows as { id: number }[])[0]!.id)
  }
  for (const s of DEMO_STAFF) {
    await q('INSERT INTO users (email, name, role, password_hash) VALUES ($1, $2, $3, $4)', [
      s.email,
      s.name,
      s.role,
      await bcrypt.hash(DEMO_PASSWORDS[s.role], rounds),
    ])
  }
  const { createHash } = await import('node:crypto')
  for (const s of DEMO_SHOPS) {
    let certId: number | null = null
    if (s.certificateExpiresOn) {
      const [rows] = await q(
        `INSERT INTO uploads (purpose, filename, content_type, size_bytes, sha256, data)
         VALUES ('resale_certificate', $1, 'application/pdf', $2, $3, $4) RETURNING id`,
        [
          `resale-certificate-${s.tradingName.toLowerCase().replace(/[^a-z0-9]+/g, '-')}.pdf`,
          DEMO_CERTIFICATE.length,
          createHash('sha256').update(DEMO_CERTIFICATE).digest('hex'),
          DEMO_CERTIFICATE,
        ],
      )
      certId = (rows as { id: number }[])[0]!.id
    }
    const [rows] = await q(
      `INSERT INTO shops (legal_name, trading_name, contact_name, contact_email, contact_phone, billing_address,
                          shipping_address, tax_id, certificate_upload_id, certificate_expires_on, tier_id, payment_terms,
                          status, opening_order_done, store_type, website)
       VALUES ($1, $2, $3, $4, $5, $6, $6, $7, $8, $9, $10, $11, 'active', true, $12, $13) RETURNING id`,
      [
        s.legalName,
        s.tradingName,
        s.contactName,
        s.contactEmail,
        s.contactPhone,
        JSON.stringify(s.address),
        s.taxId,
        certId,
        s.certificateExpiresOn,
        tierIds.get(s.tier),
        s.paymentTerms,
        s.storeType,
        s.website || null,
      ],
    )
    const shopId = (rows as { id: number }[])[0]!.id
    await q('INSERT INTO users (email, name, role, shop_id, password_hash) VALUES ($1, $2, $3, $4, $5)', [
      s.buyer.email,
      s.buyer.name,
      'buyer',
      shopId,
      await bcrypt.hash(DEMO_PASSWORDS.buyer, rounds),
    ])
  }
}
