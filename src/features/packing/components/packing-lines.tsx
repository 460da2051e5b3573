import type { PackingLine } from '@shared/schemas/packing'
import { Badge } from '@/components/ui/badge'

/**
 * The order's lines as the bench packs them: SKU, cases and bars, and the batch lots the bars
 * come from (with where each lot sits). The ticks are the packer's own, on this screen only.
 */
export function PackingLines({ lines, tickable }: { lines: PackingLine[]; tickable: boolean }) {
  return (
    <ul className="divide-y divide-cream-200">
      {lines.map((l) => {
        const short = l.allocatedBars !== l.bars
        return (
          <li key={l.orderLineId} className="flex flex-col gap-3 py-3 sm:flex-row sm:items-start sm:gap-4">
            <div className="flex min-w-0 flex-1 items-start gap-3">
              {tickable ? (
                <input
                  type="checkbox"
                  id={`packed-line-${l.orderLineId}`}
                  className="mt-0.5 size-5 shrink-0 cursor-pointer accent-olive-700 sm:size-4"
                  aria-label={`Packed ${l.sku} ${l.name}`}
                />
              ) : null}
              <div className="min-w-0">
                <p className="font-medium text-ink-900">
                  <span className="font-mono">{l.sku}</span> · {l.name}
                </p>
                <p className="text-sm text-ink-700">
                  {l.cases} {l.cases === 1 ? 'case' : 'cases'} of {l.casePack} ={' '}
                  <strong className="font-medium text-ink-900">{l.bars} bars</strong>
                </p>
                {short ? (
                  <Badge tone="honey" className="mt-1">
                    {l.allocatedBars} of {l.bars} bars set aside: waiting for curing stock
                  </Badge>
                ) : null}
              </div>
            </div>
            <ul className="flex flex-col gap-1 sm:w-80" aria-label={`Batch lots for ${l.sku}`}>
              {l.lots.map((lot) => (
                <li
                  key={lot.batchId}
                  className="flex items-baseline justify-between gap-3 rounded-md bg-cream-50 px-2.5 py-1.5 text-sm"
                >
                  <span>
                    <span className="font-mono font-medium text-ink-900">{lot.lotCode}</span>
                    <span className="block text-xs text-ink-600">{lot.location ?? 'No location set'}</span>
                  </span>
                  <span className="font-medium text-ink-900 tabular-nums">× {lot.bars}</span>
                </li>
              ))}
            </ul>
          </li>
        )
      })}
    </ul>
  )
}
