import type { ReactNode } from 'react'
import { cn } from '@/lib/cn'

export type BadgeTone = 'neutral' | 'green' | 'honey' | 'clay' | 'sky'

const tones: Record<BadgeTone, { badge: string; dot: string }> = {
  neutral: { badge: 'bg-cream-200 text-ink-700 ring-cream-300', dot: 'bg-ink-500' },
  green: { badge: 'bg-olive-100 text-olive-800 ring-olive-200', dot: 'bg-olive-600' },
  honey: { badge: 'bg-honey-100 text-honey-700 ring-honey-500/30', dot: 'bg-honey-500' },
  clay: { badge: 'bg-clay-100 text-clay-700 ring-clay-300/60', dot: 'bg-clay-600' },
  sky: { badge: 'bg-sky-100 text-sky-800 ring-sky-200', dot: 'bg-sky-600' },
}

type BadgeProps = {
  tone?: BadgeTone
  children: ReactNode
  className?: string
}

/**
 * A short status word ("Curing", "Ready", "On hold"). The dot repeats the tone for a quick scan;
 * the word itself always carries the meaning, so colour is never the only signal.
 */
export function Badge({ tone = 'neutral', children, className }: BadgeProps) {
  const t = tones[tone]
  return (
    <span
      className={cn(
        'inline-flex items-center gap-1.5 rounded-full px-2.5 py-0.5 text-xs font-medium whitespace-nowrap ring-1 ring-inset',
        t.badge,
        className,
      )}
    >
      <span aria-hidden="true" className={cn('size-1.5 rounded-full', t.dot)} />
      {children}
    </span>
  )
}
