import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  planAllocation,
  type AllocationBatch,
  type AllocationLine,
  type AllocationPlan,
} from '@shared/domain/allocation/allocation'

const today = '2026-12-01'

describe('planAllocation', () => {
  it.each([
    {
      lines: [{ lineKey: 'a', productId: 1, bars: 30 }],
      batches: [
        { batchId: 7, productId: 1, readyDate: '2026-11-20', freeBars: 24 },
        { batchId: 3, productId: 1, readyDate: '2026-11-25', freeBars: 24 },
        { batchId: 5, productId: 1, readyDate: '2026-11-10', freeBars: 12 },
      ],
      expected: {
        ok: true,
        allocations: [
          { lineKey: 'a', batchId: 5, bars: 12 },
          { lineKey: 'a', batchId: 7, bars: 18 },
        ],
      },
      source: 'hand calculation: oldest ready date first',
    },
    {
      lines: [{ lineKey: 1, productId: 1, bars: 20 }],
      batches: [
        { batchId: 9, productId: 1, readyDate: '2026-11-20', freeBars: 12 },
        { batchId: 4, productId: 1, readyDate: '2026-11-20', freeBars: 12 },
      ],
      expected: {
        ok: true,
        allocations: [
          { lineKey: 1, batchId: 4, bars: 12 },
          { lineKey: 1, batchId: 9, bars: 8 },
        ],
      },
      source: 'product rule: same ready date, lower batch id first',
    },
    {
      lines: [
        { lineKey: 1, productId: 1, bars: 12 },
        { lineKey: 2, productId: 2, bars: 6 },
        { lineKey: 3, productId: 1, bars: 12 },
      ],
      batches: [
        { batchId: 1, productId: 1, readyDate: '2026-11-01', freeBars: 18 },
        { batchId: 2, productId: 1, readyDate: '2026-11-15', freeBars: 18 },
        { batchId: 3, productId: 2, readyDate: '2026-11-15', freeBars: 6 },
      ],
      expected: {
        ok: true,
        allocations: [
          { lineKey: 1, batchId: 1, bars: 12 },
          { lineKey: 2, batchId: 3, bars: 6 },
          { lineKey: 3, batchId: 1, bars: 6 },
          { lineKey: 3, batchId: 2, bars: 6 },
        ],
      },
      source: 'hand calculation: two lines of one product share its stock',
    },
    {
      lines: [{ lineKey: 1, productId: 1, bars: 12 }],
      batches: [
        { batchId: 1, productId: 1, readyDate: '2026-12-01', freeBars: 12 },
        { batchId: 2, productId: 1, readyDate: '2026-11-01', freeBars: 0 },
      ],
      expected: { ok: true, allocations: [{ lineKey: 1, batchId: 1, bars: 12 }] },
      source: 'product rule: a batch ready today may be sold; an empty batch gets no allocation',
    },
    {
      lines: [{ lineKey: 1, productId: 1, bars: 24 }],
      batches: [
        { batchId: 1, productId: 1, readyDate: '2026-11-01', freeBars: 12 },
        { batchId: 2, productId: 1, readyDate: '2026-12-02', freeBars: 48 },
      ],
      expected: { ok: false, shortfall: [{ productId: 1, requestedBars: 24, readyBars: 12 }] },
      source: 'product rule: a batch still curing is never promised',
    },
    {
      lines: [
        { lineKey: 1, productId: 1, bars: 12 },
        { lineKey: 2, productId: 2, bars: 6 },
        { lineKey: 3, productId: 1, bars: 12 },
        { lineKey: 4, productId: 3, bars: 12 },
      ],
      batches: [
        { batchId: 1, productId: 1, readyDate: '2026-11-01', freeBars: 18 },
        { batchId: 2, productId: 2, readyDate: '2026-11-01', freeBars: 6 },
      ],
      expected: {
        ok: false,
        shortfall: [
          { productId: 1, requestedBars: 24, readyBars: 18 },
          { productId: 3, requestedBars: 12, readyBars: 0 },
        ],
      },
      source: 'hand calculation: every product short is listed, with its lines summed',
    },
    {
      lines: [],
      batches: [],
      expected: { ok: true, allocations: [] },
      source: 'hand calculation: nothing asked',
    },
  ] as { lines: AllocationLine[]; batches: AllocationBatch[]; expected: AllocationPlan; source: string }[])(
    '$source',
    ({ lines, batches, expected }) => {
      expect(planAllocation(lines, batches, today)).toEqual(expected)
    },
  )

  it('does not change its inputs (hand calculation)', () => {
    const batches = [{ batchId: 1, productId: 1, readyDate: '2026-11-01', freeBars: 18 }]
    planAllocation([{ lineKey: 1, productId: 1, bars: 12 }], batches, today)
    expect(batches[0]?.freeBars).toBe(18)
  })

  it.each([
    {
      lines: [{ lineKey: 1, productId: 1, bars: 0 }],
      batches: [],
      code: 'invalid_bars',
      field: 'lines.0.bars',
      source: 'bad input',
    },
    {
      lines: [{ lineKey: 1, productId: 1, bars: 1.5 }],
      batches: [],
      code: 'invalid_bars',
      field: 'lines.0.bars',
      source: 'bad input',
    },
    {
      lines: [
        { lineKey: 1, productId: 1, bars: 6 },
        { lineKey: 1, productId: 2, bars: 6 },
      ],
      batches: [],
      code: 'duplicate_line',
      field: 'lines.1.lineKey',
      source: 'bad input',
    },
    {
      lines: [],
      batches: [{ batchId: 1, productId: 1, readyDate: '2026-11-01', freeBars: -2 }],
      code: 'invalid_bars',
      field: 'batches.0.freeBars',
      source: 'bad input',
    },
    {
      lines: [],
      batches: [
        { batchId: 1, productId: 1, readyDate: '2026-11-01', freeBars: 2 },
        { batchId: 1, productId: 1, readyDate: '2026-11-01', freeBars: 2 },
      ],
      code: 'duplicate_batch',
      field: 'batches.1.batchId',
      source: 'bad input',
    },
  ] as {
    lines: AllocationLine[]
    batches: AllocationBatch[]
    code: string
    field: string
    source: string
  }[])('rejects $code at $field ($source)', ({ lines, batches, code, field }) => {
    expect(() => planAllocation(lines, batches, today)).toThrow(expect.objectContaining({ code, field }))
  })
})

describe('planAllocation properties', () => {
  const batchArb = fc.uniqueArray(
    fc.record({
      batchId: fc.integer({ min: 1, max: 40 }),
      productId: fc.integer({ min: 1, max: 3 }),
      readyDate: fc.constantFrom('2026-11-01', '2026-11-20', '2026-12-01', '2026-12-02'),
      freeBars: fc.integer({ min: 0, max: 30 }),
    }),
    { selector: (b) => b.batchId, maxLength: 8 },
  )
  const linesArb = fc
    .array(fc.record({ productId: fc.integer({ min: 1, max: 3 }), bars: fc.integer({ min: 1, max: 40 }) }), {
      maxLength: 5,
    })
    .map((ls) => ls.map((l, i) => ({ lineKey: i, ...l })))

  it('covers each line exactly, from ready batches, never past a batch’s free bars (property)', () => {
    fc.assert(
      fc.property(linesArb, batchArb, (lines, batches) => {
        const plan = planAllocation(lines, batches, today)
        const ready = batches.filter((b) => b.readyDate <= today)
        const coverable = lines.every((line) => {
          const asked = lines.filter((l) => l.productId === line.productId).reduce((n, l) => n + l.bars, 0)
          return (
            asked <= ready.filter((b) => b.productId === line.productId).reduce((n, b) => n + b.freeBars, 0)
          )
        })
        expect(plan.ok).toBe(coverable)
        if (!plan.ok) {
          for (const s of plan.shortfall) {
            const readyBars = ready
              .filter((b) => b.productId === s.productId)
              .reduce((n, b) => n + b.freeBars, 0)
            expect(s.readyBars).toBe(readyBars)
            expect(s.requestedBars).toBeGreaterThan(readyBars)
          }
          return
        }
        for (const line of lines) {
          const got = plan.allocations
            .filter((a) => a.lineKey === line.lineKey)
            .reduce((n, a) => n + a.bars, 0)
          expect(got).toBe(line.bars)
        }
        for (const batch of batches) {
          const taken = plan.allocations
            .filter((a) => a.batchId === batch.batchId)
            .reduce((n, a) => n + a.bars, 0)
          expect(taken).toBeLessThanOrEqual(batch.freeBars)
          if (taken > 0) expect(batch.readyDate <= today).toBe(true)
        }
        for (const a of plan.allocations) {
          const batch = batches.find((b) => b.batchId === a.batchId)
          const line = lines.find((l) => l.lineKey === a.lineKey)
          expect(batch?.productId).toBe(line?.productId)
          expect(a.bars).toBeGreaterThan(0)
        }
      }),
      { numRuns: 500 },
    )
  })
})
