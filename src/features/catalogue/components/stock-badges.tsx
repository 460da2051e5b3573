import { casesFromBars } from '@shared/domain/availability/availability'
import { formatDate } from '@shared/domain/dates/dates'
import type { CatalogueItem } from '@shared/schemas/catalogue'
import { Badge } from '@/components/ui/badge'

const plural = (n: number, one: string, many: string) =>
  `${n.toLocaleString('en-US')} ${n === 1 ? one : many}`

/** "Ready now: 4 cases" and "Next: 60 bars on Dec 22": what can ship now and what is curing. */
export function StockBadges({ item }: { item: CatalogueItem }) {
  const nextCases = item.nextReady ? casesFromBars(item.nextReady.bars, item.casePack) : 0
  return (
    <div className="flex flex-wrap gap-1.5">
      {item.readyCases > 0 ? (
        <Badge tone="green">Ready now: {plural(item.readyCases, 'case', 'cases')}</Badge>
      ) : (
        <Badge tone="neutral">None ready now</Badge>
      )}
      {item.nextReady ? (
        <Badge tone="honey">
          Next: {plural(item.nextReady.bars, 'bar', 'bars')} on{' '}
          {formatDate(item.nextReady.date).replace(/, \d{4}$/, '')}
          <span className="sr-only">
            {' '}
            ({plural(nextCases, 'case', 'cases')}, {formatDate(item.nextReady.date)})
          </span>
        </Badge>
      ) : null}
    </div>
  )
}
