/**
 * Sessions and sign-in, attacked from outside: a session id planted before sign-in, a cookie
 * copied before sign-out and replayed after it, the CSRF token left out, wrong or taken from
 * another session on every write route of the route table, guessing passwords, a reset link
 * used twice at the same instant, and people switched off while signed in or holding a link.
 * (The plain cases are in tests/api/auth.test.ts and tests/api/users.test.ts.)
 */
import { QueryTypes } from 'sequelize'
import request from 'supertest'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { issueToken } from '@server/modules/auth/auth.service'
import { checkedCookieCount } from '@server/modules/auth/session-cache'
import { ApiClient, clientAs, DEMO } from '@tests/factories/api-client'
import { dbSnapshot } from './db-state'
import { fillPath, shopARecords } from './records'
import type { Records } from './records'
import { routeTable, WRITE_METHODS } from './route-table'

const app = createApp({ pruneSessions: false })

const sid = (r: { headers: Record<string, unknown> }) =>
  String(r.headers['set-cookie'] ?? '').match(/lc\.sid=([^;]+)/)?.[1] ?? null

/** A bare request carrying exactly this cookie. */
const withCookie = (value: string) => ({
  get: (url: string) => request(app).get(url).set('Cookie', `lc.sid=${value}`),
})

async function userId(email: string) {
  const [u] = await sequelize.query<{ id: number }>('SELECT id FROM users WHERE email = $1', {
    bind: [email],
    type: QueryTypes.SELECT,
  })
  return u!.id
}

let owner: ApiClient
let records: Records

beforeAll(async () => {
  owner = await clientAs(app, 'owner')
  records = await shopARecords(owner)
})

describe('session ids', () => {
  it('a session id planted before sign-in is not signed in afterwards', async () => {
    const victim = new ApiClient(app)
    const planted = sid(await victim.agent.get('/api/auth/csrf'))!
    await victim.token()
    const login = await victim.post('/api/auth/login', DEMO.buyerA)
    expect(login.status).toBe(200)
    const fresh = sid(login)
    expect(fresh).toBeTruthy()
    expect(fresh).not.toBe(planted)
    // The attacker who knew the planted id is still nobody.
    expect((await withCookie(planted).get('/api/auth/me')).status).toBe(401)
    expect((await withCookie(fresh!).get('/api/auth/me')).status).toBe(200)
  })

  it('signing in as someone else gives yet another id, and the first person’s id is gone', async () => {
    const c = await clientAs(app, 'buyerA')
    const before = sid(await c.post('/api/auth/login', DEMO.buyerA))!
    const after = await c.post('/api/auth/login', DEMO.buyerB)
    expect(after.status).toBe(200)
    const now = sid(after)!
    expect(now).not.toBe(before)
    expect((await withCookie(before).get('/api/auth/me')).status).toBe(401)
    const me = await withCookie(now).get('/api/auth/me')
    expect(me.body.user.email).toBe(DEMO.buyerB.email)
  })

  it('a cookie copied before sign-out is dead after it, and its row is gone', async () => {
    const c = new ApiClient(app)
    await c.token()
    const value = sid(await c.post('/api/auth/login', DEMO.packer))!
    expect((await withCookie(value).get('/api/auth/me')).status).toBe(200)
    expect((await c.post('/api/auth/logout')).status).toBe(204)
    expect((await withCookie(value).get('/api/auth/me')).status).toBe(401)
    // The store no longer has it (the cookie holds `s:<id>.<signature>`).
    const [gone] = await sequelize.query<{ n: number }>(
      `SELECT count(*)::int AS n FROM sessions WHERE sid = $1`,
      {
        bind: [decodeURIComponent(value).replace(/^s:/, '').split('.')[0]],
        type: QueryTypes.SELECT,
      },
    )
    expect(gone!.n).toBe(0)
  })

  it('the sign-in cookie is HttpOnly, SameSite=Lax, for the whole site, with an end date, and no Domain', async () => {
    const c = new ApiClient(app)
    await c.token()
    const r = await c.post('/api/auth/login', DEMO.owner)
    const cookie = String(r.headers['set-cookie'])
    expect(cookie).toMatch(/lc\.sid=/)
    expect(cookie).toMatch(/;\s*HttpOnly/i)
    expect(cookie).toMatch(/;\s*SameSite=Lax/i)
    expect(cookie).toMatch(/;\s*Path=\//i)
    expect(cookie).toMatch(/;\s*Expires=/i)
    expect(cookie).not.toMatch(/Domain=/i)
    // The session is never readable from the answers either.
    expect(JSON.stringify(r.body)).not.toContain(sid(r)!)
  })
})

describe('the catalogue’s shortcut through the session (a cookie checked before)', () => {
  /** Signs a buyer in and reads the catalogue twice with the cookie: the second read takes the shortcut. */
  async function remembered(who: 'buyerA' | 'buyerB' | 'buyerC') {
    const c = new ApiClient(app)
    await c.token()
    const value = sid(await c.post('/api/auth/login', DEMO[who]))!
    const first = await withCookie(value).get('/api/catalogue')
    const second = await withCookie(value).get('/api/catalogue')
    expect([first.status, second.status]).toEqual([200, 200])
    return { c, value, first, second }
  }

  it('answers a checked cookie exactly as the whole way does, with no new cookie', async () => {
    const { first, second } = await remembered('buyerA')
    expect(second.body).toEqual(first.body)
    expect(second.headers.etag).toBe(first.headers.etag)
    expect(second.headers['set-cookie']).toBeUndefined()
    expect(second.headers['cache-control']).toBe('no-store')
  })

  it('keeps one header per session: varying the other cookies replaces it rather than filling memory', async () => {
    const { value } = await remembered('buyerA')
    const before = checkedCookieCount()
    for (let i = 0; i < 20; i++) {
      const r = await request(app).get('/api/catalogue').set('Cookie', `lc.sid=${value}; filler=${i}`)
      expect(r.status).toBe(200)
    }
    expect(checkedCookieCount()).toBe(before)
  })

  it('a remembered cookie is dead on the catalogue once its person signs out', async () => {
    const { c, value } = await remembered('buyerB')
    expect((await c.post('/api/auth/logout')).status).toBe(204)
    expect((await withCookie(value).get('/api/catalogue')).status).toBe(401)
  })

  it('the remembered session’s id with another signature is nobody', async () => {
    const { value } = await remembered('buyerA')
    const [id, signature] = decodeURIComponent(value).replace(/^s:/, '').split('.')
    const forged = encodeURIComponent(`s:${id}.${signature!.slice(1)}x`)
    expect((await withCookie(forged).get('/api/catalogue')).status).toBe(401)
    expect((await withCookie(encodeURIComponent(`s:${id}`)).get('/api/catalogue')).status).toBe(401)
    expect((await withCookie(value).get('/api/catalogue')).status).toBe(200)
  })

  it('a remembered cookie stops working when its person is switched off, or sets a new password elsewhere', async () => {
    const id = await userId(DEMO.buyerC.email)
    const off = await remembered('buyerC')
    expect((await owner.patch(`/api/users/${id}`, { active: false })).status).toBe(200)
    try {
      expect((await withCookie(off.value).get('/api/catalogue')).status).toBe(401)
    } finally {
      expect((await owner.patch(`/api/users/${id}`, { active: true })).status).toBe(200)
    }
    expect((await withCookie(off.value).get('/api/catalogue')).status).toBe(401)

    const kept = await remembered('buyerC')
    const elsewhere = await clientAs(app, 'buyerC')
    const token = await issueToken(id, 'reset')
    const set = await elsewhere.post('/api/auth/set-password', { token, password: DEMO.buyerC.password })
    expect(set.status).toBe(204)
    expect((await withCookie(kept.value).get('/api/catalogue')).status).toBe(401)
    await new ApiClient(app).login(DEMO.buyerC.email, DEMO.buyerC.password)
  })
})

describe('CSRF on every write route', () => {
  it('refuses each write of the route table without the token, with a wrong one, or with another session’s (403 csrf), writing nothing', async () => {
    const other = new ApiClient(app)
    const othersToken = await other.token()
    const signedIn = await clientAs(app, 'owner')
    const own = await signedIn.token()
    const before = await dbSnapshot(sequelize)
    const problems: string[] = []
    let tried = 0
    const writes = routeTable(app).filter(
      (r) => WRITE_METHODS.has(r.method) && !r.path.startsWith('/api/webhooks/'),
    )
    for (const route of writes) {
      const url = fillPath(route.path, records)
      for (const [what, token] of [
        ['no token', null],
        ['a wrong token', own.slice(0, -2) + (own.endsWith('AA') ? 'BB' : 'AA')],
        ['another session’s token', othersToken],
        ['an empty token', ''],
      ] as const) {
        const m = route.method.toLowerCase() as 'post' | 'put' | 'patch' | 'delete'
        let req = signedIn.agent[m](url)
        if (token !== null) req = req.set('X-CSRF-Token', token)
        const r = await req.send({})
        tried++
        if (r.status !== 403 || r.body?.error?.code !== 'csrf')
          problems.push(`${route.key} with ${what}: ${r.status}`)
      }
    }
    expect(problems).toEqual([])
    expect(await dbSnapshot(sequelize)).toEqual(before)
    expect(tried).toBe(writes.length * 4)
    console.info(`csrf: ${tried} writes without a good token, all 403`)
  })
})

describe('guessing passwords', () => {
  it('throttles one address after its failures, while another person still signs in from the same place', async () => {
    const throttled = createApp({ pruneSessions: false })
    const c = new ApiClient(throttled)
    const statuses: number[] = []
    for (let i = 0; i < 10; i++)
      statuses.push(
        (await c.post('/api/auth/login', { email: DEMO.buyerC.email, password: `guess-${i}` })).status,
      )
    expect(statuses.filter((s) => s === 429).length).toBeGreaterThan(0)
    // Neither the right password nor a change of case gets past the throttle.
    const right = await c.post('/api/auth/login', {
      email: DEMO.buyerC.email.toUpperCase(),
      password: DEMO.buyerC.password,
    })
    expect(right.status).toBe(429)
    expect(right.body.error.code).toBe('too_many_requests')
    const otherPerson = await new ApiClient(throttled).post('/api/auth/login', DEMO.packer)
    expect(otherPerson.status).toBe(200)
  })

  it('answers a wrong password and an unknown address alike', async () => {
    const c = new ApiClient(app)
    const wrong = await c.post('/api/auth/login', { email: DEMO.owner.email, password: 'not-the-password' })
    const unknown = await c.post('/api/auth/login', {
      email: 'nobody@brindlewick.test',
      password: 'not-the-password',
    })
    expect([wrong.status, unknown.status]).toEqual([401, 401])
    expect(wrong.body).toEqual(unknown.body)
  })

  it('throttles reset requests for one address (429), still saying nothing about whether it exists', async () => {
    const throttled = createApp({ pruneSessions: false })
    const c = new ApiClient(throttled)
    const known: number[] = []
    const unknown: number[] = []
    for (let i = 0; i < 6; i++)
      known.push((await c.post('/api/auth/password-reset', { email: DEMO.buyerB.email })).status)
    for (let i = 0; i < 6; i++)
      unknown.push((await c.post('/api/auth/password-reset', { email: 'ghost@nowhere.test' })).status)
    expect(known).toEqual([204, 204, 204, 204, 204, 429])
    expect(unknown).toEqual(known)
  })
})

describe('reset links', () => {
  it('one link used from two tabs at the same instant sets the password once', async () => {
    const id = await userId(DEMO.buyerC.email)
    for (let round = 0; round < 3; round++) {
      const token = await issueToken(id, 'reset')
      const [a, b] = await Promise.all([
        new ApiClient(app).post('/api/auth/set-password', { token, password: `first-tab-password-${round}` }),
        new ApiClient(app).post('/api/auth/set-password', {
          token,
          password: `second-tab-password-${round}`,
        }),
      ])
      expect([a.status, b.status].sort()).toEqual([204, 400])
      const winner = a.status === 204 ? `first-tab-password-${round}` : `second-tab-password-${round}`
      const loser = a.status === 204 ? `second-tab-password-${round}` : `first-tab-password-${round}`
      expect(
        (await new ApiClient(app).post('/api/auth/login', { email: DEMO.buyerC.email, password: loser }))
          .status,
      ).toBe(401)
      await new ApiClient(app).login(DEMO.buyerC.email, winner)
    }
    // Put the demo password back for the rest of the file.
    await new ApiClient(app).post('/api/auth/set-password', {
      token: await issueToken(id, 'reset'),
      password: DEMO.buyerC.password,
    })
  })

  it('a link held by someone who is then switched off does not work, and neither does their sign-in', async () => {
    const id = await userId(DEMO.buyerC.email)
    const live = await clientAs(app, 'buyerC')
    const token = await issueToken(id, 'reset')
    expect((await owner.patch(`/api/users/${id}`, { active: false })).status).toBe(200)
    try {
      expect((await live.get('/api/auth/me')).status).toBe(401)
      expect((await live.get('/api/orders')).status).toBe(401)
      expect((await new ApiClient(app).get(`/api/auth/tokens/${token}`)).status).toBe(400)
      const set = await new ApiClient(app).post('/api/auth/set-password', {
        token,
        password: 'switched-off-password',
      })
      expect(set.status).toBe(400)
      expect((await new ApiClient(app).post('/api/auth/login', DEMO.buyerC)).status).toBe(401)
    } finally {
      expect((await owner.patch(`/api/users/${id}`, { active: true })).status).toBe(200)
    }
    // Switched on again, the old session stays ended; a new sign-in works.
    expect((await live.get('/api/auth/me')).status).toBe(401)
    await new ApiClient(app).login(DEMO.buyerC.email, DEMO.buyerC.password)
  })
})
