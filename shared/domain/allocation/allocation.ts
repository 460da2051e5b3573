import { DomainError } from '@shared/domain/errors'
import { batchReadiness } from '@shared/domain/availability/availability'
import { compareIso } from '@shared/domain/dates/dates'

export interface AllocationLine {
  lineKey: string | number
  productId: number
  bars: number
}

export interface AllocationBatch {
  batchId: number
  productId: number
  readyDate: string
  freeBars: number
}

export interface Allocation {
  lineKey: string | number
  batchId: number
  bars: number
}

export interface Shortfall {
  productId: number
  requestedBars: number
  readyBars: number
}

export type AllocationPlan = { ok: true; allocations: Allocation[] } | { ok: false; shortfall: Shortfall[] }

/**
 * Which ready batches fill which order lines. Oldest ready date first (ties by batch id) so stock
 * rotates and the lot on a packing slip is predictable. Curing batches are never promised. Either
 * every line is covered or nothing is: the shortfall names every product that ready stock cannot
 * cover, with the bars asked for summed over its lines. The server runs this on rows it has
 * locked and writes one `reserved` move per allocation.
 */
export function planAllocation(
  lines: readonly AllocationLine[],
  batches: readonly AllocationBatch[],
  today: string,
): AllocationPlan {
  const lineKeys = new Set<string | number>()
  lines.forEach((line, i) => {
    if (!Number.isSafeInteger(line.bars) || line.bars < 1) {
      throw new DomainError(
        'invalid_bars',
        `Bars must be a whole number ≥ 1 (got ${line.bars})`,
        `lines.${i}.bars`,
      )
    }
    if (lineKeys.has(line.lineKey)) {
      throw new DomainError(
        'duplicate_line',
        `Line ${String(line.lineKey)} appears twice`,
        `lines.${i}.lineKey`,
      )
    }
    lineKeys.add(line.lineKey)
  })

  const queues = new Map<number, { batchId: number; readyDate: string; left: number }[]>()
  const batchIds = new Set<number>()
  batches.forEach((batch, i) => {
    if (!Number.isSafeInteger(batch.freeBars) || batch.freeBars < 0) {
      throw new DomainError(
        'invalid_bars',
        `Free bars must be a whole number ≥ 0 (got ${batch.freeBars})`,
        `batches.${i}.freeBars`,
      )
    }
    if (batchIds.has(batch.batchId)) {
      throw new DomainError('duplicate_batch', `Batch ${batch.batchId} appears twice`, `batches.${i}.batchId`)
    }
    batchIds.add(batch.batchId)
    if (batchReadiness(batch, today) !== 'ready' || batch.freeBars === 0) return
    const queue = queues.get(batch.productId) ?? []
    queue.push({ batchId: batch.batchId, readyDate: batch.readyDate, left: batch.freeBars })
    queues.set(batch.productId, queue)
  })
  for (const queue of queues.values()) {
    queue.sort((a, b) => compareIso(a.readyDate, b.readyDate) || a.batchId - b.batchId)
  }

  const requested = new Map<number, number>()
  for (const line of lines) requested.set(line.productId, (requested.get(line.productId) ?? 0) + line.bars)
  const shortfall: Shortfall[] = []
  for (const [productId, requestedBars] of requested) {
    const readyBars = (queues.get(productId) ?? []).reduce((sum, b) => sum + b.left, 0)
    if (requestedBars > readyBars) shortfall.push({ productId, requestedBars, readyBars })
  }
  if (shortfall.length > 0) return { ok: false, shortfall }

  const allocations: Allocation[] = []
  for (const line of lines) {
    let needed = line.bars
    for (const batch of queues.get(line.productId) ?? []) {
      if (needed === 0) break
      const take = Math.min(needed, batch.left)
      if (take === 0) continue
      batch.left -= take
      needed -= take
      allocations.push({ lineKey: line.lineKey, batchId: batch.batchId, bars: take })
    }
  }
  return { ok: true, allocations }
}
