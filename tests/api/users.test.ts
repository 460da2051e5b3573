import { describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { updateSettings } from '@server/modules/settings/settings.service'
import { ApiClient, DEMO, clientAs } from '@tests/factories/api-client'
import { linkIn, waitForMail } from '@tests/factories/mail'

const app = createApp({ pruneSessions: false })

async function count(table: string) {
  const [rows] = await sequelize.query(`SELECT count(*)::int AS n FROM ${table}`)
  return (rows as { n: number }[])[0]!.n
}

describe('GET /api/users', () => {
  it('lists everyone for the owner', async () => {
    const owner = await clientAs(app, 'owner')
    const r = await owner.get('/api/users').expect(200)
    const emails = (r.body.items as { email: string }[]).map((u) => u.email)
    expect(emails).toEqual(expect.arrayContaining([DEMO.owner.email, DEMO.packer.email, DEMO.buyerA.email]))
    expect(r.body.items[0]).not.toHaveProperty('passwordHash')
  })

  it.each(['packer', 'buyerA'] as const)('refuses the %s (403) and the signed-out (401)', async (who) => {
    expect((await (await clientAs(app, who)).get('/api/users')).status).toBe(403)
    expect((await new ApiClient(app).get('/api/users')).status).toBe(401)
  })
})

describe('POST /api/users (invitation)', () => {
  it('invites a packer, whose link sets a password that signs in', async () => {
    const owner = await clientAs(app, 'owner')
    const r = await owner.post('/api/users', {
      email: 'New.Packer@Brindlewick.test',
      name: 'Ada Fenn',
      role: 'packer',
    })
    expect(r.status).toBe(201)
    expect(r.body.user).toMatchObject({
      email: 'new.packer@brindlewick.test',
      role: 'packer',
      invitationPending: true,
    })
    const mail = await waitForMail('new.packer@brindlewick.test', /invited/)
    const token = new URL(linkIn(mail, 'http://127.0.0.1:3999/set-password?token=')).searchParams.get(
      'token',
    )!
    const anon = new ApiClient(app)
    expect((await anon.get(`/api/auth/tokens/${token}`)).body).toMatchObject({
      purpose: 'invite',
      name: 'Ada Fenn',
    })
    expect(
      (await anon.post('/api/auth/set-password', { token, password: 'ada-packs-soap-2026' })).status,
    ).toBe(204)
    const user = await anon.login('new.packer@brindlewick.test', 'ada-packs-soap-2026')
    expect(user.role).toBe('packer')
  })

  it('an invited person cannot sign in before setting a password', async () => {
    const owner = await clientAs(app, 'owner')
    await owner.post('/api/users', { email: 'waiting@brindlewick.test', name: 'Wren Hale', role: 'owner' })
    const r = await new ApiClient(app).post('/api/auth/login', {
      email: 'waiting@brindlewick.test',
      password: '',
    })
    expect(r.status).toBe(400)
    const r2 = await new ApiClient(app).post('/api/auth/login', {
      email: 'waiting@brindlewick.test',
      password: 'anything-at-all',
    })
    expect(r2.status).toBe(401)
  })

  it('refuses bad input with every field at fault, and writes nothing', async () => {
    const owner = await clientAs(app, 'owner')
    const before = await count('users')
    const r = await owner.post('/api/users', { email: 'nope', name: '', role: 'boss' })
    expect(r.status).toBe(400)
    expect((r.body.error.details as { field: string }[]).map((d) => d.field).sort()).toEqual([
      'email',
      'name',
      'role',
    ])
    const buyer = await owner.post('/api/users', { email: 'b@shop.test', name: 'Bo', role: 'buyer' })
    expect(buyer.status).toBe(400)
    expect(buyer.body.error.details[0].field).toBe('shopId')
    const dup = await owner.post('/api/users', { email: DEMO.packer.email, name: 'Again', role: 'packer' })
    expect(dup.status).toBe(409)
    expect(dup.body.error.details[0].field).toBe('email')
    expect(await count('users')).toBe(before)
  })

  it('is owner-only', async () => {
    const packer = await clientAs(app, 'packer')
    expect((await packer.post('/api/users', { email: 'x@y.test', name: 'X', role: 'packer' })).status).toBe(
      403,
    )
  })
})

describe('PATCH /api/users/:id', () => {
  it('deactivating someone ends their live session at once', async () => {
    const owner = await clientAs(app, 'owner')
    const packer = await clientAs(app, 'packer')
    await packer.get('/api/auth/me').expect(200)
    const list = (await owner.get('/api/users')).body.items as { id: number; email: string }[]
    const id = list.find((u) => u.email === DEMO.packer.email)!.id
    const r = await owner.patch(`/api/users/${id}`, { active: false })
    expect(r.status).toBe(200)
    expect(r.body.user.active).toBe(false)
    expect((await packer.get('/api/auth/me')).status).toBe(401)
    expect((await new ApiClient(app).post('/api/auth/login', DEMO.packer)).status).toBe(401)
    await owner.patch(`/api/users/${id}`, { active: true }).then((x) => expect(x.status).toBe(200))
    await new ApiClient(app).login(DEMO.packer.email, DEMO.packer.password)
  })

  it('a new name shows in the person’s own session at once (the signed-in user is remembered, not stale)', async () => {
    const owner = await clientAs(app, 'owner')
    const packer = await clientAs(app, 'packer')
    const before = (await packer.get('/api/auth/me').expect(200)).body.user as { id: number; name: string }
    await owner
      .patch(`/api/users/${before.id}`, { name: 'Teo R. Renamed' })
      .then((x) => expect(x.status).toBe(200))
    expect((await packer.get('/api/auth/me').expect(200)).body.user.name).toBe('Teo R. Renamed')
    // A refused change leaves the remembered person as they were.
    expect((await owner.patch(`/api/users/${before.id}`, { name: '' })).status).toBe(400)
    expect((await packer.get('/api/auth/me').expect(200)).body.user.name).toBe('Teo R. Renamed')
    await owner
      .patch(`/api/users/${before.id}`, { name: before.name })
      .then((x) => expect(x.status).toBe(200))
    expect((await packer.get('/api/auth/me').expect(200)).body.user.name).toBe(before.name)
  })

  it('refuses deactivating oneself, unknown ids and bad ids', async () => {
    const owner = await clientAs(app, 'owner')
    const me = (await owner.get('/api/auth/me')).body.user as { id: number }
    const self = await owner.patch(`/api/users/${me.id}`, { active: false })
    expect(self.status).toBe(422)
    expect(self.body.error.details[0].field).toBe('active')
    expect((await owner.patch('/api/users/999999', { name: 'Who' })).status).toBe(404)
    const bad = await owner.patch('/api/users/abc', { active: 'yes' })
    expect(bad.status).toBe(400)
    expect((bad.body.error.details as { field: string }[]).map((d) => d.field).sort()).toEqual([
      'active',
      'params.id',
    ])
  })
})

describe('PUT /api/auth/password', () => {
  it('changes the password, keeps this session and ends the others', async () => {
    const here = await clientAs(app, 'buyerC')
    const elsewhere = await clientAs(app, 'buyerC')
    const wrong = await here.put('/api/auth/password', {
      currentPassword: 'not-it',
      newPassword: 'quiet-kettle-2027',
    })
    expect(wrong.status).toBe(400)
    expect(wrong.body.error.details[0].field).toBe('currentPassword')
    const r = await here.put('/api/auth/password', {
      currentPassword: DEMO.buyerC.password,
      newPassword: 'quiet-kettle-2027',
    })
    expect(r.status).toBe(204)
    expect((await here.get('/api/auth/me')).status).toBe(200)
    expect((await elsewhere.get('/api/auth/me')).status).toBe(401)
    expect((await new ApiClient(app).put('/api/auth/password', {})).status).toBe(401)
  })
})

describe('settings and the studio profile', () => {
  it('the owner edits the studio profile; everyone signed in reads it; others cannot edit', async () => {
    const owner = await clientAs(app, 'owner')
    const r = await owner.put('/api/settings/studio', {
      name: 'Brindlewick Soapery',
      legalName: 'Brindlewick Soapery LLC',
      email: 'orders@brindlewick.test',
      phone: '',
      address: ['14 Tannery Row', 'Millbrook, VT 05899'],
      taxId: '',
    })
    expect(r.status).toBe(200)
    const buyer = await clientAs(app, 'buyerA')
    expect((await buyer.get('/api/studio')).body.studio.email).toBe('orders@brindlewick.test')
    // Every role reads the studio's currency there (list tables give their amounts in it).
    expect((await buyer.get('/api/studio')).body.currency).toBe('USD')
    await updateSettings({ currency: 'CAD' })
    try {
      expect((await buyer.get('/api/studio')).body.currency).toBe('CAD')
      expect((await (await clientAs(app, 'packer')).get('/api/studio')).body.currency).toBe('CAD')
    } finally {
      await updateSettings({ currency: 'USD' })
    }
    expect((await buyer.get('/api/settings')).status).toBe(403)
    expect((await buyer.put('/api/settings/studio', {})).status).toBe(403)
    const bad = await owner.put('/api/settings/studio', {
      name: '',
      legalName: 'x',
      email: 'bad',
      phone: '',
      address: [],
      taxId: '',
    })
    expect(bad.status).toBe(400)
    expect((bad.body.error.details as { field: string }[]).map((d) => d.field).sort()).toEqual([
      'email',
      'name',
    ])
  })
})

describe('GET /api/shops/mine', () => {
  it("gives a buyer their own shop and nothing about tiers' margins", async () => {
    const buyer = await clientAs(app, 'buyerA')
    const r = await buyer.get('/api/shops/mine').expect(200)
    expect(r.body.shop.tradingName).toBe('Juniper & Vine')
    expect(JSON.stringify(r.body)).not.toMatch(/margin|cost/i)
    expect((await (await clientAs(app, 'packer')).get('/api/shops/mine')).status).toBe(403)
  })
})
