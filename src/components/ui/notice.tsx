import type { ReactNode } from 'react'
import { cn } from '@/lib/cn'

const tones = {
  clay: 'border-clay-300 bg-clay-50 text-clay-700',
  honey: 'border-honey-500/40 bg-honey-50 text-honey-700',
} as const

/**
 * A standing note above a page's content: something a person must know before acting on it
 * (a payment awaited, a hold). A note, not an alert: it is there when the page opens.
 */
export function Notice({
  title,
  tone = 'clay',
  children,
  action,
  className,
}: {
  title: string
  tone?: keyof typeof tones
  children: ReactNode
  action?: ReactNode
  className?: string
}) {
  return (
    <div
      role="note"
      aria-label={title}
      className={cn(
        'flex flex-col gap-3 rounded-card border px-4 py-3 text-sm sm:flex-row sm:items-center sm:justify-between',
        tones[tone],
        className,
      )}
    >
      <div>
        <p className="font-medium">{title}</p>
        <div className="text-ink-800">{children}</div>
      </div>
      {action ? <div className="shrink-0">{action}</div> : null}
    </div>
  )
}
