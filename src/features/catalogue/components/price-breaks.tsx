import type { PriceBreakDto } from '@shared/schemas/orders'
import { formatMoney } from '@/components/ui/money'
import { cn } from '@/lib/cn'
import { breakRange } from '@/lib/price-breaks'

/** The shop's breaks: "1–4 cases $6.80 a bar ($81.60 a case)", one per line. */
export function PriceBreaks({
  breaks,
  casePack,
  currency,
  className,
}: {
  breaks: PriceBreakDto[]
  casePack: number
  currency: string
  className?: string
}) {
  return (
    <ul className={cn('flex flex-col gap-0.5 text-sm', className)} aria-label="Your price per bar">
      {breaks.map((b, i) => (
        <li key={b.minCases} className="flex flex-wrap items-baseline gap-x-1.5 tabular-nums">
          <span className="text-ink-700">{breakRange(breaks, i)}</span>
          <span className={cn('font-medium', i === 0 ? 'text-ink-900' : 'text-olive-800')}>
            {formatMoney(b.unitPriceCents, currency)}
          </span>
          <span className="text-xs text-ink-600">
            a bar ({formatMoney(b.unitPriceCents * casePack, currency)} a case)
          </span>
        </li>
      ))}
    </ul>
  )
}
