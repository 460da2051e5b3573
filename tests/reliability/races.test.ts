/**
 * Requests that arrive together for the same thing: a storm of orders and cancellations on the
 * last cases of a product, confirmations and cancellations of one order at once, the same order
 * shipped twice at once, shipments of many orders at once, one Idempotency-Key from two tabs.
 * After each, the stock ledger balances (tests/reliability/db-state.ts) and no bar is sold twice.
 * (The plain storm and a single key sent twice are in tests/api/orders-concurrency.test.ts.)
 */
import { randomUUID } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { checkInvoiceSeries } from '@shared/domain/invoices/terms'
import { yearOf } from '@shared/domain/dates/dates'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { studioToday } from '@server/modules/availability/availability.service'
import { mailQueueIdle } from '@server/modules/invoices/mail-queue'
import { clientAs } from '@tests/factories/api-client'
import type { ApiClient } from '@tests/factories/api-client'
import { makeOrder, makeSellable } from '@tests/factories/fulfilment'
import { balances, makeProduct, resetShop, setMinimums } from '@tests/factories/orders'
import { ledgerProblems } from './db-state'

const app = createApp({ pruneSessions: false })

let owner: ApiClient
let owner2: ApiClient
let packer: ApiClient
let buyers: ApiClient[] = []

async function rows<T>(sql: string, bind: unknown[] = []): Promise<T[]> {
  return sequelize.query<T & object>(sql, { bind, type: QueryTypes.SELECT }) as Promise<T[]>
}

beforeAll(async () => {
  await setMinimums(0, 0)
  for (const who of ['buyerA', 'buyerB', 'buyerC'] as const) await resetShop(who)
  ;[owner, owner2, packer] = await Promise.all([
    clientAs(app, 'owner'),
    clientAs(app, 'owner'),
    clientAs(app, 'packer'),
  ])
  buyers = await Promise.all(
    (['buyerA', 'buyerB', 'buyerC', 'buyerA', 'buyerB', 'buyerC'] as const).map((w) => clientAs(app, w)),
  )
  await Promise.all([owner, owner2, packer, ...buyers].map((c) => c.token()))
})

// The shipping and invoice e-mails go out after the answers: let them finish before the database closes.
afterAll(() => mailQueueIdle())

const order = (c: ApiClient, productId: number, cases: number, key = randomUUID(), poNumber?: string) =>
  c.post('/api/orders', { lines: [{ productId, cases }], poNumber }, { 'Idempotency-Key': key })

describe('races', () => {
  it('a storm of orders and cancellations on the last cases never sells a bar twice', async () => {
    // 8 cases of 6 in two ready batches.
    const p = await makeProduct({
      casePack: 6,
      batches: [
        { readyInDays: -9, bars: 24 },
        { readyInDays: -3, bars: 24 },
      ],
    })
    // Three orders placed first, to be cancelled in the middle of the storm.
    const early = []
    for (let i = 0; i < 3; i++) {
      const r = await order(buyers[i]!, p.productId, 1)
      expect(r.status, JSON.stringify(r.body)).toBe(201)
      early.push({ id: r.body.order.id as number, by: buyers[i]! })
    }
    const storm = Array.from({ length: 45 }, (_, i) =>
      order(buyers[i % buyers.length]!, p.productId, 1 + (i % 2)),
    )
    const cancels = early.map((o) => o.by.post(`/api/orders/${o.id}/cancel`, { reason: 'Storm test' }))
    const [placed, cancelled] = await Promise.all([Promise.all(storm), Promise.all(cancels)])
    expect(cancelled.map((r) => r.status)).toEqual([200, 200, 200])
    expect(placed.filter((r) => ![201, 409].includes(r.status)).map((r) => [r.status, r.body])).toEqual([])
    const acceptedBars = placed
      .filter((r) => r.status === 201)
      .reduce((n, r) => n + (r.body.order.lines[0].bars as number), 0)
    const stock = await balances(p.batchIds)
    const reserved = stock.reduce((n, b) => n + b.reserved, 0)
    const free = stock.reduce((n, b) => n + b.free, 0)
    expect(reserved).toBe(acceptedBars)
    expect(free + reserved).toBe(48)
    expect(free).toBeLessThan(6) // not even one case was left unsold while orders were refused
    expect(await ledgerProblems(sequelize)).toEqual([])
    console.info(
      `storm: ${placed.filter((r) => r.status === 201).length} of ${placed.length} orders accepted (${acceptedBars} of 48 bars), 3 cancelled during it`,
    )
  })

  it('confirming and cancelling the same order at once: one outcome, bars released once, one live invoice', async () => {
    const soap = await makeSellable(owner, { bars: 600 })
    const outcomes: Record<string, number> = {}
    for (const shop of ['A', 'B', 'A', 'B', 'C', 'B'] as const) {
      const o = await makeOrder({ shop, lines: [{ productId: soap.productId, cases: 2 }], status: 'placed' })
      const buyer = buyers[{ A: 0, B: 1, C: 2 }[shop]]!
      const answers = await Promise.all([
        owner.post(`/api/orders/${o.orderId}/confirm`),
        owner2.post(`/api/orders/${o.orderId}/cancel`, { reason: 'Race' }),
        owner2.post(`/api/orders/${o.orderId}/confirm`),
        buyer.post(`/api/orders/${o.orderId}/cancel`, { reason: 'Race' }),
        owner.post(`/api/orders/${o.orderId}/cancel`, { reason: 'Race' }),
      ])
      expect(answers.filter((r) => ![200, 409].includes(r.status)).map((r) => [r.status, r.body])).toEqual([])
      const [state] = await rows<{ status: string }>('SELECT status FROM orders WHERE id = $1', [o.orderId])
      outcomes[state!.status] = (outcomes[state!.status] ?? 0) + 1
      const cancels = answers.filter((r, i) => [1, 3, 4].includes(i) && r.status === 200)
      expect(cancels.length).toBeLessThanOrEqual(1)
      expect(state!.status === 'cancelled').toBe(cancels.length === 1)
      // Every reserved bar of the order was released once at most, and all of them if it is cancelled.
      const [moves] = await rows<{ reserved: number; released: number }>(
        `SELECT COALESCE(SUM(bars) FILTER (WHERE kind = 'reserved'), 0)::int AS reserved,
                COALESCE(SUM(bars) FILTER (WHERE kind = 'released'), 0)::int AS released
           FROM stock_moves WHERE order_id = $1`,
        [o.orderId],
      )
      expect(moves!.reserved).toBe(12)
      expect(moves!.released).toBe(state!.status === 'cancelled' ? 12 : 0)
      const [inv] = await rows<{ live: number }>(
        `SELECT count(*) FILTER (WHERE kind = 'invoice' AND voided_at IS NULL)::int AS live FROM invoices WHERE order_id = $1`,
        [o.orderId],
      )
      // A prepay account (B) is invoiced at confirmation and the invoice voided when it is cancelled.
      expect(inv!.live).toBe(shop === 'B' && state!.status === 'confirmed' ? 1 : 0)
    }
    expect(await ledgerProblems(sequelize)).toEqual([])
    console.info(`confirm × cancel: outcomes ${JSON.stringify(outcomes)}`)
  })

  it('two packers claim one order, and one order is shipped twice at once: one wins each time', async () => {
    const soap = await makeSellable(owner, { bars: 300 })
    const today = await studioToday()
    for (let i = 0; i < 4; i++) {
      const c = await makeOrder({
        shop: 'A',
        lines: [{ productId: soap.productId, cases: 1 }],
        status: 'confirmed',
      })
      const claims = await Promise.all([
        packer.post(`/api/orders/${c.orderId}/claim`, {}),
        owner.post(`/api/orders/${c.orderId}/claim`, {}),
      ])
      expect(claims.map((r) => r.status).sort()).toEqual([200, 409])

      const p = await makeOrder({
        shop: i % 2 ? 'C' : 'A',
        lines: [{ productId: soap.productId, cases: 1 }],
        status: 'packed',
      })
      const body = (n: number) => ({ carrier: 'UPS', trackingNumber: `TWICE-${i}-${n}`, shipDate: today })
      const ships = await Promise.all([
        packer.post(`/api/orders/${p.orderId}/ship`, body(1)),
        owner.post(`/api/orders/${p.orderId}/ship`, body(2)),
        owner2.post(`/api/orders/${p.orderId}/cancel`, { reason: 'Race with the van' }),
      ])
      expect(ships.filter((r) => ![200, 409].includes(r.status)).map((r) => [r.status, r.body])).toEqual([])
      const [n] = await rows<{ shipments: number; invoices: number; shipped: number; status: string }>(
        `SELECT (SELECT count(*)::int FROM shipments WHERE order_id = $1) AS shipments,
                (SELECT count(*)::int FROM invoices WHERE order_id = $1 AND kind = 'invoice' AND voided_at IS NULL) AS invoices,
                (SELECT COALESCE(SUM(bars), 0)::int FROM stock_moves WHERE order_id = $1 AND kind = 'shipped') AS shipped,
                (SELECT status FROM orders WHERE id = $1) AS status`,
        [p.orderId],
      )
      if (n!.status === 'shipped') {
        expect(ships.slice(0, 2).filter((r) => r.status === 200)).toHaveLength(1)
        expect(n).toMatchObject({ shipments: 1, invoices: 1, shipped: 6 })
      } else {
        expect(n).toMatchObject({ status: 'cancelled', shipments: 0, invoices: 0, shipped: 0 })
      }
    }
    expect(await ledgerProblems(sequelize)).toEqual([])
  })

  it('twelve shipments at once keep the year’s invoice series gapless', async () => {
    const soap = await makeSellable(owner, { bars: 300 })
    const today = await studioToday()
    const packed = []
    for (let i = 0; i < 12; i++)
      packed.push(
        await makeOrder({
          shop: (['A', 'C'] as const)[i % 2]!,
          lines: [{ productId: soap.productId, cases: 1 }],
          status: 'packed',
        }),
      )
    const results = await Promise.all(
      packed.map((o, i) =>
        (i % 2 ? owner : packer).post(`/api/orders/${o.orderId}/ship`, {
          carrier: 'USPS',
          trackingNumber: `GAP-${i}`,
          shipDate: today,
        }),
      ),
    )
    expect(results.map((r) => r.status)).toEqual(packed.map(() => 200))
    const all = await rows<{ seq: number }>('SELECT seq FROM invoices WHERE year = $1', [yearOf(today)])
    expect(checkInvoiceSeries(all.map((r) => r.seq))).toEqual({ missing: [], duplicated: [] })
    expect(await ledgerProblems(sequelize)).toEqual([])
  })

  it('one Idempotency-Key from two tabs: one order, whichever body the second tab sent', async () => {
    const p = await makeProduct({ batches: [{ readyInDays: -5, bars: 120 }] })
    for (let round = 0; round < 4; round++) {
      const key = randomUUID()
      // Two tabs of shop A's buyer; the second one changed the PO before the double click.
      const [a, b] = await Promise.all([
        order(buyers[0]!, p.productId, 1, key, `TAB-${round}`),
        order(buyers[3]!, p.productId, 1, key, `TAB-${round}-changed`),
      ])
      expect([a.status, b.status].sort(), JSON.stringify([a.body, b.body])).toEqual([201, 422])
      const refused = [a, b].find((r) => r.status === 422)!
      expect(refused.body.error.code).toBe('idempotency_key_reused')
      // Shop B may use the same key for an order of its own.
      const other = await order(buyers[1]!, p.productId, 1, key)
      expect(other.status).toBe(201)
      const made = await rows<{ n: number }>(
        'SELECT count(*)::int AS n FROM orders WHERE idempotency_key = $1',
        [key],
      )
      expect(made[0]!.n).toBe(2)
    }
    const [b] = await balances(p.batchIds)
    expect(b).toMatchObject({ free: 120 - 8 * 6, reserved: 8 * 6 })
    expect(await ledgerProblems(sequelize)).toEqual([])
  })
})
