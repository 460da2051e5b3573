/**
 * The stock ledger's invariants, against the real database through the API: whatever sequence of
 * write-offs and count corrections arrives, no balance goes below zero, a refused move changes
 * nothing, and batch_stock always equals the sums of stock_moves. The ledger itself cannot be
 * edited: its rows are only ever inserted.
 */
import fc from 'fast-check'
import { QueryTypes } from 'sequelize'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { getSettings } from '@server/modules/settings/settings.service'
import { addDays, isoToday } from '@shared/domain/dates/dates'
import { applyMove } from '@shared/domain/stock/ledger'
import type { StockBalance } from '@shared/domain/stock/ledger'
import { clientAs } from '@tests/factories/api-client'
import type { ApiClient } from '@tests/factories/api-client'
import { makePourable } from '@tests/factories/production'
import type { Pourable } from '@tests/factories/production'

const app = createApp({ pruneSessions: false })
let owner: ApiClient
let packer: ApiClient
let product: Pourable
let today: string
let pours = 0

beforeAll(async () => {
  ;[owner, packer] = await Promise.all([clientAs(app, 'owner'), clientAs(app, 'packer')])
  product = await makePourable()
  today = isoToday(new Date(), (await getSettings()).timeZone)
})

/** A fresh batch of 12 sellable bars; pour dates step back a day every 90 pours (lot numbers run 1–99 a day). */
async function freshBatch(): Promise<number> {
  const pourDate = addDays(today, -1 - Math.floor(pours++ / 90))
  const r = await owner.post('/api/batches', {
    productId: product.productId,
    pourDate,
    barsCut: 14,
    barsKeptBack: 2,
  })
  if (r.status !== 201) throw new Error(`pour failed: ${r.status} ${JSON.stringify(r.body)}`)
  return r.body.batch.id as number
}

async function ledger(batchId: number) {
  const [row] = await sequelize.query<{
    free: number
    reserved: number
    sum_free: number
    sum_reserved: number
    negative: number
  }>(
    `SELECT s.free, s.reserved,
            (SELECT COALESCE(SUM(free_delta), 0)::int FROM stock_moves WHERE batch_id = $1) AS sum_free,
            (SELECT COALESCE(SUM(reserved_delta), 0)::int FROM stock_moves WHERE batch_id = $1) AS sum_reserved,
            (SELECT count(*)::int FROM batch_stock WHERE free < 0 OR reserved < 0) AS negative
       FROM batch_stock s WHERE s.batch_id = $1`,
    { bind: [batchId], type: QueryTypes.SELECT },
  )
  return row!
}

const moveArb = fc.oneof(
  fc.record({
    kind: fc.constant('written_off' as const),
    reason: fc.constantFrom('damaged', 'sweating', 'spots', 'sample'),
    bars: fc.integer({ min: 1, max: 15 }),
  }),
  fc.record({
    kind: fc.constant('adjusted' as const),
    reason: fc.constant('recount'),
    bars: fc.integer({ min: -15, max: 15 }).filter((n) => n !== 0),
  }),
)

describe('the stock ledger', () => {
  it('never drives a balance below zero, and batch_stock always equals the sum of the moves (property)', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(moveArb, { minLength: 1, maxLength: 10 }),
        fc.boolean(),
        async (moves, asPacker) => {
          const batchId = await freshBatch()
          let model: StockBalance = { free: 12, reserved: 0, onHand: 12 }
          for (const move of moves) {
            let expected: StockBalance | null
            try {
              expected = applyMove(model, move.kind, move.bars)
            } catch {
              expected = null
            }
            const r = await (asPacker ? packer : owner).post(`/api/batches/${batchId}/moves`, move)
            if (expected) {
              expect(r.status).toBe(201)
              expect(r.body.stock).toEqual(expected)
              model = expected
            } else {
              expect(r.status).toBe(409)
              expect(r.body.error).toMatchObject({
                code: 'stock_negative',
                details: [expect.objectContaining({ field: 'bars' })],
              })
            }
            const l = await ledger(batchId)
            expect(l.free).toBe(model.free)
            expect(l.free).toBeGreaterThanOrEqual(0)
            expect([l.free, l.reserved]).toEqual([l.sum_free, l.sum_reserved])
            expect(l.negative).toBe(0)
          }
        },
      ),
      { numRuns: 30 },
    )
  })

  it('lets only as many concurrent write-offs through as there are bars', async () => {
    const batchId = await freshBatch()
    const results = await Promise.all(
      Array.from({ length: 10 }, () =>
        packer.post(`/api/batches/${batchId}/moves`, { kind: 'written_off', reason: 'damaged', bars: 5 }),
      ),
    )
    const statuses = results.map((r) => r.status).sort()
    // 12 bars: two write-offs of 5 fit, the third would leave −3.
    expect(statuses).toEqual([201, 201, ...Array(8).fill(409)])
    expect(await ledger(batchId)).toMatchObject({ free: 2, sum_free: 2 })
  })

  it('refuses to change or delete a move, and batch_stock refuses a negative balance', async () => {
    const batchId = await freshBatch()
    await expect(
      sequelize.query('UPDATE stock_moves SET bars = 999 WHERE batch_id = $1', { bind: [batchId] }),
    ).rejects.toThrow(/stock_moves is append-only/)
    await expect(
      sequelize.query('DELETE FROM stock_moves WHERE batch_id = $1', { bind: [batchId] }),
    ).rejects.toThrow(/stock_moves is append-only/)
    await expect(
      sequelize.query(
        `INSERT INTO stock_moves (batch_id, kind, bars, free_delta, reserved_delta) VALUES ($1, 'written_off', 13, -13, 0)`,
        { bind: [batchId] },
      ),
    ).rejects.toThrow(/batch_stock_free_check/)
    await expect(
      sequelize.query('UPDATE batch_stock SET free = -1 WHERE batch_id = $1', { bind: [batchId] }),
    ).rejects.toThrow(/batch_stock_free_check/)
    expect(await ledger(batchId)).toMatchObject({ free: 12, sum_free: 12 })
  })
})
