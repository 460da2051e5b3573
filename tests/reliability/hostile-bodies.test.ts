/**
 * Every write route of the route table, sent random and hostile bodies (fast-check) by a caller
 * the access matrix lets through: never a 500; every refusal is a 4xx in the contract's error
 * shape; and a refused request leaves the database exactly as it was (row counts of every table,
 * the ledger's and batch_stock's sums, payments and lot balances).
 */
import { randomUUID } from 'node:crypto'
import fc from 'fast-check'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { drainMail } from '@server/modules/invoices/mail-queue'
import { ApiClient, clientAs } from '@tests/factories/api-client'
import type { DemoCaller } from '@tests/factories/api-client'
import { ACCESS_MATRIX } from './access-matrix'
import type { Caller } from './access-matrix'
import { dbSnapshot, ledgerProblems } from './db-state'
import { hostileBody, hostileString, RAW_BODIES } from './hostile'
import { fillPath, shopARecords } from './records'
import type { Records } from './records'
import { routeTable, WRITE_METHODS } from './route-table'
import type { RouteInfo } from './route-table'

const RUNS_PER_ROUTE = 25

const app = createApp({
  pruneSessions: false,
  applicationLimits: { perHour: 10_000, attemptsPerHour: 10_000 },
})
const table = routeTable(app)
const writes = table.filter((r) => WRITE_METHODS.has(r.method))

/**
 * Path parameters no record has: not numbers, numbers not written as a path writes an id (a
 * plain coercion reads `0x10`, `16.0`, `+16`, ` 16` and `016` as record 16), out of PostgreSQL's
 * integer range, encoded traversal, SQL.
 */
const HOSTILE_PARAMS = [
  'abc',
  '0x10',
  '16.0',
  '+16',
  '%2016',
  '016',
  '-1',
  '0',
  '1.5',
  '1e3',
  '99999999999',
  '2147483648',
  '%00',
  '..%2F..%2Fetc%2Fpasswd',
  encodeURIComponent("1' OR '1'='1"),
  encodeURIComponent('٣'),
  '%20',
]

/** The caller each route is tried as: the owner where the owner may, else whoever may. */
function callerFor(route: RouteInfo): Caller | null {
  const access = ACCESS_MATRIX[route.key]?.access
  if (!access) return null
  return (['owner', 'buyerA', 'packer', 'anon'] as const).find((c) => access[c] === 'ok') ?? null
}

const clients = new Map<Caller, ApiClient>()
async function client(caller: Caller): Promise<ApiClient> {
  const c = clients.get(caller)
  // A route tried earlier may have ended the session (a password change, a deactivation).
  if (c && (caller === 'anon' || (await c.get('/api/auth/me')).status === 200)) return c
  const fresh = caller === 'anon' ? new ApiClient(app) : await clientAs(app, caller as DemoCaller)
  await fresh.token()
  clients.set(caller, fresh)
  // Signing in wrote a session: that is the new starting point.
  await unchanged(true)
  return fresh
}

function request(c: ApiClient, method: string, url: string, token: string) {
  const agent = c.agent
  const req =
    method === 'POST'
      ? agent.post(url)
      : method === 'PUT'
        ? agent.put(url)
        : method === 'PATCH'
          ? agent.patch(url)
          : agent.delete(url)
  return req.set('X-CSRF-Token', token).set('Idempotency-Key', randomUUID())
}

type Problem = string
function judge(
  route: RouteInfo,
  r: { status: number; body: unknown; type: string },
  what: string,
): Problem | null {
  const b = r.body as { error?: { code?: unknown; message?: unknown; details?: unknown } }
  if (r.status >= 500) return `${route.key} ${what}: ${r.status} ${JSON.stringify(r.body).slice(0, 300)}`
  if (r.status >= 400) {
    if (
      r.type !== 'application/json' ||
      typeof b.error?.code !== 'string' ||
      typeof b.error?.message !== 'string'
    )
      return `${route.key} ${what}: ${r.status} without the error shape`
    if (b.error.details !== undefined) {
      const ok =
        Array.isArray(b.error.details) &&
        b.error.details.every(
          (d) => d && typeof d === 'object' && Object.values(d).every((v) => v !== undefined),
        )
      if (!ok) return `${route.key} ${what}: details is not a list of objects`
      if (
        b.error.code === 'invalid_input' &&
        !(b.error.details as { field?: unknown; message?: unknown }[]).every(
          (d) => typeof d.field === 'string' && typeof d.message === 'string',
        )
      )
        return `${route.key} ${what}: invalid_input details without field and message`
    }
  }
  return null
}

let records: Records

/** The database as the last accepted request left it; true when it still is (`rebase` takes it anew). */
let baseline: string | null = null
async function unchanged(rebase = false): Promise<boolean> {
  // An accepted request's e-mails leave the outbox as they go out: let them, before counting rows.
  await drainMail()
  const now = JSON.stringify(await dbSnapshot(sequelize))
  const same = now === baseline
  if (rebase || !same) baseline = now
  return same
}
const tally = { routes: 0, requests: 0, accepted: 0, refused: 0 }

beforeAll(async () => {
  const owner = await client('owner')
  records = await shopARecords(owner)
  // PATCH /api/users/:id is tried on a person of its own, so no demo sign-in is changed.
  const invited = await owner.post('/api/users', {
    email: `fuzz.${randomUUID().slice(0, 8)}@brindlewick.test`,
    name: 'Fuzz Packer',
    role: 'packer',
  })
  expect(invited.status, JSON.stringify(invited.body)).toBe(201)
  records = { ...records, userId: invited.body.user.id as number }
})

afterAll(() => {
  console.info(
    `hostile bodies: ${tally.routes} write routes, ${tally.requests} requests (${RUNS_PER_ROUTE} generated + ${RAW_BODIES.length} raw each), ` +
      `${tally.refused} refused with 4xx, ${tally.accepted} accepted`,
  )
})

describe('hostile bodies on every write route', () => {
  it('tries every write route the table lists (or says why not)', () => {
    expect(writes.length).toBeGreaterThan(50)
    for (const route of writes)
      expect(callerFor(route), `${route.key} has no caller in the matrix`).not.toBeNull()
  })

  it.each(writes.map((r) => [r.key, r] as const))('%s', async (_key, route) => {
    const entry = ACCESS_MATRIX[route.key]!
    if (entry.fuzz && 'skip' in entry.fuzz) return
    const caller = callerFor(route)!
    const url = fillPath(route.path, records)
    tally.routes++
    const problems: Problem[] = []
    await unchanged(true)

    const attempt = async (
      what: string,
      send: (c: ApiClient, token: string) => Promise<{ status: number; body: unknown; type: string }>,
    ) => {
      const c = await client(caller)
      const token = await c.token()
      const r = await send(c, token)
      tally.requests++
      const p = judge(route, r, what)
      if (p) problems.push(p)
      if (r.status >= 400 && r.status < 500) {
        tally.refused++
        if (!(await unchanged()))
          problems.push(`${route.key} ${what}: refused with ${r.status} but the database changed`)
      } else {
        if (r.status < 400) tally.accepted++
        await unchanged(true)
      }
      return p === null
    }

    for (const raw of RAW_BODIES) {
      await attempt(raw.what, (c, token) =>
        request(c, route.method, url, token).set('Content-Type', raw.type).send(raw.body),
      )
    }
    await fc
      .assert(
        fc.asyncProperty(hostileBody(route.bodySchema), async (body) =>
          attempt(`body ${JSON.stringify(body)?.slice(0, 200)}`, (c, token) =>
            body !== null && typeof body === 'object'
              ? request(c, route.method, url, token).send(body)
              : request(c, route.method, url, token)
                  .set('Content-Type', 'application/json')
                  .send(JSON.stringify(body) ?? ''),
          ),
        ),
        { numRuns: RUNS_PER_ROUTE, endOnFailure: true },
      )
      .catch(() => {
        // The problem list below names what failed.
      })
    expect(problems.slice(0, 5)).toEqual([])
  })

  it('every route with a path parameter answers a hostile one with a 4xx and writes nothing', async () => {
    const problems: Problem[] = []
    let tried = 0
    await unchanged(true)
    for (const route of table.filter((r) => r.path.includes('/:'))) {
      const entry = ACCESS_MATRIX[route.key]!
      if (entry.fuzz && 'skip' in entry.fuzz && route.method !== 'DELETE') continue
      const caller = callerFor(route)!
      for (const bad of HOSTILE_PARAMS) {
        const c = await client(caller)
        const token = await c.token()
        // One parameter at a time is hostile; the others stay real.
        for (const name of route.path.match(/:[A-Za-z]+/g) ?? []) {
          const url = fillPath(route.path.replace(name, bad), records)
          const r =
            route.method === 'GET' ? await c.get(url) : await request(c, route.method, url, token).send({})
          tried++
          const p = judge(route, r, `with ${name} = ${bad}`)
          if (p) problems.push(p)
          else if (r.status < 400) problems.push(`${route.key} with ${name} = ${bad}: answered ${r.status}`)
          if (!(await unchanged())) problems.push(`${route.key} with ${name} = ${bad}: the database changed`)
        }
      }
    }
    console.info(`hostile path parameters: ${tried} requests`)
    expect(problems).toEqual([])
  })

  it('every GET route answers hostile query strings without a 500', async () => {
    const problems: Problem[] = []
    let tried = 0
    const gets = table.filter((r) => r.method === 'GET')
    // Keys the route reads (from its query schema) and some it does not, in the extended
    // parser's nested and repeated forms too.
    const schemaKeys = (r: RouteInfo) =>
      Object.keys(
        (r.querySchema as unknown as { _zod?: { def?: { shape?: object } } })?._zod?.def?.shape ?? {},
      )
    const keysOf = (r: RouteInfo) => [
      ...schemaKeys(r),
      'page',
      'q',
      'status',
      'orders',
      'priceOverride',
      '__proto__',
    ]
    for (const route of gets) {
      const caller = callerFor(route)!
      const c = await client(caller)
      const base = fillPath(route.path, records)
      const keys = keysOf(route)
      const queries = fc.sample(
        fc.array(
          fc.tuple(
            fc.constantFrom(...keys),
            fc.constantFrom('', '[]', '[0]', '[a][b]', '[999]'),
            fc.oneof(
              hostileString.filter((x) => x.length < 2000),
              fc.constantFrom('-1', '0', '1.5', '99999999999', 'true'),
            ),
          ),
          { minLength: 1, maxLength: 4 },
        ),
        6,
      )
      // Every key the route reads, once each with a number past PostgreSQL's integer and a NUL.
      const sweep = schemaKeys(route).flatMap(
        (k) => [[[k, '', '99999999999']], [[k, '', '\u0000']]] as [string, string, string][][],
      )
      for (const q of [...sweep, ...queries]) {
        // A lone surrogate cannot be put in a URL at all; such a sample is skipped.
        let qs: string
        try {
          qs = q
            .map(([k, suffix, v]) => `${encodeURIComponent(k)}${suffix}=${encodeURIComponent(v)}`)
            .join('&')
        } catch {
          continue
        }
        const r = await c.get(`${base}?${qs}`)
        tried++
        const p = judge(route, r, `?${qs.slice(0, 200)}`)
        if (p) problems.push(p)
      }
    }
    console.info(`hostile query strings: ${tried} requests on ${gets.length} GET routes`)
    expect(problems.slice(0, 10)).toEqual([])
  })

  it('leaves the stock ledger balanced after all of it', async () => {
    expect(await ledgerProblems(sequelize)).toEqual([])
  })
})
