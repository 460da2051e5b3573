/**
 * Many buyers at once against a few cases of ready stock: the row locks and the ledger's CHECKs
 * must let exactly as many orders through as the stock covers, never a bar more, and the ledger
 * must still add up. And one Idempotency-Key sent twice at the same instant makes one order.
 */
import { randomUUID } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { clientAs } from '@tests/factories/api-client'
import type { ApiClient } from '@tests/factories/api-client'
import { balances, makeProduct, resetShop, setMinimums } from '@tests/factories/orders'

const app = createApp({ pruneSessions: false })

/** Several sessions per shop: two buyers signed in twice each in three shops. */
let sessions: ApiClient[] = []

beforeAll(async () => {
  await setMinimums(0, 0)
  for (const who of ['buyerA', 'buyerB', 'buyerC'] as const) await resetShop(who)
  const callers = ['buyerA', 'buyerB', 'buyerC', 'buyerA', 'buyerB', 'buyerC'] as const
  sessions = await Promise.all(callers.map((who) => clientAs(app, who)))
  // Fetch every session's CSRF token now, so the requests below leave together.
  await Promise.all(sessions.map((s) => s.token()))
})

describe('placing orders concurrently', () => {
  it('60 simultaneous orders for 5 cases of stock: 5 accepted, 55 refused, the ledger adds up', async () => {
    // 30 bars = 5 cases of 6, in two ready batches (so allocations cross batches), plus a curing
    // batch that must never be touched.
    const p = await makeProduct({
      casePack: 6,
      batches: [
        { readyInDays: -12, bars: 18 },
        { readyInDays: -2, bars: 12 },
        { readyInDays: 15, bars: 60 },
      ],
    })
    const attempts = 60
    const started = Date.now()
    const answers = await Promise.all(
      Array.from({ length: attempts }, (_, i) =>
        sessions[i % sessions.length]!.post(
          '/api/orders',
          { lines: [{ productId: p.productId, cases: 1 }], poNumber: `RUSH-${i}` },
          { 'Idempotency-Key': randomUUID() },
        ),
      ),
    )
    const elapsedMs = Date.now() - started
    const accepted = answers.filter((r) => r.status === 201)
    const refused = answers.filter((r) => r.status === 409)
    const other = answers.filter((r) => r.status !== 201 && r.status !== 409)
    expect(other.map((r) => [r.status, r.body])).toEqual([])
    expect(accepted).toHaveLength(5)
    expect(refused).toHaveLength(attempts - 5)
    for (const r of refused) {
      expect(r.body.error.code).toBe('insufficient_stock')
      expect(r.body.error.details).toEqual([
        { productId: p.productId, requestedBars: 6, readyBars: expect.any(Number) },
      ])
      expect(r.body.error.details[0].readyBars).toBeLessThan(6)
    }

    const acceptedBars = accepted.reduce((n, r) => n + (r.body.order.lines[0].bars as number), 0)
    expect(acceptedBars).toBe(30)
    const [ready1, ready2, curing] = await balances(p.batchIds)
    expect([ready1!.free, ready1!.reserved, ready2!.free, ready2!.reserved]).toEqual([0, 18, 0, 12])
    expect([curing!.free, curing!.reserved]).toEqual([60, 0])
    for (const b of [ready1!, ready2!, curing!]) {
      expect(b.free).toBeGreaterThanOrEqual(0)
      expect([b.free, b.reserved]).toEqual([b.movesFree, b.movesReserved])
    }
    // Every accepted order's allocations match its reserved moves; the refused ones wrote none.
    const [moves] = await sequelize.query<{ orders: number; bars: number }>(
      `SELECT count(DISTINCT order_id)::int AS orders, COALESCE(SUM(bars), 0)::int AS bars
         FROM stock_moves WHERE kind = 'reserved' AND batch_id = ANY($1::int[])`,
      { bind: [p.batchIds], type: QueryTypes.SELECT },
    )
    expect(moves).toEqual({ orders: 5, bars: 30 })
    const [allocs] = await sequelize.query<{ bars: number }>(
      `SELECT COALESCE(SUM(bars), 0)::int AS bars FROM allocations WHERE batch_id = ANY($1::int[])`,
      { bind: [p.batchIds], type: QueryTypes.SELECT },
    )
    expect(allocs!.bars).toBe(30)
    // Distinct, consecutive order numbers.
    const numbers = accepted.map((r) => r.body.order.number as string)
    expect(new Set(numbers).size).toBe(5)
    console.info(
      `concurrency: ${attempts} orders in ${elapsedMs} ms, ${accepted.length} accepted (${acceptedBars} bars), ${refused.length} refused; ` +
        `batches free/reserved ${ready1!.free}/${ready1!.reserved}, ${ready2!.free}/${ready2!.reserved}, curing ${curing!.free}/${curing!.reserved}`,
    )
  })

  it('orders of mixed sizes never take more bars than ready stock', async () => {
    const p = await makeProduct({
      casePack: 4,
      batches: [
        { readyInDays: -5, bars: 22 },
        { readyInDays: -1, bars: 19 },
      ],
    })
    const sizes = Array.from({ length: 54 }, (_, i) => 1 + (i % 3))
    const answers = await Promise.all(
      sizes.map((cases, i) =>
        sessions[i % sessions.length]!.post(
          '/api/orders',
          { lines: [{ productId: p.productId, cases }] },
          { 'Idempotency-Key': randomUUID() },
        ),
      ),
    )
    expect(answers.filter((r) => r.status !== 201 && r.status !== 409).map((r) => r.body)).toEqual([])
    const acceptedBars = answers
      .filter((r) => r.status === 201)
      .reduce((n, r) => n + (r.body.order.lines[0].bars as number), 0)
    const stock = await balances(p.batchIds)
    const free = stock.reduce((n, b) => n + b.free, 0)
    // 41 bars: whatever got in, reserved + free is still 41, and what is left is too little for a 1-case order.
    expect(acceptedBars).toBeLessThanOrEqual(41)
    expect(stock.reduce((n, b) => n + b.reserved, 0)).toBe(acceptedBars)
    expect(free + acceptedBars).toBe(41)
    expect(free).toBeLessThan(4)
    for (const b of stock) expect([b.free, b.reserved]).toEqual([b.movesFree, b.movesReserved])
    console.info(
      `mixed sizes: ${answers.filter((r) => r.status === 201).length} of ${sizes.length} accepted, ${acceptedBars} of 41 bars, ${free} left free`,
    )
  })

  it('the same Idempotency-Key sent twice at the same instant makes one order', async () => {
    const p = await makeProduct({ batches: [{ readyInDays: -5, bars: 60 }] })
    for (let round = 0; round < 5; round++) {
      const headers = { 'Idempotency-Key': randomUUID() }
      const body = { lines: [{ productId: p.productId, cases: 1 }], poNumber: `TWICE-${round}` }
      // Two sessions of the same shop, as a double click in two tabs would be.
      const [a, b] = await Promise.all([
        sessions[0]!.post('/api/orders', body, headers),
        sessions[3]!.post('/api/orders', body, headers),
      ])
      expect([a.status, b.status].sort()).toEqual([200, 201])
      expect(a.body.order.id).toBe(b.body.order.id)
      const [made] = await sequelize.query<{ n: number }>(
        `SELECT count(*)::int AS n FROM orders WHERE idempotency_key = $1`,
        { bind: [headers['Idempotency-Key']], type: QueryTypes.SELECT },
      )
      expect(made!.n).toBe(1)
    }
    // Five orders of one case each: 30 bars reserved, no more.
    const [b] = await balances(p.batchIds)
    expect(b).toMatchObject({ free: 30, reserved: 30, movesFree: 30, movesReserved: 30 })
  })
})
