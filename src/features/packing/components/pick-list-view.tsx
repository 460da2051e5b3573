import { formatDate } from '@shared/domain/dates/dates'
import type { PickListDto, PickStop } from '@shared/schemas/packing'

/** Consecutive stops on one shelf, in walking order. */
function byShelf(stops: PickStop[]) {
  const shelves: { location: string | null; stops: PickStop[] }[] = []
  for (const stop of stops) {
    const location = stop.location?.trim() ? stop.location.trim() : null
    const last = shelves.at(-1)
    if (last && (last.location ?? '').toLowerCase() === (location ?? '').toLowerCase()) last.stops.push(stop)
    else shelves.push({ location, stops: [stop] })
  }
  return shelves
}

/**
 * The pick list on screen, in the order to walk the shelves: shelf by shelf (by location, then
 * SKU, then the older lot first; lots without a location last), each lot with its bars, the orders
 * they go to, and a tick for the walk.
 */
export function PickListView({ list }: { list: PickListDto }) {
  if (list.stops.length === 0) {
    return <p className="text-sm text-ink-700">No bars are set aside for these orders yet.</p>
  }
  return (
    <div className="flex flex-col gap-5">
      <p className="text-sm text-ink-700">
        {list.orders.map((o) => o.number).join(', ')}: {list.totalBars} bars in {list.totalCases}{' '}
        {list.totalCases === 1 ? 'case' : 'cases'}, {list.products.length}{' '}
        {list.products.length === 1 ? 'product' : 'products'}.
      </p>
      {byShelf(list.stops).map((shelf, i) => (
        <section
          key={`${shelf.location}-${i}`}
          aria-labelledby={`shelf-${i}`}
          className="flex flex-col gap-2"
        >
          <h3 id={`shelf-${i}`} className="font-medium text-ink-900">
            {shelf.location ?? 'No location set'}
          </h3>
          <ul
            aria-label={`Lots on ${shelf.location ?? 'no shelf'}`}
            className="divide-y divide-cream-200 rounded-md ring-1 ring-cream-300"
          >
            {shelf.stops.map((stop) => (
              <li
                key={stop.batchId}
                className="flex flex-col gap-1 px-3 py-2 sm:flex-row sm:items-center sm:gap-4"
              >
                <label className="flex min-w-0 flex-1 cursor-pointer items-center gap-3">
                  <input type="checkbox" className="size-5 shrink-0 accent-olive-700 sm:size-4" />
                  <span className="min-w-0">
                    <span className="block text-sm text-ink-900">
                      <span className="font-mono font-medium">{stop.sku}</span> {stop.name}
                    </span>
                    <span className="block font-mono text-sm font-medium text-ink-900">{stop.lotCode}</span>
                  </span>
                  <span className="sr-only">pulled</span>
                </label>
                <span className="text-sm text-ink-600">ready {formatDate(stop.readyDate)}</span>
                <span className="text-sm font-medium text-ink-900 tabular-nums sm:w-16 sm:text-right">
                  {stop.bars} bars
                </span>
                <span className="text-sm text-ink-700 sm:w-56">
                  {stop.orders.map((o) => `${o.number} × ${o.bars}`).join(', ')}
                </span>
              </li>
            ))}
          </ul>
        </section>
      ))}
    </div>
  )
}
