import { cn } from '@/lib/cn'

/** The Lathercase mark: a bar of soap seen from above, and the word. */
export function Brand({ className, studio }: { className?: string; studio?: string }) {
  return (
    <span className={cn('inline-flex items-center gap-2', className)}>
      <svg aria-hidden="true" viewBox="0 0 32 32" className="size-7 shrink-0">
        <rect x="3" y="8" width="26" height="16" rx="6" className="fill-olive-700" />
        <rect x="7" y="12" width="18" height="8" rx="3" className="fill-olive-100" />
      </svg>
      <span className="flex flex-col leading-tight">
        <span className="text-lg font-bold tracking-tight text-olive-800">Lathercase</span>
        {studio ? <span className="text-xs text-ink-600">{studio}</span> : null}
      </span>
    </span>
  )
}
