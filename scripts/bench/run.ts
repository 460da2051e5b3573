/**
 * npm run bench: Lathercase measured against the bare stack it runs on, side by side in one run,
 * so that the figures that count are ratios (the machine is shared and noisy; absolutes are not).
 *
 * It starts its own PostgreSQL (fsync off) and mail catcher, loads the large scenario
 * (scripts/bench/scenario.ts), builds the client, starts the server the way `npm start` does
 * (the bundled `node dist/server/index.mjs`, NODE_ENV=production) with LC_BENCH=1 so that the bare
 * baselines are mounted beside the API in the same process, and measures each part in rounds,
 * alternating the app and its baseline. Results go to bench/results.json and a table.
 *
 * BENCH_ROUND_SECONDS (default 8) and BENCH_ROUNDS (default 3) shorten or lengthen a run;
 * BENCH_CPU_PROF=1 writes a CPU profile of the server into bench/profiles/. BENCH_ONLY=orders
 * measures order placement alone (no client build, no other part) and leaves bench/results.json
 * as it is: its figures go to the terminal and to lathercase-bench-orders.json in the temp folder.
 */
import { spawn, spawnSync } from 'node:child_process'
import type { ChildProcess } from 'node:child_process'
import { randomBytes, randomUUID } from 'node:crypto'
import fs from 'node:fs'
import http from 'node:http'
import os from 'node:os'
import path from 'node:path'
import autocannon from 'autocannon'
import pg from 'pg'
import { startMailCatcher } from '../lib/mail-catcher'
import { freePort } from '../lib/ports'
import { ROOT } from '../lib/root'
import { SERVER_NODE_FLAGS, buildServerIfStale } from '../lib/server-build'
import { clientSizes } from './client-size'
import { loadScenario } from './scenario'
import type { ScenarioFacts } from './scenario'
import { startBenchDb } from './stack'
import { checkGoal, median, pairedRatio, summarize, table } from './stats'
import type { GoalResult, Summary } from './stats'

const ROUND_S = Number(process.env.BENCH_ROUND_SECONDS ?? 8)
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 3)
const ONLY_ORDERS = process.env.BENCH_ONLY === 'orders'
const log = (l: string) => console.log(`[bench] ${l}`)

type Session = { cookie: string; csrf: string; userId: number; shopId: number | null }

/** What every browser sends: the load generator asks for gzip as the buyer's browser would. */
const BROWSER = { 'accept-encoding': 'gzip, deflate, br' }

/** An answer's bytes as they came over the wire (fetch would decompress them). */
function rawGet(url: string, headers: Record<string, string>) {
  return new Promise<{ status: number; encoding: string; bytes: Buffer }>((resolve, reject) => {
    http
      .get(url, { headers }, (res) => {
        const chunks: Buffer[] = []
        res.on('data', (c: Buffer) => chunks.push(c))
        res.on('end', () =>
          resolve({
            status: res.statusCode ?? 0,
            encoding: String(res.headers['content-encoding'] ?? 'identity'),
            bytes: Buffer.concat(chunks),
          }),
        )
        res.on('error', reject)
      })
      .on('error', reject)
  })
}

function cookieOf(res: Response, previous = ''): string {
  const set = res.headers.getSetCookie().map((c) => c.split(';')[0]!)
  return set.find((c) => c.startsWith('lc.sid=')) ?? previous
}

async function signIn(base: string, email: string, password: string): Promise<Session> {
  const r1 = await fetch(`${base}/api/auth/csrf`)
  const { csrfToken } = (await r1.json()) as { csrfToken: string }
  const cookie = cookieOf(r1)
  const r2 = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', cookie, 'x-csrf-token': csrfToken },
    body: JSON.stringify({ email, password }),
  })
  if (r2.status !== 200) throw new Error(`sign-in as ${email}: ${r2.status} ${await r2.text()}`)
  const { user } = (await r2.json()) as { user: { id: number; shopId: number | null } }
  return { cookie: cookieOf(r2, cookie), csrf: csrfToken, userId: user.id, shopId: user.shopId }
}

type Run = {
  rps: number
  okRps: number
  p50: number
  p99: number
  non2xx: number
  errors: number
  requests: number
}

async function cannon(opts: autocannon.Options): Promise<Run> {
  const r = await autocannon({ ...opts, duration: opts.duration ?? ROUND_S })
  const seconds = Number(opts.duration ?? ROUND_S)
  return {
    rps: r.requests.average,
    okRps: r['2xx'] / seconds,
    p50: r.latency.p50,
    p99: r.latency.p99,
    non2xx: r.non2xx,
    errors: r.errors + r.timeouts,
    requests: r.requests.total,
  }
}

/** Rounds of app and bare, alternating which goes first, so drift on the machine hits both alike. */
async function sideBySide(app: () => Promise<Run>, bare: () => Promise<Run>) {
  const a: Run[] = []
  const b: Run[] = []
  for (let i = 0; i < ROUNDS; i++) {
    if (i % 2 === 0) {
      a.push(await app())
      b.push(await bare())
    } else {
      b.push(await bare())
      a.push(await app())
    }
    log(
      `  round ${i + 1}: app ${a[i]!.okRps.toFixed(0)}/s p99 ${a[i]!.p99} ms · bare ${b[i]!.okRps.toFixed(0)}/s p99 ${b[i]!.p99} ms`,
    )
  }
  const sum = (runs: Run[]) => ({
    perSecond: summarize(runs.map((r) => r.okRps)),
    p50: summarize(runs.map((r) => r.p50)),
    p99: summarize(runs.map((r) => r.p99)),
    non2xx: runs.reduce((s, r) => s + r.non2xx, 0),
    errors: runs.reduce((s, r) => s + r.errors, 0),
  })
  return {
    app: sum(a),
    bare: sum(b),
    ratio: pairedRatio(
      a.map((r) => r.okRps),
      b.map((r) => r.okRps),
    ),
  }
}

// ---------------------------------------------------------------------------------------------

async function benchCatalogue(base: string, buyer: Session) {
  log('Catalogue: GET /api/catalogue as a buyer against a bare route of the same body, 50 connections')
  const res = await fetch(`${base}/api/catalogue`, { headers: { cookie: buyer.cookie } })
  const text = await res.text()
  if (res.status !== 200) throw new Error(`catalogue: ${res.status} ${text.slice(0, 200)}`)
  // The bare route answers with the very bytes the app sends (its gzip, as a browser gets it).
  const wire = await rawGet(`${base}/api/catalogue`, { cookie: buyer.cookie, ...BROWSER })
  if (wire.status !== 200) throw new Error(`catalogue (gzip): ${wire.status}`)
  const put = await fetch(`${base}/api/bench/fixed`, {
    method: 'PUT',
    headers: { 'content-type': 'application/octet-stream', 'x-bench-encoding': wire.encoding },
    body: new Uint8Array(wire.bytes),
  })
  if (put.status !== 204) throw new Error(`bench fixed body: ${put.status}`)
  const bare = await rawGet(`${base}/api/bench/fixed`, BROWSER)
  const app = () =>
    cannon({ url: `${base}/api/catalogue`, connections: 50, headers: { cookie: buyer.cookie, ...BROWSER } })
  const fixed = () => cannon({ url: `${base}/api/bench/fixed`, connections: 50, headers: BROWSER })
  await cannon({
    url: `${base}/api/catalogue`,
    connections: 50,
    headers: { cookie: buyer.cookie, ...BROWSER },
    duration: 2,
  })
  await cannon({ url: `${base}/api/bench/fixed`, connections: 50, headers: BROWSER, duration: 2 })
  const items = (JSON.parse(text) as { items: unknown[] }).items.length
  return {
    items,
    bytes: text.length,
    wireBytes: wire.bytes.length,
    encoding: wire.encoding,
    bareBytes: bare.bytes.length,
    ...(await sideBySide(app, fixed)),
  }
}

async function benchOrders(base: string, buyers: Session[], facts: ScenarioFacts) {
  log(`Orders: POST /api/orders from ${buyers.length} buyers against the bare transaction, 20 connections`)
  const accepted: number[] = []
  const bareAccepted: number[] = []
  let n = 0
  const linesFor = (i: number) => {
    const hot = facts.hotProductIds
    const a = hot[i % hot.length]!
    const b = hot[(i * 7 + 3) % hot.length]!
    return a === b
      ? [{ productId: a, cases: 3 }]
      : [
          { productId: a, cases: 3 },
          { productId: b, cases: 2 },
        ]
  }
  // Each order's e-mails go out after its answer. A round ends when they have all gone, and its
  // rate counts that wait: orders per second sustained, e-mails included, and the next round
  // (the bare one, say) does not run beside the app's mail.
  const drainMs: number[] = []
  const drained = async (run: Run): Promise<Run> => {
    const r = await fetch(`${base}/api/bench/drain-mail`, { method: 'POST' })
    const { waitedMs, left } = (await r.json()) as { waitedMs: number; left: number }
    if (left > 0) throw new Error(`${left} e-mails still going out after two minutes`)
    drainMs.push(waitedMs)
    return { ...run, okRps: (run.okRps * ROUND_S) / (ROUND_S + waitedMs / 1000) }
  }
  const app = async () => drained(await placeThroughApp())
  const placeThroughApp = () =>
    cannon({
      url: base,
      connections: 20,
      requests: [
        {
          method: 'POST',
          path: '/api/orders',
          setupRequest: (req) => {
            const i = n++
            const s = buyers[i % buyers.length]!
            return {
              ...req,
              headers: {
                'content-type': 'application/json',
                cookie: s.cookie,
                'x-csrf-token': s.csrf,
                'idempotency-key': randomUUID(),
              },
              body: JSON.stringify({ lines: linesFor(i), poNumber: `BENCH-${i}` }),
            }
          },
          onResponse: (status, body) => {
            if (status === 201) accepted.push((JSON.parse(body) as { order: { id: number } }).order.id)
          },
        },
      ],
    })
  const bare = () =>
    cannon({
      url: base,
      connections: 20,
      requests: [
        {
          method: 'POST',
          path: '/api/bench/order',
          setupRequest: (req) => {
            const i = n++
            const s = buyers[i % buyers.length]!
            return {
              ...req,
              headers: { 'content-type': 'application/json' },
              body: JSON.stringify({
                shopId: s.shopId,
                userId: s.userId,
                key: randomUUID(),
                lines: linesFor(i),
              }),
            }
          },
          onResponse: (status, body) => {
            if (status === 201) bareAccepted.push((JSON.parse(body) as { order: { id: number } }).order.id)
          },
        },
      ],
    })
  const result = await sideBySide(app, bare)
  log(`  (the app's e-mails took ${drainMs.map((ms) => `${ms} ms`).join(', ')} to go out after its rounds)`)
  return { ...result, mailDrainMs: drainMs, acceptedApp: accepted, acceptedBare: bareAccepted }
}

/** After the placing run: no balance below zero, the ledger adds up, every accepted order is there whole. */
async function verifyOrders(dbUrl: string, appIds: number[], bareIds: number[]) {
  const c = new pg.Client({ connectionString: dbUrl })
  await c.connect()
  try {
    const neg = await c.query('SELECT count(*)::int AS n FROM batch_stock WHERE free < 0 OR reserved < 0')
    const ledger = await c.query(
      `SELECT count(*)::int AS n FROM batch_stock s
         JOIN (SELECT batch_id, sum(free_delta)::int AS f, sum(reserved_delta)::int AS r FROM stock_moves GROUP BY batch_id) m
           ON m.batch_id = s.batch_id
        WHERE m.f <> s.free OR m.r <> s.reserved`,
    )
    const ids = [...appIds, ...bareIds]
    const whole = await c.query(
      `SELECT count(*)::int AS n FROM orders o
        WHERE o.id = ANY($1::int[])
          AND (SELECT coalesce(sum(l.bars), 0) FROM order_lines l WHERE l.order_id = o.id)
            = (SELECT coalesce(sum(a.bars), 0) FROM allocations a JOIN order_lines l ON l.id = a.order_line_id WHERE l.order_id = o.id)
          AND (SELECT coalesce(sum(a.bars), 0) FROM allocations a JOIN order_lines l ON l.id = a.order_line_id WHERE l.order_id = o.id)
            = (SELECT coalesce(sum(m.bars), 0) FROM stock_moves m WHERE m.order_id = o.id AND m.kind = 'reserved')
          AND EXISTS (SELECT 1 FROM order_lines l WHERE l.order_id = o.id)`,
      [ids],
    )
    const series = await c.query(
      `SELECT count(*)::int AS n FROM (SELECT year FROM invoices GROUP BY year HAVING count(*) <> max(seq) OR min(seq) <> 1) x`,
    )
    const orderSeries = await c.query(
      `SELECT count(*)::int AS n FROM (SELECT year FROM orders GROUP BY year HAVING count(*) <> max(seq) OR min(seq) <> 1) x`,
    )
    return {
      accepted: ids.length,
      acceptedPresentAndWhole: whole.rows[0].n as number,
      batchesBelowZero: neg.rows[0].n as number,
      batchesWhoseLedgerDisagrees: ledger.rows[0].n as number,
      invoiceYearsWithGaps: series.rows[0].n as number,
      orderYearsWithGaps: orderSeries.rows[0].n as number,
    }
  } finally {
    await c.end()
  }
}

async function timeGet(url: string, headers: Record<string, string> = {}): Promise<number> {
  const t0 = performance.now()
  const r = await fetch(url, { headers })
  const body = await r.arrayBuffer()
  if (r.status !== 200 || body.byteLength < 1000) throw new Error(`${url}: ${r.status}`)
  return performance.now() - t0
}

async function benchInvoicePdf(base: string, owner: Session, invoiceId: number) {
  log('Invoice PDF of 40 lines: the app route against pdfmake rendering the same definition')
  const appUrl = `${base}/api/invoices/${invoiceId}/pdf`
  const bareUrl = `${base}/api/bench/invoice-pdf/${invoiceId}`
  const h = { cookie: owner.cookie }
  for (let i = 0; i < 3; i++) {
    await timeGet(appUrl, h)
    await timeGet(bareUrl)
  }
  const app: number[] = []
  const bare: number[] = []
  for (let round = 0; round < ROUNDS; round++) {
    const a: number[] = []
    const b: number[] = []
    for (let i = 0; i < 10; i++) {
      if ((round + i) % 2 === 0) {
        a.push(await timeGet(appUrl, h))
        b.push(await timeGet(bareUrl))
      } else {
        b.push(await timeGet(bareUrl))
        a.push(await timeGet(appUrl, h))
      }
    }
    app.push(median(a))
    bare.push(median(b))
    log(`  round ${round + 1}: app ${median(a).toFixed(1)} ms · bare ${median(b).toFixed(1)} ms`)
  }
  return { appMs: summarize(app), bareMs: summarize(bare), ratio: pairedRatio(app, bare) }
}

async function benchOrderLists(base: string, history: Session, owner: Session, facts: ScenarioFacts) {
  log('Order lists: a shop of 2,000 orders, page by page, and the owner’s filtered table')
  log('  (the goal: each call on its own, one connection; then one round at 10 connections, for information)')
  let i = 0
  const pages = Math.ceil(facts.counts.historyShopOrders! / 25)
  const shopPaged = (connections: number) =>
    cannon({
      url: base,
      connections,
      headers: { cookie: history.cookie, ...BROWSER },
      requests: [
        {
          method: 'GET',
          setupRequest: (req) => ({ ...req, path: `/api/orders?page=${1 + (i++ % pages)}&pageSize=25` }),
        },
      ],
    })
  const filters = [
    () => `status=shipped&page=${1 + (i % 40)}`,
    () => `shopId=${facts.historyShopId}&page=${1 + (i % 40)}`,
    () => `from=2025-01-01&to=2025-03-31&page=${1 + (i % 20)}`,
    () => `status=shipped,cancelled&from=2024-09-01&to=2025-06-30&page=${1 + (i % 30)}`,
    () => `q=PO-4${100 + (i % 900)}&page=1`,
    () => `page=${1 + (i % 200)}`,
  ]
  const ownerTable = (connections: number) =>
    cannon({
      url: base,
      connections,
      headers: { cookie: owner.cookie, ...BROWSER },
      requests: [
        {
          method: 'GET',
          setupRequest: (req) => ({
            ...req,
            path: `/api/orders?${filters[i++ % filters.length]!()}&pageSize=25`,
          }),
        },
      ],
    })
  await cannon({
    url: `${base}/api/orders?page=1`,
    connections: 10,
    headers: { cookie: history.cookie },
    duration: 2,
  })
  const shop: Run[] = []
  const all: Run[] = []
  for (let r = 0; r < ROUNDS; r++) {
    shop.push(await shopPaged(1))
    all.push(await ownerTable(1))
    log(
      `  round ${r + 1}: shop history p99 ${shop[r]!.p99} ms (${shop[r]!.okRps.toFixed(0)}/s) · owner table p99 ${all[r]!.p99} ms (${all[r]!.okRps.toFixed(0)}/s)`,
    )
  }
  const sum = (runs: Run[]) => ({
    p50: summarize(runs.map((r) => r.p50)),
    p99: summarize(runs.map((r) => r.p99)),
    perSecond: summarize(runs.map((r) => r.okRps)),
    non2xx: runs.reduce((s, r) => s + r.non2xx, 0),
  })
  const busyShop = await shopPaged(10)
  const busyOwner = await ownerTable(10)
  log(`  10 connections: shop history p99 ${busyShop.p99} ms · owner table p99 ${busyOwner.p99} ms`)
  return {
    shopHistory: sum(shop),
    ownerTable: sum(all),
    at10Connections: {
      shopHistoryP99: busyShop.p99,
      ownerTableP99: busyOwner.p99,
      shopPerSecond: busyShop.okRps,
      ownerPerSecond: busyOwner.okRps,
    },
  }
}

// ---------------------------------------------------------------------------------------------

function buildClient() {
  log('Building the client (vite build --manifest) into dist/client…')
  const r = spawnSync(
    path.join(ROOT, 'node_modules', '.bin', 'vite'),
    ['build', '--manifest', '--logLevel', 'warn'],
    {
      cwd: ROOT,
      stdio: 'inherit',
    },
  )
  if (r.status !== 0) throw new Error('The client build failed; see above.')
}

function startServer(serverFile: string, env: Record<string, string>, logFile: string): ChildProcess {
  const out = fs.openSync(logFile, 'w')
  const profDir = path.join(ROOT, 'bench', 'profiles')
  const prof = process.env.BENCH_CPU_PROF === '1' ? ['--cpu-prof', `--cpu-prof-dir=${profDir}`] : []
  return spawn(process.execPath, [...SERVER_NODE_FLAGS, ...prof, serverFile], {
    cwd: ROOT,
    stdio: ['ignore', out, out],
    env: { ...process.env, ...env },
  })
}

async function waitForHealth(base: string, child: ChildProcess, logFile: string) {
  const until = Date.now() + 90_000
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the server exited (${child.exitCode}); see ${logFile}`)
    try {
      if ((await fetch(`${base}/api/health`)).ok) return
    } catch {
      // not listening yet
    }
    if (Date.now() > until) throw new Error(`the server did not answer within 90 s; see ${logFile}`)
    await new Promise((r) => setTimeout(r, 250))
  }
}

/** VmHWM (peak resident set) and VmRSS of a process, in MB, from /proc. */
function memoryOf(pid: number): { peakMb: number; rssMb: number } | null {
  try {
    const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8')
    const kb = (key: string) => Number(new RegExp(`^${key}:\\s+(\\d+) kB`, 'm').exec(status)?.[1] ?? NaN)
    return { peakMb: kb('VmHWM') / 1024, rssMb: kb('VmRSS') / 1024 }
  } catch {
    return null
  }
}

const fmt = (n: number, d = 0) => (Number.isFinite(n) ? n.toFixed(d) : '—')
const spread = (s: Summary) => `±${fmt(s.spreadPct)}%`

async function main() {
  const started = Date.now()
  const base0 = fs.mkdtempSync(path.join(os.tmpdir(), 'lathercase-bench-run-'))
  if (!ONLY_ORDERS) buildClient()
  const client = ONLY_ORDERS ? null : await clientSizes(ROOT, log)

  log('Starting PostgreSQL and loading the demo data…')
  const db = await startBenchDb(() => {})
  let server: ChildProcess | null = null
  let mail: Awaited<ReturnType<typeof startMailCatcher>> | null = null
  let sampler: NodeJS.Timeout | null = null
  try {
    log('Loading the large scenario…')
    const facts = await loadScenario(db.url, log)
    log(`  ${JSON.stringify(facts.counts)} in ${fmt(facts.loadSeconds, 1)} s`)

    mail = await startMailCatcher({
      smtpPort: await freePort(),
      webPort: await freePort(),
      dir: path.join(base0, 'mail'),
    })
    const port = await freePort()
    const base = `http://127.0.0.1:${port}`
    const logFile = path.join(os.tmpdir(), 'lathercase-bench-server.log')
    server = startServer(
      await buildServerIfStale(ROOT, log),
      {
        NODE_ENV: 'production',
        LC_BENCH: '1',
        HOST: '127.0.0.1',
        PORT: String(port),
        APP_URL: base,
        DATABASE_URL: db.url,
        SESSION_SECRET: randomBytes(32).toString('base64url'),
        SMTP_HOST: '127.0.0.1',
        SMTP_PORT: String(mail.smtpPort),
        MAIL_CATCHER_URL: mail.url,
        // The daily jobs would send thousands of overdue reminders with PDFs into the run.
        JOBS: 'false',
        LOG_LEVEL: 'warn',
      },
      logFile,
    )
    await waitForHealth(base, server, logFile)
    const pid = server.pid!
    let peakSampled = 0
    sampler = setInterval(() => {
      const m = memoryOf(pid)
      if (m) peakSampled = Math.max(peakSampled, m.rssMb)
    }, 250)
    log(`Server up on ${base} (pid ${pid}); signing in…`)

    const catalogueBuyer = await signIn(base, facts.buyers[0]!.email, facts.password.buyer)
    const orderBuyers: Session[] = []
    for (const b of facts.buyers.slice(1, 41))
      orderBuyers.push(await signIn(base, b.email, facts.password.buyer))
    const history = await signIn(base, facts.historyBuyerEmail, facts.password.buyer)
    const owner = await signIn(base, facts.ownerEmail, facts.password.owner)

    if (process.env.BENCH_HOLD === '1') {
      // For profiling by hand: the loaded database and the server stay up until Ctrl-C.
      const hold = {
        base,
        db: db.url,
        pid,
        buyer: catalogueBuyer,
        history,
        owner,
        facts: { ...facts, buyers: [] },
      }
      fs.writeFileSync(path.join(os.tmpdir(), 'lathercase-bench-hold.json'), JSON.stringify(hold, null, 2))
      log(`Holding: see ${path.join(os.tmpdir(), 'lathercase-bench-hold.json')}; Ctrl-C ends it.`)
      await new Promise((r) => {
        process.once('SIGINT', r)
        process.once('SIGTERM', r)
      })
      return
    }
    // The highest resident set seen during each part (sampled), to tell which part needs the memory.
    const phasePeakMb: Record<string, number> = {}
    // And what the process holds at the end of each part, by kind (heap, buffers).
    const phaseEndMemory: Record<string, unknown> = {}
    const phase = async <T>(name: string, work: () => Promise<T>): Promise<T> => {
      peakSampled = 0
      const out = await work()
      phasePeakMb[name] = Math.round(Math.max(peakSampled, memoryOf(pid)?.rssMb ?? 0))
      phaseEndMemory[name] = await (await fetch(`${base}/api/bench/memory`)).json()
      return out
    }
    if (ONLY_ORDERS) {
      const orders = await benchOrders(base, orderBuyers, facts)
      const verified = await verifyOrders(db.url, orders.acceptedApp, orders.acceptedBare)
      const out = {
        when: new Date().toISOString(),
        machine: { cpus: os.cpus().length, loadAverage: os.loadavg(), node: process.version },
        settings: { roundSeconds: ROUND_S, rounds: ROUNDS },
        orders: {
          app: orders.app,
          bare: orders.bare,
          ratio: orders.ratio,
          mailDrainMs: orders.mailDrainMs,
          acceptedApp: orders.acceptedApp.length,
          acceptedBare: orders.acceptedBare.length,
          verified,
        },
      }
      const file = path.join(os.tmpdir(), 'lathercase-bench-orders.json')
      fs.writeFileSync(file, JSON.stringify(out, null, 2) + '\n')
      log(
        `orders placed/s: app ${fmt(orders.app.perSecond.median)} (p99 ${fmt(orders.app.p99.median)} ms) · bare ${fmt(orders.bare.perSecond.median)} (p99 ${fmt(orders.bare.p99.median)} ms) · ratio ${fmt(orders.ratio, 2)}`,
      )
      log(`Stock check: ${JSON.stringify(verified)}; written to ${file}`)
      return
    }
    if (!client) throw new Error('client sizes missing')
    const catalogue = await phase('catalogue', () => benchCatalogue(base, catalogueBuyer))
    const lists = await phase('orderLists', () => benchOrderLists(base, history, owner, facts))
    const pdf = await phase('invoicePdf', () => benchInvoicePdf(base, owner, facts.invoice40Id))
    const orders = await phase('orders', () => benchOrders(base, orderBuyers, facts))
    peakSampled = Math.max(...Object.values(phasePeakMb))
    const verified = await verifyOrders(db.url, orders.acceptedApp, orders.acceptedBare)
    const mem = memoryOf(pid)
    clearInterval(sampler)
    sampler = null

    const goals: GoalResult[] = [
      checkGoal({
        id: 'catalogue.ratio',
        label: 'catalogue req/s ÷ bare route',
        kind: 'atLeast',
        limit: 0.5,
        value: catalogue.ratio,
        unit: '×',
      }),
      checkGoal({
        id: 'catalogue.p99',
        label: 'catalogue p99 at 50 connections',
        kind: 'under',
        limit: 50,
        value: catalogue.app.p99.median,
        unit: 'ms',
      }),
      checkGoal({
        id: 'orders.ratio',
        label: 'orders/s ÷ bare transaction',
        kind: 'atLeast',
        limit: 0.4,
        value: orders.ratio,
        unit: '×',
      }),
      checkGoal({
        id: 'orders.oversell',
        label: 'oversold batches, missing or partial orders',
        kind: 'within',
        limit: 0,
        value:
          verified.batchesBelowZero +
          verified.batchesWhoseLedgerDisagrees +
          (verified.accepted - verified.acceptedPresentAndWhole) +
          verified.invoiceYearsWithGaps +
          verified.orderYearsWithGaps,
        unit: '',
      }),
      checkGoal({
        id: 'pdf.ratio',
        label: 'invoice PDF ms ÷ bare pdfmake',
        kind: 'within',
        limit: 1.3,
        value: pdf.ratio,
        unit: '×',
      }),
      checkGoal({
        id: 'lists.shop.p99',
        label: 'shop order history p99 (2,000 orders)',
        kind: 'under',
        limit: 30,
        value: lists.shopHistory.p99.median,
        unit: 'ms',
      }),
      checkGoal({
        id: 'lists.owner.p99',
        label: 'owner all-orders table p99',
        kind: 'under',
        limit: 30,
        value: lists.ownerTable.p99.median,
        unit: 'ms',
      }),
      checkGoal({
        id: 'client.signIn',
        label: 'sign-in page initial load ÷ framework floor',
        kind: 'within',
        limit: 1.6,
        value: client.signInRatio,
        unit: '×',
      }),
      checkGoal({
        id: 'client.catalogue',
        label: 'catalogue page initial load ÷ framework floor',
        kind: 'within',
        limit: 1.6,
        value: client.catalogueRatio,
        unit: '×',
      }),
      checkGoal({
        id: 'memory.peak',
        label: 'server peak resident memory',
        kind: 'under',
        limit: 300,
        value: Math.max(mem?.peakMb ?? NaN, peakSampled),
        unit: 'MB',
      }),
    ]

    const results = {
      when: new Date().toISOString(),
      machine: { cpus: os.cpus().length, loadAverage: os.loadavg(), node: process.version },
      settings: { roundSeconds: ROUND_S, rounds: ROUNDS },
      scenario: { counts: facts.counts, loadSeconds: facts.loadSeconds },
      catalogue: {
        items: catalogue.items,
        bytes: catalogue.bytes,
        wireBytes: catalogue.wireBytes,
        encoding: catalogue.encoding,
        bareBytes: catalogue.bareBytes,
        app: catalogue.app,
        bare: catalogue.bare,
        ratio: catalogue.ratio,
      },
      orders: {
        app: orders.app,
        bare: orders.bare,
        ratio: orders.ratio,
        mailDrainMs: orders.mailDrainMs,
        acceptedApp: orders.acceptedApp.length,
        acceptedBare: orders.acceptedBare.length,
        verified,
      },
      invoicePdf: pdf,
      orderLists: lists,
      client,
      memory: {
        vmHwmMb: mem?.peakMb ?? null,
        sampledPeakRssMb: peakSampled,
        sampledPeakByPartMb: phasePeakMb,
        atEndOfPart: phaseEndMemory,
      },
      goals,
      seconds: (Date.now() - started) / 1000,
    }
    fs.mkdirSync(path.join(ROOT, 'bench'), { recursive: true })
    fs.writeFileSync(path.join(ROOT, 'bench', 'results.json'), JSON.stringify(results, null, 2) + '\n')

    const rows: string[][] = [['measure', 'app', 'bare / floor', 'ratio', 'goal', 'met']]
    rows.push([
      'catalogue req/s (p50 / p99 ms)',
      `${fmt(catalogue.app.perSecond.median)} ${spread(catalogue.app.perSecond)} (${fmt(catalogue.app.p50.median)} / ${fmt(catalogue.app.p99.median)})`,
      `${fmt(catalogue.bare.perSecond.median)} ${spread(catalogue.bare.perSecond)} (${fmt(catalogue.bare.p50.median)} / ${fmt(catalogue.bare.p99.median)})`,
      fmt(catalogue.ratio, 2),
      '≥ 0.5, p99 < 50 ms',
      goals[0]!.met && goals[1]!.met ? 'yes' : 'NO',
    ])
    rows.push([
      'orders placed/s (p99 ms)',
      `${fmt(orders.app.perSecond.median)} ${spread(orders.app.perSecond)} (${fmt(orders.app.p99.median)})`,
      `${fmt(orders.bare.perSecond.median)} ${spread(orders.bare.perSecond)} (${fmt(orders.bare.p99.median)})`,
      fmt(orders.ratio, 2),
      '≥ 0.4, no oversell',
      goals[2]!.met && goals[3]!.met ? 'yes' : 'NO',
    ])
    rows.push([
      'invoice PDF, 40 lines (ms)',
      `${fmt(pdf.appMs.median, 1)} ${spread(pdf.appMs)}`,
      `${fmt(pdf.bareMs.median, 1)} ${spread(pdf.bareMs)}`,
      fmt(pdf.ratio, 2),
      '≤ 1.3',
      goals[4]!.met ? 'yes' : 'NO',
    ])
    rows.push([
      'shop history p99 (ms)',
      `${fmt(lists.shopHistory.p99.median)} ${spread(lists.shopHistory.p99)}`,
      '',
      '',
      '< 30 ms',
      goals[5]!.met ? 'yes' : 'NO',
    ])
    rows.push([
      'owner orders table p99 (ms)',
      `${fmt(lists.ownerTable.p99.median)} ${spread(lists.ownerTable.p99)}`,
      '',
      '',
      '< 30 ms',
      goals[6]!.met ? 'yes' : 'NO',
    ])
    const floorKb = fmt(client.floorGzipBytes / 1024, 1)
    const kb = (b: number) => fmt(b / 1024, 1)
    rows.push([
      'sign-in page JS+CSS gzip (KB)',
      kb(client.signInGzipBytes),
      floorKb,
      fmt(client.signInRatio, 2),
      '≤ 1.6',
      goals[7]!.met ? 'yes' : 'NO',
    ])
    rows.push([
      'catalogue page JS+CSS gzip (KB)',
      kb(client.catalogueGzipBytes),
      floorKb,
      fmt(client.catalogueRatio, 2),
      '≤ 1.6',
      goals[8]!.met ? 'yes' : 'NO',
    ])
    rows.push([
      'both pages together (KB)',
      kb(client.initialGzipBytes),
      floorKb,
      fmt(client.ratio, 2),
      '',
      '',
    ])
    rows.push([
      'server peak RSS (MB)',
      fmt(goals[9]!.value),
      '',
      '',
      '< 300 MB',
      goals[9]!.met ? 'yes' : 'NO',
    ])
    console.log('\n' + table(rows) + '\n')
    console.log(`Stock check: ${JSON.stringify(verified)}`)
    console.log(
      `Written to bench/results.json in ${fmt(results.seconds)} s (load average ${os
        .loadavg()
        .map((l) => l.toFixed(1))
        .join(' ')}).`,
    )
  } finally {
    if (sampler) clearInterval(sampler)
    if (server && server.exitCode === null) {
      server.kill('SIGTERM')
      await new Promise((r) => server!.once('exit', r))
    }
    await mail?.stop().catch(() => {})
    db.destroy()
    fs.rmSync(base0, { recursive: true, force: true })
  }
}

main().catch((err) => {
  console.error(`[bench] ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`)
  process.exit(1)
})
