import { QueryTypes } from 'sequelize'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { isShopOrderable } from '@server/modules/shops/shops.service'
import { DEMO_SHOPS, DEMO_STAFF } from '../../seeders/demo/scenario'
import { ApiClient, DEMO, clientAs } from '@tests/factories/api-client'
import type { DemoCaller } from '@tests/factories/api-client'
import { PNG_1PX, applicantFields, apply, certificatePdf } from '@tests/factories/applications'
import { linkIn, waitForMail } from '@tests/factories/mail'

const app = createApp({ pruneSessions: false, applicationLimits: { perHour: 1000, attemptsPerHour: 1000 } })

let owner: ApiClient
const tiers = new Map<string, number>()
const demoShop = new Map<string, number>()

beforeAll(async () => {
  owner = await clientAs(app, 'owner')
  for (const t of await sequelize.query<{ id: number; name: string }>('SELECT id, name FROM price_tiers', {
    type: QueryTypes.SELECT,
  }))
    tiers.set(t.name, t.id)
  for (const s of await sequelize.query<{ id: number; trading_name: string }>(
    'SELECT id, trading_name FROM shops',
    {
      type: QueryTypes.SELECT,
    },
  ))
    demoShop.set(s.trading_name, s.id)
})

const tier = (name: string) => tiers.get(name)!
const juniper = () => demoShop.get(DEMO_SHOPS[0]!.tradingName)!
const harbor = () => demoShop.get(DEMO_SHOPS[1]!.tradingName)!
const fieldsOf = (body: { error: { details?: { field: string }[] } }) =>
  (body.error.details ?? []).map((d) => d.field)

/** A fresh application through the public form; returns the new shop's id and its details. */
async function newApplication(overrides: Record<string, string> = {}) {
  const f = applicantFields(overrides)
  const r = await apply(new ApiClient(app), f)
  expect(r.status).toBe(201)
  const [row] = await sequelize.query<{ id: number }>('SELECT id FROM shops WHERE trading_name = $1', {
    bind: [f.tradingName],
    type: QueryTypes.SELECT,
  })
  return { id: row!.id, ...f }
}

/** A fresh application approved on Standard, prepay. */
async function newAccount() {
  const a = await newApplication()
  const r = await owner.post(`/api/shops/${a.id}/approve`, {
    tierId: tier('Standard'),
    paymentTerms: 'prepay',
  })
  expect(r.status).toBe(200)
  return a
}

async function acceptInvitation(email: string, password: string) {
  const mail = await waitForMail(email, /You are invited/)
  const token = new URL(linkIn(mail, 'http://127.0.0.1:3999/set-password?token=')).searchParams.get('token')!
  const c = new ApiClient(app)
  const info = await c.get(`/api/auth/tokens/${token}`).expect(200)
  expect(info.body).toMatchObject({ purpose: 'invite', email })
  expect((await c.post('/api/auth/set-password', { token, password })).status).toBe(204)
  await c.login(email, password)
  return c
}

const count = async (sql: string, bind: unknown[] = []) =>
  (await sequelize.query<{ n: number }>(sql, { bind, type: QueryTypes.SELECT }))[0]!.n

describe('POST /api/shops/:id/approve', () => {
  it('opens the account and invites the applicant as its buyer, who sets a password and sees the shop', async () => {
    const a = await newApplication()
    const r = await owner.post(`/api/shops/${a.id}/approve`, {
      tierId: tier('Preferred'),
      paymentTerms: 'net_30',
      certificateExpiresOn: '2028-03-31',
    })
    expect(r.status).toBe(200)
    expect(r.body.shop).toMatchObject({
      id: a.id,
      status: 'active',
      tierName: 'Preferred',
      paymentTerms: 'net_30',
      certificateExpiresOn: '2028-03-31',
      certificateStatus: 'on_file',
      buyerCount: 1,
    })
    expect(r.body.buyer).toMatchObject({
      email: a.contactEmail,
      name: a.contactName,
      role: 'buyer',
      shopId: a.id,
      invitationPending: true,
    })
    expect(r.body.shop.events.map((e: { action: string }) => e.action)).toEqual([
      'shop.approved',
      'shop.applied',
    ])

    const buyer = await acceptInvitation(a.contactEmail, 'thistle-tallow-2026')
    const mine = await buyer.get('/api/shops/mine').expect(200)
    expect(mine.body.shop).toMatchObject({
      id: a.id,
      tradingName: a.tradingName,
      tierName: 'Preferred',
      paymentTerms: 'net_30',
      status: 'active',
      certificateOnFile: true,
    })
    // What a buyer sees has no owner-only fields.
    expect(mine.body.shop).not.toHaveProperty('notes')
    expect(mine.body.shop).not.toHaveProperty('buyers')
  })

  it('invites another person when the owner names one, and tells the applicant the account is open', async () => {
    const a = await newApplication()
    const buyerEmail = `orders.${a.id}@thistletallow.test`
    const r = await owner.post(`/api/shops/${a.id}/approve`, {
      tierId: tier('Distributor'),
      paymentTerms: 'net_15',
      buyerEmail: buyerEmail.toUpperCase(),
      buyerName: 'Ash Merriweather',
    })
    expect(r.status).toBe(200)
    expect(r.body.buyer).toMatchObject({ email: buyerEmail, name: 'Ash Merriweather' })
    await waitForMail(buyerEmail, /You are invited/)
    const opened = await waitForMail(a.contactEmail, /is open/)
    expect(opened.text).toContain('Ash Merriweather')
  })

  it('writes nothing when the buyer cannot be created (409 on buyerEmail): the application stays waiting', async () => {
    const a = await newApplication()
    const usersBefore = await count('SELECT count(*)::int AS n FROM users')
    const r = await owner.post(`/api/shops/${a.id}/approve`, {
      tierId: tier('Standard'),
      paymentTerms: 'prepay',
      buyerEmail: DEMO.buyerA.email,
    })
    expect(r.status).toBe(409)
    expect(r.body.error.code).toBe('email_taken')
    expect(fieldsOf(r.body)).toEqual(['buyerEmail'])
    expect(await count('SELECT count(*)::int AS n FROM users')).toBe(usersBefore)
    const detail = await owner.get(`/api/shops/${a.id}`).expect(200)
    expect(detail.body.shop).toMatchObject({ status: 'applied', tierId: null, paymentTerms: 'prepay' })
  })

  it('answers 400 with each field at fault', async () => {
    const a = await newApplication()
    const r = await owner.post(`/api/shops/${a.id}/approve`, {
      paymentTerms: 'net_90',
      certificateExpiresOn: '2027-02-30',
      buyerEmail: 'nope',
    })
    expect(r.status).toBe(400)
    expect(fieldsOf(r.body).sort()).toEqual(['buyerEmail', 'certificateExpiresOn', 'paymentTerms', 'tierId'])
    const unknownTier = await owner.post(`/api/shops/${a.id}/approve`, {
      tierId: 999_999,
      paymentTerms: 'prepay',
    })
    expect(unknownTier.status).toBe(400)
    expect(fieldsOf(unknownTier.body)).toEqual(['tierId'])
  })

  it('answers 409 for a shop that is not an application, 404 for none', async () => {
    const r = await owner.post(`/api/shops/${juniper()}/approve`, {
      tierId: tier('Standard'),
      paymentTerms: 'prepay',
    })
    expect(r.status).toBe(409)
    expect(r.body.error.code).toBe('invalid_status')
    const none = await owner.post('/api/shops/999999/approve', {
      tierId: tier('Standard'),
      paymentTerms: 'prepay',
    })
    expect(none.status).toBe(404)
  })
})

describe('POST /api/shops/:id/decline', () => {
  it('declines the application and e-mails the reason to the applicant', async () => {
    const a = await newApplication()
    const reason = 'We only stock shops within a day’s drive of the studio for now.'
    const r = await owner.post(`/api/shops/${a.id}/decline`, { reason })
    expect(r.status).toBe(200)
    expect(r.body.shop).toMatchObject({ status: 'declined', declineReason: reason, buyerCount: 0 })
    const mail = await waitForMail(a.contactEmail, /Your wholesale application/)
    expect(mail.text).toContain(reason)
    // A declined application cannot be approved afterwards by accident.
    const again = await owner.post(`/api/shops/${a.id}/approve`, {
      tierId: tier('Standard'),
      paymentTerms: 'prepay',
    })
    expect(again.status).toBe(409)
  })

  it('needs a reason (400) and an application (409)', async () => {
    const a = await newApplication()
    const r = await owner.post(`/api/shops/${a.id}/decline`, { reason: ' ' })
    expect(r.status).toBe(400)
    expect(fieldsOf(r.body)).toEqual(['reason'])
    const active = await owner.post(`/api/shops/${juniper()}/decline`, { reason: 'Not any more.' })
    expect(active.status).toBe(409)
  })
})

describe('hold, close and reactivate', () => {
  it('moves an account between active, on hold and closed; its buyer still signs in and sees it', async () => {
    const a = await newAccount()
    const buyer = await acceptInvitation(a.contactEmail, 'held-shop-password')
    expect(await isShopOrderable(a.id)).toBe(true)

    const held = await owner.post(`/api/shops/${a.id}/hold`)
    expect(held.status).toBe(200)
    expect(held.body.shop.status).toBe('on_hold')
    expect(await isShopOrderable(a.id)).toBe(false)
    expect((await buyer.get('/api/shops/mine').expect(200)).body.shop.status).toBe('on_hold')
    expect(
      (
        await new ApiClient(app).post('/api/auth/login', {
          email: a.contactEmail,
          password: 'held-shop-password',
        })
      ).status,
    ).toBe(200)

    expect((await owner.post(`/api/shops/${a.id}/hold`)).status).toBe(409)
    expect((await owner.post(`/api/shops/${a.id}/reactivate`)).body.shop.status).toBe('active')
    expect(await isShopOrderable(a.id)).toBe(true)

    const closed = await owner.post(`/api/shops/${a.id}/close`)
    expect(closed.body.shop.status).toBe('closed')
    expect(await isShopOrderable(a.id)).toBe(false)
    expect((await owner.post(`/api/shops/${a.id}/hold`)).status).toBe(409)
    expect((await owner.post(`/api/shops/${a.id}/close`)).status).toBe(409)
    expect((await owner.post(`/api/shops/${a.id}/reactivate`)).body.shop.status).toBe('active')

    const events = (await owner.get(`/api/shops/${a.id}`)).body.shop.events.map(
      (e: { action: string }) => e.action,
    )
    expect(events.slice(0, 5)).toEqual([
      'shop.reactivated',
      'shop.closed',
      'shop.reactivated',
      'shop.held',
      'shop.approved',
    ])
  })

  it('refuses to hold, close or reactivate an application (409)', async () => {
    const a = await newApplication()
    for (const move of ['hold', 'close', 'reactivate']) {
      const r = await owner.post(`/api/shops/${a.id}/${move}`)
      expect(r.status).toBe(409)
      expect(fieldsOf(r.body)).toEqual(['status'])
    }
  })
})

describe('isShopOrderable', () => {
  it('is true only for an active account', async () => {
    expect(await isShopOrderable(juniper())).toBe(true)
    const a = await newApplication()
    expect(await isShopOrderable(a.id)).toBe(false)
    await owner.post(`/api/shops/${a.id}/decline`, { reason: 'Outside our area.' })
    expect(await isShopOrderable(a.id)).toBe(false)
    expect(await isShopOrderable(999_999)).toBe(false)
  })

  it('reads inside the caller’s transaction, seeing its uncommitted change', async () => {
    const a = await newAccount()
    await sequelize
      .transaction(async (t) => {
        await sequelize.query(`UPDATE shops SET status = 'on_hold' WHERE id = $1`, {
          bind: [a.id],
          transaction: t,
        })
        expect(await isShopOrderable(a.id, t)).toBe(false)
        throw new Error('roll back')
      })
      .catch((e: Error) => expect(e.message).toBe('roll back'))
    expect(await isShopOrderable(a.id)).toBe(true)
  })
})

describe('GET /api/shops and GET /api/shops/:id', () => {
  it('lists every account with tier, terms, certificate, buyer count and status; applications first', async () => {
    const a = await newApplication()
    const r = await owner.get('/api/shops').expect(200)
    const items = r.body.items as {
      id: number
      status: string
      buyerCount: number
      certificateStatus: string
    }[]
    expect(items[0]!.status).toBe('applied')
    const j = items.find((s) => s.id === juniper())!
    expect(j).toMatchObject({
      tierName: 'Preferred',
      paymentTerms: 'net_30',
      status: 'active',
      buyerCount: 1,
      certificateOnFile: true,
    })
    expect(items.find((s) => s.id === harbor())).toMatchObject({
      certificateStatus: 'none',
      certificateOnFile: false,
    })
    expect(items.find((s) => s.id === a.id)).toMatchObject({
      status: 'applied',
      certificateStatus: 'on_file',
      buyerCount: 0,
    })
  })

  it('filters by status; a wrong status is 400', async () => {
    await newApplication()
    const applied = await owner.get('/api/shops?status=applied').expect(200)
    expect(applied.body.items.length).toBeGreaterThan(0)
    expect(applied.body.items.every((s: { status: string }) => s.status === 'applied')).toBe(true)
    const active = await owner.get('/api/shops?status=active').expect(200)
    expect(active.body.items.map((s: { id: number }) => s.id)).toContain(juniper())
    const bad = await owner.get('/api/shops?status=sleeping')
    expect(bad.status).toBe(400)
    expect(fieldsOf(bad.body)).toEqual(['query.status'])
  })

  it('shows one account with its buyers, certificate file and history; 404 for none, 400 for a bad id', async () => {
    const r = await owner.get(`/api/shops/${juniper()}`).expect(200)
    expect(r.body.shop).toMatchObject({ tradingName: 'Juniper & Vine', notes: null, declineReason: null })
    expect(r.body.shop.buyers).toEqual([
      expect.objectContaining({ email: DEMO.buyerA.email, active: true, invitationPending: false }),
    ])
    expect(r.body.shop.certificate).toMatchObject({
      contentType: 'application/pdf',
      filename: expect.stringMatching(/\.pdf$/),
    })
    expect(r.body.shop.certificate.sha256).toMatch(/^[0-9a-f]{64}$/)
    expect((await owner.get('/api/shops/999999')).status).toBe(404)
    const bad = await owner.get('/api/shops/abc')
    expect(bad.status).toBe(400)
    expect(fieldsOf(bad.body)).toEqual(['params.id'])
  })
})

describe('PATCH /api/shops/:id', () => {
  it('changes tier, terms, notes, expiry, addresses and contacts', async () => {
    const a = await newAccount()
    const r = await owner.patch(`/api/shops/${a.id}`, {
      tierId: tier('Distributor'),
      paymentTerms: 'net_15',
      notes: 'Pays on the 1st.',
      certificateExpiresOn: '2027-09-30',
      contactPhone: '(555) 010-9900',
      shippingAddress: {
        line1: '2 Loading Bay',
        city: 'Ashgrove',
        region: 'NH',
        postalCode: '03103',
        country: 'us',
      },
    })
    expect(r.status).toBe(200)
    expect(r.body.shop).toMatchObject({
      tierName: 'Distributor',
      paymentTerms: 'net_15',
      notes: 'Pays on the 1st.',
      certificateExpiresOn: '2027-09-30',
      contactPhone: '(555) 010-9900',
      shippingAddress: { line1: '2 Loading Bay', country: 'US' },
      billingAddress: { line1: '31 Cooper Lane' },
    })
    const cleared = await owner.patch(`/api/shops/${a.id}`, {
      notes: '',
      certificateExpiresOn: null,
      status: 'on_hold',
    })
    expect(cleared.body.shop).toMatchObject({ notes: null, certificateExpiresOn: null, status: 'on_hold' })
  })

  it('answers 400 with the fields at fault, and for an empty change', async () => {
    const a = await newAccount()
    const r = await owner.patch(`/api/shops/${a.id}`, {
      tierId: 'x',
      paymentTerms: 'net_60',
      status: 'applied',
      contactEmail: 'no',
      billingAddress: { line1: '' },
    })
    expect(r.status).toBe(400)
    expect(fieldsOf(r.body).sort()).toEqual(
      [
        'billingAddress.city',
        'billingAddress.line1',
        'billingAddress.postalCode',
        'billingAddress.region',
        'contactEmail',
        'paymentTerms',
        'status',
        'tierId',
      ].sort(),
    )
    const empty = await owner.patch(`/api/shops/${a.id}`, {})
    expect(empty.status).toBe(400)
    const unknownTier = await owner.patch(`/api/shops/${a.id}`, { tierId: 999_999 })
    expect(fieldsOf(unknownTier.body)).toEqual(['tierId'])
  })

  it('will not open an application through a status change (409)', async () => {
    const a = await newApplication()
    const r = await owner.patch(`/api/shops/${a.id}`, { status: 'active' })
    expect(r.status).toBe(409)
    expect(fieldsOf(r.body)).toEqual(['status'])
    // Other details of an application may be corrected.
    expect((await owner.patch(`/api/shops/${a.id}`, { taxId: 'NH-RS-CORRECTED' })).body.shop.taxId).toBe(
      'NH-RS-CORRECTED',
    )
  })
})

describe('POST /api/shops/:id/buyers', () => {
  it('invites another buyer for the shop', async () => {
    const a = await newAccount()
    const email = `second.${a.id}@thistletallow.test`
    const r = await owner.post(`/api/shops/${a.id}/buyers`, { name: 'Second Buyer', email })
    expect(r.status).toBe(201)
    expect(r.body.buyer).toMatchObject({ email, shopId: a.id, role: 'buyer' })
    const second = await acceptInvitation(email, 'second-buyer-password')
    expect((await second.get('/api/shops/mine').expect(200)).body.shop.id).toBe(a.id)
    expect((await owner.get(`/api/shops/${a.id}`)).body.shop.buyers).toHaveLength(2)
  })

  it('answers 400 for bad fields, 409 for a taken address or an application, 404 for no shop', async () => {
    const a = await newApplication()
    const bad = await owner.post(`/api/shops/${juniper()}/buyers`, { name: '', email: 'x' })
    expect(bad.status).toBe(400)
    expect(fieldsOf(bad.body).sort()).toEqual(['email', 'name'])
    const taken = await owner.post(`/api/shops/${juniper()}/buyers`, {
      name: 'Priya',
      email: DEMO.buyerB.email,
    })
    expect(taken.status).toBe(409)
    expect(fieldsOf(taken.body)).toEqual(['email'])
    const applied = await owner.post(`/api/shops/${a.id}/buyers`, {
      name: 'Early',
      email: `early.${a.id}@x.test`,
    })
    expect(applied.status).toBe(409)
    expect((await owner.post('/api/shops/999999/buyers', { name: 'N', email: 'n@x.test' })).status).toBe(404)
  })
})

describe('resale certificates', () => {
  it('serves the owner any shop’s certificate with safe headers', async () => {
    const r = await owner.get(`/api/shops/${juniper()}/certificate`).buffer(true).parse(binary)
    expect(r.status).toBe(200)
    expect(r.headers['content-type']).toBe('application/pdf')
    expect(r.headers['x-content-type-options']).toBe('nosniff')
    expect(r.headers['content-disposition']).toMatch(
      /^attachment; filename="resale-certificate-juniper-vine\.pdf"/,
    )
    expect((r.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-')
  })

  it('serves a buyer their own shop’s certificate, and another shop’s is 404', async () => {
    const buyerA = await clientAs(app, 'buyerA')
    const mine = await buyerA.get('/api/shops/mine/certificate').buffer(true).parse(binary)
    expect(mine.status).toBe(200)
    expect(mine.headers['content-disposition']).toMatch(/^attachment;/)
    expect((await buyerA.get(`/api/shops/${juniper()}/certificate`)).status).toBe(200)
    const buyerC = await clientAs(app, 'buyerC')
    const other = await buyerC.get(`/api/shops/${juniper()}/certificate`)
    expect(other.status).toBe(404)
    expect(other.body.error.code).toBe('not_found')
    // Harbor Lane has no certificate on file.
    expect((await (await clientAs(app, 'buyerB')).get('/api/shops/mine/certificate')).status).toBe(404)
    expect((await (await clientAs(app, 'packer')).get(`/api/shops/${juniper()}/certificate`)).status).toBe(
      403,
    )
    expect((await new ApiClient(app).get(`/api/shops/${juniper()}/certificate`)).status).toBe(401)
    expect((await new ApiClient(app).get('/api/shops/mine/certificate')).status).toBe(401)
  })

  it('lets the owner replace a certificate with its expiry; the old file stays on record', async () => {
    const a = await newAccount()
    const uploadsBefore = await count('SELECT count(*)::int AS n FROM uploads')
    const r = await apply(
      owner,
      { certificateExpiresOn: '2029-01-31' },
      { data: PNG_1PX, filename: 'renewed.png', contentType: 'image/png' },
      {
        method: 'put',
        url: `/api/shops/${a.id}/certificate`,
      },
    )
    expect(r.status).toBe(200)
    expect(r.body.shop).toMatchObject({
      certificateExpiresOn: '2029-01-31',
      certificateFilename: 'renewed.png',
    })
    expect(r.body.shop.certificate).toMatchObject({ contentType: 'image/png', sizeBytes: PNG_1PX.length })
    expect(await count('SELECT count(*)::int AS n FROM uploads')).toBe(uploadsBefore + 1)
    const file = await owner.get(`/api/shops/${a.id}/certificate`).buffer(true).parse(binary)
    expect(file.headers['content-type']).toBe('image/png')
    expect(Buffer.compare(file.body as Buffer, PNG_1PX)).toBe(0)
    expect(r.body.shop.events[0].action).toBe('shop.certificate_replaced')
  })

  it('refuses a bad replacement with 400 naming the fields', async () => {
    const r = await apply(
      owner,
      { certificateExpiresOn: 'soon' },
      { data: Buffer.from('hello'), filename: 'x.pdf' },
      {
        method: 'put',
        url: `/api/shops/${juniper()}/certificate`,
      },
    )
    expect(r.status).toBe(400)
    expect(fieldsOf(r.body).sort()).toEqual(['certificate', 'certificateExpiresOn'])
    const none = await owner.put(`/api/shops/${juniper()}/certificate`, {})
    expect(none.status).toBe(400)
    expect(fieldsOf(none.body)).toEqual(['certificate'])
  })

  it('lets a buyer upload a renewed certificate; the owners are told', async () => {
    const a = await newAccount()
    const buyer = await acceptInvitation(a.contactEmail, 'renewing-buyer-password')
    const pdf = certificatePdf('% renewed\n')
    const r = await apply(
      buyer,
      { certificateExpiresOn: '2028-12-31' },
      { data: pdf, filename: 'renewed 2028.pdf' },
      {
        method: 'put',
        url: '/api/shops/mine/certificate',
      },
    )
    expect(r.status).toBe(200)
    expect(r.body.shop).toMatchObject({
      id: a.id,
      certificateExpiresOn: '2028-12-31',
      certificateFilename: 'renewed 2028.pdf',
    })
    expect(r.body.shop).not.toHaveProperty('events')
    const mail = await waitForMail(
      DEMO_STAFF[0]!.email,
      new RegExp(`Renewed resale certificate from ${a.tradingName}`),
    )
    expect(mail.text).toContain(`/studio/accounts/${a.id}`)
    const back = await buyer.get('/api/shops/mine/certificate').buffer(true).parse(binary)
    expect(Buffer.compare(back.body as Buffer, pdf)).toBe(0)
    expect(back.headers['content-disposition']).toContain(`filename*=UTF-8''renewed%202028.pdf`)
    const bad = await apply(
      buyer,
      {},
      { data: Buffer.alloc(0), filename: 'x.pdf' },
      { method: 'put', url: '/api/shops/mine/certificate' },
    )
    expect(bad.status).toBe(400)
    expect(fieldsOf(bad.body)).toEqual(['certificate'])
  })
})

describe('who may do what', () => {
  const ownerRoutes: [string, string, unknown?][] = [
    ['get', '/api/shops'],
    ['get', '/api/shops/1'],
    ['patch', '/api/shops/1', { notes: 'x' }],
    ['post', '/api/shops/1/approve', { tierId: 1, paymentTerms: 'prepay' }],
    ['post', '/api/shops/1/decline', { reason: 'No thanks.' }],
    ['post', '/api/shops/1/hold'],
    ['post', '/api/shops/1/close'],
    ['post', '/api/shops/1/reactivate'],
    ['post', '/api/shops/1/buyers', { name: 'X', email: 'x@x.test' }],
    ['put', '/api/shops/1/certificate'],
  ]
  const callers: [DemoCaller | 'anon', number][] = [
    ['anon', 401],
    ['packer', 403],
    ['buyerA', 403],
  ]

  it.each(callers)('%s gets %i on every owner route', async (who, status) => {
    const c = await clientAs(app, who)
    for (const [method, url, body] of ownerRoutes) {
      const r =
        method === 'get'
          ? await c.get(url)
          : await (
              c[method as 'post' | 'put' | 'patch'] as (
                u: string,
                b?: unknown,
              ) => Promise<{ status: number; body: { error: { code: string } } }>
            )(url, body)
      expect({ method, url, status: r.status }).toEqual({ method, url, status })
    }
  })

  it.each([
    ['anon', 401],
    ['packer', 403],
    ['owner', 403],
  ] as const)('%s gets %i on the buyer’s own routes', async (who, status) => {
    const c = await clientAs(app, who)
    expect((await c.get('/api/shops/mine')).status).toBe(status)
    expect((await c.get('/api/shops/mine/certificate')).status).toBe(status)
    expect((await c.put('/api/shops/mine/certificate', {})).status).toBe(status)
  })
})

type Parser = Parameters<ReturnType<ApiClient['get']>['parse']>[0]

/** Collects a binary response body into a Buffer (supertest hands the raw response to a parser). */
const binary = ((res: NodeJS.ReadableStream, done: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = []
  res.on('data', (c: Buffer) => chunks.push(c))
  res.on('end', () => done(null, Buffer.concat(chunks)))
}) as unknown as Parser
