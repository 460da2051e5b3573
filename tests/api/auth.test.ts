import { describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { ApiClient, DEMO, clientAs } from '@tests/factories/api-client'
import { linkIn, waitForMail } from '@tests/factories/mail'

const app = createApp({ pruneSessions: false })

describe('GET /api/health', () => {
  it('reports the database up', async () => {
    const r = await new ApiClient(app).get('/api/health').expect(200)
    expect(r.body).toEqual({ ok: true, db: 'up' })
  })
})

describe('GET /api/auth/csrf', () => {
  it('gives a token and a session cookie that is HttpOnly and SameSite=Lax', async () => {
    const r = await new ApiClient(app).get('/api/auth/csrf').expect(200)
    expect(typeof r.body.csrfToken).toBe('string')
    const cookie = String(r.headers['set-cookie'])
    expect(cookie).toMatch(/lc\.sid=/)
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
  })
})

describe('POST /api/auth/login', () => {
  it.each([
    ['owner', DEMO.owner, 'owner', null],
    ['packer', DEMO.packer, 'packer', null],
    ['buyer', DEMO.buyerA, 'buyer', 'number'],
  ] as const)('signs in the %s', async (_l, who, role, shop) => {
    const c = new ApiClient(app)
    const r = await c.post('/api/auth/login', { email: who.email.toUpperCase(), password: who.password })
    expect(r.status).toBe(200)
    expect(r.body.user).toMatchObject({ email: who.email, role })
    expect(Object.keys(r.body.user).sort()).toEqual(['email', 'id', 'name', 'role', 'shopId'])
    expect(shop === null ? r.body.user.shopId === null : typeof r.body.user.shopId === 'number').toBe(true)
    const me = await c.get('/api/auth/me').expect(200)
    expect(me.body.user.id).toBe(r.body.user.id)
  })

  it('answers 401 to a wrong password and to an unknown address', async () => {
    const c = new ApiClient(app)
    const a = await c.post('/api/auth/login', { email: DEMO.owner.email, password: 'wrong-password' })
    expect(a.status).toBe(401)
    expect(a.body.error.code).toBe('invalid_credentials')
    const b = await c.post('/api/auth/login', { email: 'nobody@nowhere.test', password: 'whatever-it-is' })
    expect(b.status).toBe(401)
  })

  it('answers 400 with the fields at fault', async () => {
    const r = await new ApiClient(app).post('/api/auth/login', { email: 'not-an-email' })
    expect(r.status).toBe(400)
    expect(r.body.error.code).toBe('invalid_input')
    const fields = (r.body.error.details as { field: string }[]).map((d) => d.field).sort()
    expect(fields).toEqual(['email', 'password'])
  })

  it('changes the session id at sign-in', async () => {
    const c = new ApiClient(app)
    const before = String((await c.get('/api/auth/csrf')).headers['set-cookie']).match(/lc\.sid=([^;]+)/)?.[1]
    c.csrf = null
    const r = await c.post('/api/auth/login', DEMO.packer)
    const after = String(r.headers['set-cookie']).match(/lc\.sid=([^;]+)/)?.[1]
    expect(before).toBeTruthy()
    expect(after).toBeTruthy()
    expect(after).not.toBe(before)
  })

  it('throttles repeated failures with 429', async () => {
    const throttled = createApp({ pruneSessions: false })
    const c = new ApiClient(throttled)
    const statuses: number[] = []
    for (let i = 0; i < 10; i++) {
      statuses.push(
        (await c.post('/api/auth/login', { email: DEMO.buyerB.email, password: `guess-${i}` })).status,
      )
    }
    expect(statuses.slice(0, 8).every((s) => s === 401)).toBe(true)
    expect(statuses.at(-1)).toBe(429)
    const r = await c.post('/api/auth/login', DEMO.buyerB)
    expect(r.status).toBe(429)
    expect(r.body.error.code).toBe('too_many_requests')
  })
})

describe('CSRF', () => {
  it('refuses a write without the token or with a wrong one (403 csrf)', async () => {
    const c = new ApiClient(app)
    await c.token()
    const none = await c.agent.post('/api/auth/login').send(DEMO.owner)
    expect(none.status).toBe(403)
    expect(none.body.error.code).toBe('csrf')
    const wrong = await c.agent.post('/api/auth/login').set('X-CSRF-Token', 'nope').send(DEMO.owner)
    expect(wrong.status).toBe(403)
  })
})

describe('POST /api/auth/logout and GET /api/auth/me', () => {
  it('ends the session: me is 401 afterwards', async () => {
    const c = await clientAs(app, 'owner')
    await c.get('/api/auth/me').expect(200)
    const r = await c.post('/api/auth/logout')
    expect(r.status).toBe(204)
    const me = await c.get('/api/auth/me')
    expect(me.status).toBe(401)
    expect(me.body.error.code).toBe('unauthorized')
  })
})

describe('password reset by e-mail', () => {
  it('sends a single-use link that sets a new password', async () => {
    const c = new ApiClient(app)
    expect((await c.post('/api/auth/password-reset', { email: DEMO.buyerC.email })).status).toBe(204)
    const mail = await waitForMail(DEMO.buyerC.email, /Reset your/)
    const link = linkIn(mail, 'http://127.0.0.1:3999/set-password?token=')
    const token = new URL(link).searchParams.get('token')!
    const info = await c.get(`/api/auth/tokens/${token}`).expect(200)
    expect(info.body).toMatchObject({ purpose: 'reset', email: DEMO.buyerC.email })
    expect((await c.post('/api/auth/set-password', { token, password: 'a-brand-new-password' })).status).toBe(
      204,
    )
    const again = await c.post('/api/auth/set-password', { token, password: 'another-new-password' })
    expect(again.status).toBe(400)
    expect(again.body.error.details[0].field).toBe('token')
    await c.login(DEMO.buyerC.email, 'a-brand-new-password')
    const old = await new ApiClient(app).post('/api/auth/login', DEMO.buyerC)
    expect(old.status).toBe(401)
  })

  it('a link older than its hour no longer works', async () => {
    const c = new ApiClient(app)
    await c.post('/api/auth/password-reset', { email: DEMO.packer.email })
    const mail = await waitForMail(DEMO.packer.email, /Reset your/)
    const token = new URL(linkIn(mail, 'http://127.0.0.1:3999/set-password?token=')).searchParams.get('token')!
    await sequelize.query(
      "UPDATE auth_tokens SET expires_at = now() - interval '1 second' WHERE token_hash = encode(sha256($1::bytea), 'hex')",
      { bind: [token] },
    )
    expect((await c.get(`/api/auth/tokens/${token}`)).status).toBe(400)
    const r = await c.post('/api/auth/set-password', { token, password: 'too-late-for-this' })
    expect(r.status).toBe(400)
    expect(r.body.error.details[0].field).toBe('token')
    await c.login(DEMO.packer.email, DEMO.packer.password)
  })

  it('answers 204 for an unknown address too, and refuses a short password', async () => {
    const c = new ApiClient(app)
    expect((await c.post('/api/auth/password-reset', { email: 'nobody@nowhere.test' })).status).toBe(204)
    const r = await c.post('/api/auth/set-password', { token: 'x'.repeat(43), password: 'short' })
    expect(r.status).toBe(400)
    expect(r.body.error.details.map((d: { field: string }) => d.field)).toEqual(['password'])
  })
})

describe('bad requests', () => {
  it('malformed JSON → 400 invalid_input', async () => {
    const c = new ApiClient(app)
    const r = await c.agent
      .post('/api/auth/login')
      .set('X-CSRF-Token', await c.token())
      .set('Content-Type', 'application/json')
      .send('{"email": ')
    expect(r.status).toBe(400)
    expect(r.body.error.code).toBe('invalid_input')
  })

  it('a body over the limit → 413', async () => {
    const c = new ApiClient(app)
    const r = await c.post('/api/auth/login', { email: 'a@b.test', password: 'x'.repeat(300_000) })
    expect(r.status).toBe(413)
    expect(r.body.error.code).toBe('payload_too_large')
  })

  it('an unknown API route → 404 JSON', async () => {
    const r = await new ApiClient(app).get('/api/no-such-thing')
    expect(r.status).toBe(404)
    expect(r.headers['content-type']).toMatch(/json/)
    expect(r.body.error.code).toBe('not_found')
  })

  it('sends a content security policy of self only', async () => {
    const r = await new ApiClient(app).get('/api/health')
    expect(r.headers['content-security-policy']).toContain("default-src 'self'")
    expect(r.headers['content-security-policy']).toContain("script-src 'self'")
  })
})
