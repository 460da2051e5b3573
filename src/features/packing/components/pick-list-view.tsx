import { formatDate } from '@shared/domain/dates/dates'
import type { PickListDto } from '@shared/schemas/packing'

/**
 * The pick list on screen: per product, the lots to pull from in the order they were allocated
 * (oldest batch first), where each lot sits, and a tick per lot for the walk along the racks.
 */
export function PickListView({ list }: { list: PickListDto }) {
  if (list.products.length === 0) {
    return <p className="text-sm text-ink-700">No bars are set aside for these orders yet.</p>
  }
  return (
    <div className="flex flex-col gap-5">
      <p className="text-sm text-ink-700">
        {list.orders.map((o) => o.number).join(', ')}: {list.totalBars} bars in {list.totalCases}{' '}
        {list.totalCases === 1 ? 'case' : 'cases'}.
      </p>
      {list.products.map((p) => (
        <section key={p.productId} aria-labelledby={`pick-${p.productId}`} className="flex flex-col gap-2">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h3 id={`pick-${p.productId}`} className="font-medium text-ink-900">
              <span className="font-mono">{p.sku}</span> {p.name}
            </h3>
            <p className="text-sm text-ink-700 tabular-nums">
              {p.bars} bars · {p.cases} {p.cases === 1 ? 'case' : 'cases'} of {p.casePack}
            </p>
          </div>
          <ul className="divide-y divide-cream-200 rounded-md ring-1 ring-cream-300">
            {p.lots.map((lot) => (
              <li
                key={lot.batchId}
                className="flex flex-col gap-1 px-3 py-2 sm:flex-row sm:items-center sm:gap-4"
              >
                <label className="flex min-w-0 flex-1 cursor-pointer items-center gap-3">
                  <input type="checkbox" className="size-5 shrink-0 accent-olive-700 sm:size-4" />
                  <span className="font-mono text-sm font-medium text-ink-900">{lot.lotCode}</span>
                  <span className="sr-only">pulled</span>
                </label>
                <span className="text-sm text-ink-800">{lot.location ?? 'No location set'}</span>
                <span className="text-sm text-ink-600">ready {formatDate(lot.readyDate)}</span>
                <span className="text-sm font-medium text-ink-900 tabular-nums sm:w-16 sm:text-right">
                  {lot.bars} bars
                </span>
                <span className="text-sm text-ink-700 sm:w-56">
                  {lot.orders.map((o) => `${o.number} × ${o.bars}`).join(', ')}
                </span>
              </li>
            ))}
          </ul>
        </section>
      ))}
    </div>
  )
}
