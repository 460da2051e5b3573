/**
 * Every API route × every caller, from the server's own route table: the outcome the matrix
 * declares (tests/reliability/access-matrix.ts), and no cost or margin in anything a buyer
 * receives, no price or cost in anything a packer receives.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { ApiClient, clientAs } from '@tests/factories/api-client'
import type { DemoCaller } from '@tests/factories/api-client'
import { ACCESS_MATRIX, CALLERS } from './access-matrix'
import type { Caller, Outcome } from './access-matrix'
import { fillPath, markers, shopARecords } from './records'
import type { Records } from './records'
import { routeTable, WRITE_METHODS } from './route-table'

const app = createApp({ pruneSessions: false, applicationLimits: { perHour: 1000, attemptsPerHour: 1000 } })
const table = routeTable(app)

/** Buyers: nothing about cost or margin. Packers: nothing about money at all (as tests/api/packing.test.ts). */
const BUYER_FORBIDDEN = /cost|margin/i
const PACKER_FORBIDDEN = /price|cost|cents|margin|tax(?!Id)|amount|^total$|^subtotal$|paid|balance/i
/** A list's `total` beside its `items` is how many there are, not money. */
const isListCount = (body: unknown, key: string) =>
  key === '.total' && Array.isArray((body as { items?: unknown })?.items)

const WHO: Record<Exclude<Caller, 'anon'>, DemoCaller> = {
  buyerA: 'buyerA',
  buyerB: 'buyerB',
  packer: 'packer',
  owner: 'owner',
}
const sign = (c: Caller) => (c === 'anon' ? new ApiClient(app) : clientAs(app, WHO[c]))

function keysOf(value: unknown, path = '', out: string[] = []): string[] {
  if (Array.isArray(value)) value.forEach((v, i) => keysOf(v, `${path}[${i}]`, out))
  else if (value && typeof value === 'object')
    for (const [k, v] of Object.entries(value)) {
      out.push(`${path}.${k}`)
      keysOf(v, `${path}.${k}`, out)
    }
  return out
}

function send(c: ApiClient, method: string, url: string) {
  switch (method) {
    case 'GET':
      return c.get(url)
    case 'POST':
      return c.post(url, {})
    case 'PUT':
      return c.put(url, {})
    case 'PATCH':
      return c.patch(url, {})
    case 'DELETE':
      return c.delete(url)
  }
  throw new Error(`no way to send ${method}`)
}

function outcomeOf(method: string, status: number): Outcome | string {
  if (status === 401 || status === 403 || status === 404) return String(status) as Outcome
  if (status >= 500) return String(status)
  if (method === 'GET' && status >= 300 && status !== 304) return String(status)
  return 'ok'
}

let clients: Record<Caller, ApiClient>
let records: Records

beforeAll(async () => {
  const entries = await Promise.all(CALLERS.map(async (c) => [c, await sign(c)] as const))
  clients = Object.fromEntries(entries) as Record<Caller, ApiClient>
  records = await shopARecords(clients.owner)
})

/** Both buyers have the product in their cart, so removing the line or the cart is a real removal. */
async function fillCarts() {
  for (const c of [clients.buyerA, clients.buyerB]) {
    const put = await c.put(`/api/cart/lines/${records.productId}`, { cases: 1 })
    expect(put.status, JSON.stringify(put.body)).toBe(200)
  }
}

describe('the access matrix', () => {
  it('names every route the server answers, and no route it does not', () => {
    const served = table.map((r) => r.key)
    expect(new Set(served).size, 'a route is registered twice').toBe(served.length)
    const unlisted = served.filter((k) => !ACCESS_MATRIX[k])
    const gone = Object.keys(ACCESS_MATRIX).filter((k) => !served.includes(k))
    expect({ unlisted, gone }).toEqual({ unlisted: [], gone: [] })
    expect(served.length).toBeGreaterThan(100)
  })

  it('gives each caller the declared outcome on every route, and no forbidden field', async () => {
    const mismatches: string[] = []
    const leaks: string[] = []
    // Those who may not, first; the owner last (the owner's calls may change a record's state).
    const order: Caller[] = ['anon', 'buyerB', 'packer', 'buyerA', 'owner']
    let calls = 0
    // The same walk over the owner's answers must find cost and margin keys: it looks in the right places.
    let ownerCostKeys = 0
    for (const route of table) {
      const entry = ACCESS_MATRIX[route.key]!
      if (route.path.startsWith('/api/cart')) await fillCarts()
      const url = fillPath(route.path, records) + (entry.query ? `?${fillPath(entry.query, records)}` : '')
      for (const caller of order) {
        const c = entry.fresh ? await sign(caller) : clients[caller]
        const r = await send(c, route.method, url)
        calls++
        const got = outcomeOf(route.method, r.status)
        const want = entry.access[caller]
        if (got !== want)
          mismatches.push(
            `${route.key} as ${caller}: expected ${want}, got ${r.status} ${JSON.stringify(r.body).slice(0, 160)}`,
          )
        if (r.status >= 400 && r.status < 500 && r.type === 'application/json') {
          // Every refusal keeps the contract's shape.
          if (typeof r.body?.error?.code !== 'string' || typeof r.body?.error?.message !== 'string')
            mismatches.push(`${route.key} as ${caller}: ${r.status} without the error shape`)
        }
        if (caller === 'buyerB' || caller === 'anon') {
          const text = r.type === 'application/json' ? JSON.stringify(r.body) : (r.text ?? '')
          for (const m of markers)
            if (text.includes(m)) leaks.push(`${route.key} as ${caller}: shows shop A's "${m}"`)
        }
        const forbidden =
          caller === 'packer' ? PACKER_FORBIDDEN : caller.startsWith('buyer') ? BUYER_FORBIDDEN : null
        if (caller === 'owner' && r.type === 'application/json')
          ownerCostKeys += keysOf(r.body).filter((k) => BUYER_FORBIDDEN.test(k.split('.').at(-1)!)).length
        if (forbidden && r.status < 300 && r.type === 'application/json') {
          for (const k of keysOf(r.body))
            if (forbidden.test(k.split('.').at(-1)!) && !isListCount(r.body, k))
              leaks.push(`${route.key} as ${caller}: ${k}`)
        }
      }
    }
    console.info(
      `access matrix: ${table.length} routes × ${order.length} callers = ${calls} calls (${table.filter((r) => WRITE_METHODS.has(r.method)).length} write routes)`,
    )
    expect(mismatches).toEqual([])
    expect(leaks).toEqual([])
    expect(ownerCostKeys).toBeGreaterThan(10)
  })
})
