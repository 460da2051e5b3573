import { useId } from 'react'
import type { ReactNode } from 'react'
import { cn } from '@/lib/cn'

type ProgressBarProps = {
  /** How far along, from 0 to 1; values outside are clamped. */
  value: number
  label: ReactNode
  /** Said and shown instead of the percentage, e.g. "Day 18 of 42". */
  valueText?: string
  tone?: 'olive' | 'honey' | 'clay'
  className?: string
}

const fills = { olive: 'bg-olive-600', honey: 'bg-honey-500', clay: 'bg-clay-600' } as const

function clamp01(n: number): number {
  if (!Number.isFinite(n)) return 0
  return Math.min(1, Math.max(0, n))
}

/** A labelled bar, e.g. how far a batch is through its cure. */
export function ProgressBar({ value, label, valueText, tone = 'olive', className }: ProgressBarProps) {
  const labelId = useId()
  const percent = Math.round(clamp01(value) * 100)
  return (
    <div className={cn('flex flex-col gap-1.5', className)}>
      <div className="flex items-baseline justify-between gap-3 text-sm">
        <span id={labelId} className="text-ink-800">
          {label}
        </span>
        <span className="text-ink-700 tabular-nums">{valueText ?? `${percent}%`}</span>
      </div>
      <div
        role="progressbar"
        aria-labelledby={labelId}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent}
        aria-valuetext={valueText}
        className="h-2 w-full overflow-hidden rounded-full bg-cream-200 ring-1 ring-cream-300 ring-inset print:ring-ink-300"
      >
        <div
          className={cn('h-full rounded-full transition-[width] duration-300', fills[tone])}
          style={{ width: `${percent}%` }}
        />
      </div>
    </div>
  )
}
