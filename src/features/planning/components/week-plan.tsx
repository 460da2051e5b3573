import { formatDate } from '@shared/domain/dates/dates'
import type { PourPlan } from '@shared/schemas/planning'
import { Badge } from '@/components/ui/badge'

/** The suggested pours, week by week (a late pour sits in this week). */
export function WeekPlan({ weeks }: { weeks: PourPlan['weeks'] }) {
  if (weeks.length === 0) {
    return (
      <p className="text-sm text-ink-700">
        Nothing needs pouring within the plan: stock lasts, or nothing sells.
      </p>
    )
  }
  return (
    <ol className="flex flex-col gap-4" aria-label="Pours week by week">
      {weeks.map((w) => (
        <li key={w.weekStart}>
          <h3 className="text-sm font-medium text-ink-900">Week of {formatDate(w.weekStart)}</h3>
          <ul className="mt-1 divide-y divide-cream-200 rounded-card ring-1 ring-cream-300">
            {w.pours.map((p) => (
              <li
                key={p.productId}
                className="flex flex-wrap items-center justify-between gap-2 px-3 py-2 text-sm"
              >
                <span>
                  <span className="font-medium text-ink-900">{p.name}</span>{' '}
                  <span className="text-ink-700">
                    · {p.moulds} {p.moulds === 1 ? 'mould' : 'moulds'}, {p.bars} bars
                  </span>
                </span>
                <span className="flex items-center gap-2">
                  by {formatDate(p.pourBy)}
                  {p.late ? <Badge tone="clay">Late</Badge> : null}
                </span>
              </li>
            ))}
          </ul>
        </li>
      ))}
    </ol>
  )
}
