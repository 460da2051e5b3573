/**
 * The server process killed with SIGKILL in the middle of an order storm, then started again on
 * the same database: every order that was answered 201 is there with its lines, allocations and
 * ledger moves; no order is half written; and a buyer who never heard back and sends the same
 * order again (same Idempotency-Key) gets that order, or a new one if the first never committed,
 * never two.
 */
import { spawn } from 'node:child_process'
import type { ChildProcess } from 'node:child_process'
import { randomUUID } from 'node:crypto'
import fs from 'node:fs'
import path from 'node:path'
import { QueryTypes } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { sequelize } from '@server/db/sequelize'
import { DEMO } from '@tests/factories/api-client'
import { makeProduct, resetShop, setMinimums } from '@tests/factories/orders'
import { freePort } from '../../scripts/lib/ports'
import { ledgerProblems } from './db-state'

const root = path.resolve(import.meta.dirname, '..', '..')
const logFile = path.join(root, 'test-results', 'crash-server.log')

let port = 0
let child: ChildProcess | null = null

async function startServer() {
  fs.mkdirSync(path.dirname(logFile), { recursive: true })
  const log = fs.openSync(logFile, 'a')
  const proc = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'server', 'index.ts')], {
    cwd: root,
    stdio: ['ignore', log, log],
    env: {
      ...process.env,
      HOST: '127.0.0.1',
      PORT: String(port),
      APP_URL: `http://127.0.0.1:${port}`,
      JOBS: 'false',
      LOGIN_MAX_FAILURES: '100',
    },
  })
  fs.closeSync(log)
  const until = Date.now() + 60_000
  for (;;) {
    if (proc.exitCode !== null) throw new Error(`the server exited (${proc.exitCode}); see ${logFile}`)
    try {
      if ((await fetch(`http://127.0.0.1:${port}/api/health`)).ok) break
    } catch {
      // not listening yet
    }
    if (Date.now() > until) throw new Error(`the server did not answer within 60 s; see ${logFile}`)
    await new Promise((r) => setTimeout(r, 100))
  }
  child = proc
}

function kill() {
  const proc = child!
  child = null
  proc.kill('SIGKILL')
  return new Promise((r) => (proc.exitCode !== null || proc.signalCode ? r(null) : proc.once('exit', r)))
}

/** A signed-in buyer over plain HTTP: the session cookie and the CSRF token. */
async function signIn(who: 'buyerA' | 'buyerB' | 'buyerC') {
  const base = `http://127.0.0.1:${port}`
  const first = await fetch(`${base}/api/auth/csrf`)
  let cookie = first.headers.get('set-cookie')!.split(';')[0]!
  const { csrfToken } = (await first.json()) as { csrfToken: string }
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Cookie: cookie, 'X-CSRF-Token': csrfToken },
    body: JSON.stringify(DEMO[who]),
  })
  expect(login.status).toBe(200)
  cookie = login.headers.get('set-cookie')!.split(';')[0]!
  const token = ((await login.json()) as { csrfToken: string }).csrfToken
  return (productId: number, cases: number, key: string) =>
    fetch(`${base}/api/orders`, {
      method: 'POST',
      headers: {
        'Content-Type': 'application/json',
        Cookie: cookie,
        'X-CSRF-Token': token,
        'Idempotency-Key': key,
      },
      body: JSON.stringify({ lines: [{ productId, cases }], poNumber: `CRASH-${key.slice(0, 6)}` }),
    })
}

async function rows<T>(sql: string, bind: unknown[] = []): Promise<T[]> {
  return sequelize.query<T & object>(sql, { bind, type: QueryTypes.SELECT }) as Promise<T[]>
}

beforeAll(async () => {
  port = await freePort()
  await setMinimums(0, 0)
  for (const who of ['buyerA', 'buyerB', 'buyerC'] as const) await resetShop(who)
  await startServer()
})

afterAll(async () => {
  if (child) {
    child.kill('SIGTERM')
    await new Promise((r) => (child!.exitCode !== null ? r(null) : child!.once('exit', r)))
  }
})

type Sent = { key: string; productId: number; cases: number; send: Awaited<ReturnType<typeof signIn>> }

describe('a crash in the middle of an order storm', () => {
  it('keeps every answered order whole and writes no half order', { timeout: 180_000 }, async () => {
    const products = await Promise.all([
      makeProduct({
        casePack: 6,
        batches: [
          { readyInDays: -20, bars: 300 },
          { readyInDays: -4, bars: 300 },
        ],
      }),
      makeProduct({ casePack: 4, batches: [{ readyInDays: -8, bars: 400 }] }),
    ])
    const senders = await Promise.all(
      (['buyerA', 'buyerB', 'buyerC', 'buyerA', 'buyerB', 'buyerC'] as const).map(signIn),
    )

    const answered: { sent: Sent; orderId: number; bars: number }[] = []
    const unanswered: Sent[] = []
    let refused = 0
    let stop = false
    // Twelve buyers keep ordering until the process dies under them.
    const worker = async (w: number) => {
      for (let i = 0; !stop; i++) {
        const p = products[(w + i) % products.length]!
        const sent: Sent = {
          key: randomUUID(),
          productId: p.productId,
          cases: 1 + ((w + i) % 3),
          send: senders[w % senders.length]!,
        }
        try {
          const r = await sent.send(sent.productId, sent.cases, sent.key)
          const body = (await r.json()) as { order?: { id: number; lines: { bars: number }[] } }
          if (r.status === 201)
            answered.push({ sent, orderId: body.order!.id, bars: body.order!.lines[0]!.bars })
          else refused++
        } catch {
          unanswered.push(sent)
          return
        }
      }
    }
    const storm = Array.from({ length: 12 }, (_, w) => worker(w))
    while (answered.length < 40) await new Promise((r) => setTimeout(r, 10))
    await kill()
    stop = true
    await Promise.all(storm)
    expect(unanswered.length, 'some requests were in flight when the process died').toBeGreaterThan(0)

    // Straight from the database, before the server runs again.
    for (const a of answered) {
      const [o] = await rows<{ lines: number; bars: number; allocated: number; reserved: number }>(
        `SELECT (SELECT count(*)::int FROM order_lines WHERE order_id = o.id) AS lines,
                (SELECT COALESCE(SUM(bars), 0)::int FROM order_lines WHERE order_id = o.id) AS bars,
                (SELECT COALESCE(SUM(a.bars), 0)::int FROM allocations a JOIN order_lines l ON l.id = a.order_line_id WHERE l.order_id = o.id) AS allocated,
                (SELECT COALESCE(SUM(bars), 0)::int FROM stock_moves WHERE order_id = o.id AND kind = 'reserved') AS reserved
           FROM orders o WHERE o.id = $1 AND o.idempotency_key = $2`,
        [a.orderId, a.sent.key],
      )
      expect(o, `order ${a.orderId} answered 201`).toEqual({
        lines: 1,
        bars: a.bars,
        allocated: a.bars,
        reserved: a.bars,
      })
    }
    const productIds = products.map((p) => p.productId)
    const half = await rows<{ id: number }>(
      `SELECT o.id FROM orders o
        WHERE EXISTS (SELECT 1 FROM order_lines l WHERE l.order_id = o.id AND l.product_id = ANY($1::int[]))
          AND (NOT EXISTS (SELECT 1 FROM order_lines l WHERE l.order_id = o.id)
               OR (SELECT COALESCE(SUM(a.bars), 0) FROM allocations a JOIN order_lines l ON l.id = a.order_line_id WHERE l.order_id = o.id)
                  <> (SELECT SUM(bars) FROM order_lines WHERE order_id = o.id)
               OR (SELECT COALESCE(SUM(bars), 0) FROM stock_moves WHERE order_id = o.id AND kind = 'reserved')
                  <> (SELECT SUM(bars) FROM order_lines WHERE order_id = o.id))`,
      [productIds],
    )
    expect(half).toEqual([])
    const orphans = await rows<{ n: number }>(
      `SELECT count(*)::int AS n FROM stock_moves m WHERE m.kind = 'reserved' AND m.order_id IS NULL
          AND m.batch_id IN (SELECT id FROM batches WHERE product_id = ANY($1::int[]))`,
      [productIds],
    )
    expect(orphans[0]!.n).toBe(0)
    expect(await ledgerProblems(sequelize)).toEqual([])

    // Started again: the answered orders are served, and the unanswered ones can be sent again.
    await startServer()
    const retried = await Promise.all(
      unanswered.map(async (u) => {
        // The same buyer (the same shop) sends the same order with the same key.
        const w = senders.indexOf(u.send)
        const send = await signIn((['buyerA', 'buyerB', 'buyerC'] as const)[w % 3]!)
        const r = await send(u.productId, u.cases, u.key)
        return { key: u.key, status: r.status }
      }),
    )
    expect(retried.filter((r) => ![200, 201, 409].includes(r.status))).toEqual([])
    for (const r of retried) {
      const [n] = await rows<{ n: number }>(
        'SELECT count(*)::int AS n FROM orders WHERE idempotency_key = $1',
        [r.key],
      )
      expect(n!.n, `key ${r.key} answered ${r.status}`).toBe(r.status === 409 ? 0 : 1)
    }
    expect(await ledgerProblems(sequelize)).toEqual([])
    console.info(
      `crash: ${answered.length} orders answered 201 and ${refused} refused before SIGKILL, ${unanswered.length} in flight; ` +
        `after the restart ${retried.filter((r) => r.status === 200).length} of those were found committed, ` +
        `${retried.filter((r) => r.status === 201).length} placed anew, ${retried.filter((r) => r.status === 409).length} refused for stock`,
    )
  })
})
