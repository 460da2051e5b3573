import type { ReactNode } from 'react'
import { cn } from '@/lib/cn'

type EmptyStateProps = {
  title: ReactNode
  message?: ReactNode
  /** What to do about it: usually one button or link ("Pour a batch"). */
  action?: ReactNode
  className?: string
}

/** What a list or page shows when there is nothing in it yet, and what to do next. */
export function EmptyState({ title, message, action, className }: EmptyStateProps) {
  return (
    <div
      className={cn(
        'flex flex-col items-center rounded-card border border-dashed border-cream-300 bg-cream-50 px-6 py-10 text-center',
        className,
      )}
    >
      {/* A stack of three bars: the studio's own small motif. */}
      <svg aria-hidden="true" viewBox="0 0 48 40" className="mb-4 h-10 w-12 text-olive-300">
        <rect x="10" y="2" width="28" height="10" rx="3" className="fill-current opacity-60" />
        <rect x="6" y="14" width="36" height="11" rx="3" className="fill-current opacity-80" />
        <rect x="2" y="27" width="44" height="11" rx="3" className="fill-current" />
      </svg>
      <p className="text-base font-medium text-ink-900">{title}</p>
      {message ? <div className="mt-1 max-w-md text-sm text-ink-700">{message}</div> : null}
      {action ? <div className="mt-5 flex flex-wrap justify-center gap-2">{action}</div> : null}
    </div>
  )
}
