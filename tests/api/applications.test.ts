import { createHash } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import { describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { DEMO_STAFF } from '../../seeders/demo/scenario'
import { ApiClient, clientAs } from '@tests/factories/api-client'
import {
  JPEG_HEAD,
  PNG_1PX,
  applicantFields,
  apply,
  certificatePdf,
  pdfWithCompressedScript,
} from '@tests/factories/applications'
import { allMail, waitForMail } from '@tests/factories/mail'

// Generous limits for this file's many applications; the throttle has its own app below.
const app = createApp({ pruneSessions: false, applicationLimits: { perHour: 1000, attemptsPerHour: 1000 } })
const anon = () => new ApiClient(app)

type StoredShop = {
  id: number
  status: string
  trading_name: string
  shipping_address: { line1: string }
  website: string | null
  tier_id: number | null
  filename: string
  content_type: string
  size_bytes: number
  sha256: string
  data: Buffer
  uploaded_by: number | null
}

async function storedShop(tradingName: string): Promise<StoredShop | undefined> {
  const [row] = await sequelize.query<StoredShop>(
    `SELECT s.id, s.status, s.trading_name, s.shipping_address, s.website, s.tier_id,
            u.filename, u.content_type, u.size_bytes, u.sha256, u.data, u.uploaded_by
       FROM shops s JOIN uploads u ON u.id = s.certificate_upload_id WHERE s.trading_name = $1`,
    { bind: [tradingName], type: QueryTypes.SELECT },
  )
  return row
}

async function counts() {
  const [row] = await sequelize.query<{ shops: number; uploads: number; users: number }>(
    `SELECT (SELECT count(*)::int FROM shops) AS shops, (SELECT count(*)::int FROM uploads) AS uploads,
            (SELECT count(*)::int FROM users) AS users`,
    { type: QueryTypes.SELECT },
  )
  return row!
}

const fieldsOf = (body: { error: { details?: { field: string }[] } }) =>
  (body.error.details ?? []).map((d) => d.field)

describe('POST /api/applications', () => {
  it('accepts a PDF certificate: the shop is applied and the file stored with its SHA-256', async () => {
    const f = applicantFields()
    const pdf = certificatePdf()
    const r = await apply(anon(), f, { data: pdf, filename: 'resale-cert.pdf' })
    expect(r.status).toBe(201)
    expect(r.body.application).toEqual({
      tradingName: f.tradingName,
      contactEmail: f.contactEmail,
      status: 'applied',
    })
    const s = await storedShop(f.tradingName)
    expect(s).toMatchObject({
      status: 'applied',
      tier_id: null,
      filename: 'resale-cert.pdf',
      content_type: 'application/pdf',
      size_bytes: pdf.length,
      uploaded_by: null,
      website: 'https://thistletallow.test',
    })
    expect(s!.sha256).toBe(createHash('sha256').update(pdf).digest('hex'))
    expect(Buffer.compare(s!.data, pdf)).toBe(0)
    // "Same as billing" copies the billing address.
    expect(s!.shipping_address.line1).toBe('31 Cooper Lane')
  })

  it('e-mails the owner and the applicant', async () => {
    const f = applicantFields()
    expect((await apply(anon(), f)).status).toBe(201)
    const owner = await waitForMail(
      DEMO_STAFF[0]!.email,
      new RegExp(`New wholesale application: ${f.tradingName}`),
    )
    expect(owner.text).toContain(f.contactEmail)
    expect(owner.text).toMatch(/http:\/\/127\.0\.0\.1:3999\/studio\/accounts\/\d+/)
    const applicant = await waitForMail(f.contactEmail, /We received your application/)
    expect(applicant.text).toContain(f.tradingName)
  })

  it('keeps a different shipping address', async () => {
    const f = applicantFields({
      shippingSameAsBilling: 'false',
      'shippingAddress[line1]': '8 Depot Street',
      'shippingAddress[city]': 'Ashgrove',
      'shippingAddress[region]': 'NH',
      'shippingAddress[postalCode]': '03102',
    })
    expect((await apply(anon(), f)).status).toBe(201)
    expect((await storedShop(f.tradingName))!.shipping_address.line1).toBe('8 Depot Street')
  })

  it('refuses a text file named cert.pdf (400 on the certificate field)', async () => {
    const f = applicantFields()
    const before = await counts()
    const r = await apply(anon(), f, {
      data: Buffer.from('just some text, not a certificate'),
      filename: 'cert.pdf',
    })
    expect(r.status).toBe(400)
    expect(r.body.error.code).toBe('invalid_input')
    expect(fieldsOf(r.body)).toEqual(['certificate'])
    expect(r.body.error.details[0].message).toMatch(/PDF, JPEG or PNG/)
    expect(await counts()).toEqual(before)
  })

  it('accepts a PNG named .pdf, stored as a PNG whatever the client said', async () => {
    const f = applicantFields()
    const r = await apply(anon(), f, { data: PNG_1PX, filename: 'cert.pdf', contentType: 'application/pdf' })
    expect(r.status).toBe(201)
    const s = await storedShop(f.tradingName)
    expect(s).toMatchObject({ content_type: 'image/png', filename: 'cert.png', size_bytes: PNG_1PX.length })
  })

  it('accepts a JPEG sent as application/octet-stream', async () => {
    const f = applicantFields()
    const r = await apply(anon(), f, {
      data: JPEG_HEAD,
      filename: 'scan.jpeg',
      contentType: 'application/octet-stream',
    })
    expect(r.status).toBe(201)
    expect(await storedShop(f.tradingName)).toMatchObject({
      content_type: 'image/jpeg',
      filename: 'scan.jpg',
    })
  })

  it('refuses 5 MB + 1 byte with 413, and takes exactly 5 MB', async () => {
    const before = await counts()
    const big = Buffer.concat([
      certificatePdf(),
      Buffer.alloc(5 * 1024 * 1024 + 1 - certificatePdf().length, 0x20),
    ])
    expect(big.length).toBe(5 * 1024 * 1024 + 1)
    const r = await apply(anon(), applicantFields(), { data: big, filename: 'big.pdf' })
    expect(r.status).toBe(413)
    expect(r.body.error.code).toBe('payload_too_large')
    expect(fieldsOf(r.body)).toEqual(['certificate'])
    expect(await counts()).toEqual(before)

    const f = applicantFields()
    const exact = big.subarray(0, 5 * 1024 * 1024)
    expect((await apply(anon(), f, { data: exact, filename: 'exact.pdf' })).status).toBe(201)
    expect((await storedShop(f.tradingName))!.size_bytes).toBe(5 * 1024 * 1024)
  })

  it('refuses an empty file with 400', async () => {
    const before = await counts()
    const r = await apply(anon(), applicantFields(), { data: Buffer.alloc(0), filename: 'empty.pdf' })
    expect(r.status).toBe(400)
    expect(fieldsOf(r.body)).toEqual(['certificate'])
    expect(r.body.error.details[0].message).toMatch(/empty/)
    expect(await counts()).toEqual(before)
  })

  it.each([
    [
      '/JavaScript in a plain object',
      certificatePdf('4 0 obj<</S/JavaScript/JS(app.alert\\(1\\))>>endobj\n'),
    ],
    ['/JS alone', certificatePdf('4 0 obj<</JS 5 0 R>>endobj\n')],
    ['/JS spelled with a #xx escape', certificatePdf('4 0 obj<</J#53 (x)>>endobj\n')],
    ['/JavaScript inside a compressed object stream', pdfWithCompressedScript()],
  ])('refuses a PDF with %s', async (_label, pdf) => {
    const before = await counts()
    const r = await apply(anon(), applicantFields(), { data: pdf, filename: 'cert.pdf' })
    expect(r.status).toBe(400)
    expect(fieldsOf(r.body)).toEqual(['certificate'])
    expect(r.body.error.details[0].message).toMatch(/JavaScript/)
    expect(await counts()).toEqual(before)
  })

  it('does not mistake /JSON or /JSX names for JavaScript', async () => {
    const f = applicantFields()
    const r = await apply(anon(), f, {
      data: certificatePdf('4 0 obj<</JSON 1/JSX 2>>endobj\n'),
      filename: 'cert.pdf',
    })
    expect(r.status).toBe(201)
  })

  it.each([
    ['../../etc/passwd.pdf', 'passwd.pdf'],
    ['C:\\Users\\wren\\Desktop\\cert.pdf', 'cert.pdf'],
    ['..\\..\\boot.ini.pdf', 'boot.ini.pdf'],
    ['...hidden.pdf', 'hidden.pdf'],
    ['certificat\u00e9 r\u00e9sale.pdf', 'certificat\u00e9 r\u00e9sale.pdf'],
  ])('sanitises the filename %j to %j', async (sent, kept) => {
    const f = applicantFields()
    const r = await apply(anon(), f, { data: certificatePdf(), filename: sent })
    expect(r.status).toBe(201)
    expect((await storedShop(f.tradingName))!.filename).toBe(kept)
  })

  it('strips control and direction characters from a name sent percent-encoded (RFC 2231)', async () => {
    const f = applicantFields()
    const sent = 're\u0000sale\u001b[31m\u0007 \u202egpj.pdf\n'
    const r = await apply(anon(), f, { data: certificatePdf(), filename: sent, encodedName: true })
    expect(r.status).toBe(201)
    expect((await storedShop(f.tradingName))!.filename).toBe('resale[31m gpj.pdf')
  })

  it('gives a sensible name when nothing of the name is left', async () => {
    const f = applicantFields()
    const r = await apply(anon(), f, {
      data: PNG_1PX,
      filename: '\u0007\u202e.pdf',
      contentType: 'image/png',
      encodedName: true,
    })
    expect(r.status).toBe(201)
    expect((await storedShop(f.tradingName))!.filename).toBe('resale-certificate.png')
  })

  it('answers a malformed multipart body (a NUL in a part header) with 400, not 500', async () => {
    const before = await counts()
    const r = await apply(anon(), applicantFields(), { data: certificatePdf(), filename: 'a\u0000b.pdf' })
    expect(r.status).toBe(400)
    expect(r.body.error.code).toBe('invalid_input')
    expect(await counts()).toEqual(before)
  })

  it('answers a filled honeypot with 201 as if accepted, and writes and sends nothing', async () => {
    const f = applicantFields({ company_fax: '555-0100' })
    const before = await counts()
    const mailBefore = (await allMail()).length
    const r = await apply(anon(), f)
    expect(r.status).toBe(201)
    expect(r.body.application).toEqual({
      tradingName: f.tradingName,
      contactEmail: f.contactEmail,
      status: 'applied',
    })
    expect(await counts()).toEqual(before)
    expect(await storedShop(f.tradingName)).toBeUndefined()
    await new Promise((res) => setTimeout(res, 300))
    expect((await allMail()).filter((m) => m.to.some((t) => t.address === f.contactEmail))).toEqual([])
    expect((await allMail()).length).toBeGreaterThanOrEqual(mailBefore)
  })

  it('answers missing fields with 400 naming each of them, the certificate too', async () => {
    const r = await apply(anon(), { legalName: 'Only a name' }, null)
    expect(r.status).toBe(400)
    expect(r.body.error.code).toBe('invalid_input')
    expect(fieldsOf(r.body).sort()).toEqual(
      [
        'billingAddress.city',
        'billingAddress.line1',
        'billingAddress.postalCode',
        'billingAddress.region',
        'certificate',
        'contactEmail',
        'contactName',
        'contactPhone',
        'storeType',
        'taxId',
        'tradingName',
      ].sort(),
    )
  })

  it('answers bad values with 400 naming the field', async () => {
    const r = await apply(
      anon(),
      applicantFields({
        contactEmail: 'not-an-address',
        contactPhone: '12',
        storeType: 'Spaceport',
        website: 'javascript:alert(1)',
        shippingSameAsBilling: 'false',
        'shippingAddress[line1]': '8 Depot Street',
      }),
    )
    expect(r.status).toBe(400)
    expect(fieldsOf(r.body).sort()).toEqual(
      [
        'contactEmail',
        'contactPhone',
        'shippingAddress.city',
        'shippingAddress.postalCode',
        'shippingAddress.region',
        'storeType',
        'website',
      ].sort(),
    )
  })

  it('answers a JSON body (no file) with 400 and the certificate among the fields', async () => {
    const f = applicantFields()
    const r = await anon().post('/api/applications', {
      ...f,
      billingAddress: { line1: 'x', city: 'y', region: 'z', postalCode: '1' },
    })
    expect(r.status).toBe(400)
    expect(fieldsOf(r.body)).toContain('certificate')
  })

  it('refuses a second file and a file under another field name', async () => {
    const before = await counts()
    const other = await apply(anon(), applicantFields(), {
      data: certificatePdf(),
      filename: 'a.pdf',
      field: 'attachment',
    })
    expect(other.status).toBe(400)
    expect(fieldsOf(other.body)).toEqual(['attachment'])
    const two = await apply(anon(), applicantFields(), undefined, {
      extraFiles: [{ data: certificatePdf(), filename: 'b.pdf' }],
    })
    expect(two.status).toBe(400)
    expect(fieldsOf(two.body)).toEqual(['certificate'])
    expect(await counts()).toEqual(before)
  })

  it('needs the CSRF token even though no one is signed in', async () => {
    const c = anon()
    await c.token()
    const r = await c.agent.post('/api/applications').field('legalName', 'x')
    expect(r.status).toBe(403)
    expect(r.body.error.code).toBe('csrf')
  })

  it('is open to anyone: a signed-in buyer may apply for another shop too', async () => {
    const c = await clientAs(app, 'buyerA')
    const f = applicantFields()
    expect((await apply(c, f)).status).toBe(201)
  })

  it('throttles an address after 5 applications in an hour with 429 in our error shape', async () => {
    const throttled = createApp({ pruneSessions: false })
    const statuses: number[] = []
    for (let i = 0; i < 6; i++)
      statuses.push((await apply(new ApiClient(throttled), applicantFields())).status)
    expect(statuses).toEqual([201, 201, 201, 201, 201, 429])
    const r = await apply(new ApiClient(throttled), applicantFields())
    expect(r.status).toBe(429)
    expect(r.body.error.code).toBe('too_many_requests')
    expect(r.body.error.message).toMatch(/Try again in an hour/)
  })

  it('counts refused attempts too (their own, wider limit; lowered to 3 here)', async () => {
    const throttled = createApp({ pruneSessions: false, applicationLimits: { attemptsPerHour: 3 } })
    const statuses: number[] = []
    for (let i = 0; i < 4; i++) {
      statuses.push(
        (
          await apply(new ApiClient(throttled), applicantFields(), {
            data: Buffer.from('x'),
            filename: 'x.pdf',
          })
        ).status,
      )
    }
    expect(statuses).toEqual([400, 400, 400, 429])
  })
})
