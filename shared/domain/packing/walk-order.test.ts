import { describe, expect, it } from 'vitest'
import { compareWalk, walkOrder } from '@shared/domain/packing/walk-order'
import type { WalkKey } from '@shared/domain/packing/walk-order'

const stop = (location: string | null, sku: string, readyDate: string, batchId = 1): WalkKey => ({
  location,
  sku,
  readyDate,
  batchId,
})

describe('walkOrder: shelf location, then SKU, then lot age', () => {
  // The rows name where their expected order comes from.
  it.each([
    [
      'location before SKU (common practice: a pick path follows the shelves)',
      [stop('Rack B, shelf 1', 'AAA', '2026-11-01'), stop('Rack A, shelf 2', 'ZZZ', '2026-11-02')],
      ['Rack A, shelf 2', 'Rack B, shelf 1'],
    ],
    [
      'numbers in a location by value, as people read shelf labels (common practice)',
      [stop('Rack 10', 'A', '2026-11-01'), stop('Rack 2', 'A', '2026-11-01', 2)],
      ['Rack 2', 'Rack 10'],
    ],
    [
      'case does not part one shelf (common practice)',
      [
        stop('rack c', 'B', '2026-11-01'),
        stop('Rack C', 'A', '2026-11-01', 2),
        stop('Rack D', 'A', '2026-11-01', 3),
      ],
      ['Rack C', 'rack c', 'Rack D'],
    ],
    [
      'no location last, blank counts as none (the packer has to look for it)',
      [stop(null, 'A', '2026-10-01'), stop('  ', 'A', '2026-10-01', 2), stop('Rack Z', 'Z', '2026-11-01', 3)],
      ['Rack Z', null, '  '],
    ],
  ])('%s', (_name, stops, expected) => {
    expect(walkOrder(stops).map((s) => s.location)).toEqual(expected)
  })

  it.each([
    [
      'same shelf: by SKU',
      [stop('Rack A', 'LAV', '2026-10-01', 1), stop('Rack A', 'CDR', '2026-11-01', 2)],
      [2, 1],
    ],
    [
      'same shelf and SKU: the older lot (earlier ready date) first, as allocation takes it',
      [stop('Rack A', 'LAV', '2026-11-20', 1), stop('Rack A', 'LAV', '2026-11-02', 2)],
      [2, 1],
    ],
    [
      'same ready date: the older batch first',
      [stop('Rack A', 'LAV', '2026-11-02', 9), stop('Rack A', 'LAV', '2026-11-02', 4)],
      [4, 9],
    ],
    [
      'without a location: still by SKU, then age',
      [
        stop(null, 'ORP', '2026-11-02', 1),
        stop(null, 'HNY', '2026-11-09', 2),
        stop(null, 'HNY', '2026-11-01', 3),
      ],
      [3, 2, 1],
    ],
  ])('%s', (_name, stops, expected) => {
    expect(walkOrder(stops).map((s) => s.batchId)).toEqual(expected)
  })

  it('is a total order: equal keys compare 0, and sorting leaves the input alone', () => {
    const a = stop('Rack A', 'LAV', '2026-11-02', 3)
    expect(compareWalk(a, { ...a })).toBe(0)
    const input = [stop('Rack B', 'A', '2026-11-01', 1), stop('Rack A', 'A', '2026-11-01', 2)]
    walkOrder(input)
    expect(input.map((s) => s.batchId)).toEqual([1, 2])
  })
})
