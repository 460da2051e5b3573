import { formatDate } from '@shared/domain/dates/dates'
import type { PlannedPour } from '@shared/schemas/planning'
import { Button, LinkButton } from '@/components/ui/button'

/** Pours the owner has planned: each opens the batch form filled from it, or can be dropped. */
export function PlannedPours({
  pours,
  pourHref,
  onDrop,
  dropping,
}: {
  pours: PlannedPour[]
  pourHref: (p: PlannedPour) => string
  onDrop: (p: PlannedPour) => void
  dropping: number | null
}) {
  if (pours.length === 0) {
    return <p className="text-sm text-ink-700">No planned pours. Plan one from a suggestion below.</p>
  }
  return (
    <ul className="divide-y divide-cream-200 rounded-card ring-1 ring-cream-300" aria-label="Planned pours">
      {pours.map((p) => (
        <li key={p.id} className="flex flex-wrap items-center justify-between gap-3 px-3 py-3 text-sm">
          <span>
            <span className="block font-medium text-ink-900">
              {p.productName} ({p.sku})
            </span>
            <span className="block text-ink-700">
              Pour on {formatDate(p.pourDate)} · {p.moulds} {p.moulds === 1 ? 'mould' : 'moulds'}, about{' '}
              {p.expectedBars} bars · ready {formatDate(p.readyDate)}
              {p.note ? ` · ${p.note}` : ''}
            </span>
          </span>
          <span className="flex gap-2">
            <LinkButton size="sm" to={pourHref(p)} aria-label={`Pour it: ${p.productName}`}>
              Pour it
            </LinkButton>
            <Button
              size="sm"
              variant="ghost"
              onClick={() => onDrop(p)}
              loading={dropping === p.id}
              aria-label={`Drop the planned pour of ${p.productName}`}
            >
              Drop
            </Button>
          </span>
        </li>
      ))}
    </ul>
  )
}
