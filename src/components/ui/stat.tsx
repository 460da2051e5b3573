import type { ReactNode } from 'react'
import { cn } from '@/lib/cn'

type StatProps = {
  label: ReactNode
  value: ReactNode
  /** A line of context under the value ("3 batches curing", "due this week"). */
  hint?: ReactNode
  /** Draws the eye to a figure that needs attention. */
  tone?: 'default' | 'honey' | 'clay'
  className?: string
}

const toneBar = { default: 'bg-olive-500', honey: 'bg-honey-500', clay: 'bg-clay-600' } as const

/** One headline figure on a dashboard. */
export function Stat({ label, value, hint, tone = 'default', className }: StatProps) {
  return (
    <div
      className={cn(
        'relative min-w-0 overflow-hidden rounded-card bg-white px-4 py-4 shadow-card ring-1 ring-cream-300/60 sm:px-5',
        className,
      )}
    >
      <span aria-hidden="true" className={cn('absolute inset-y-0 left-0 w-1', toneBar[tone])} />
      <p className="text-sm text-ink-700">{label}</p>
      <p className="mt-1 text-2xl font-medium text-ink-900 tabular-nums">{value}</p>
      {hint ? <p className="mt-1 text-sm text-ink-600">{hint}</p> : null}
    </div>
  )
}
