import { cn } from '@/lib/cn'

type SpinnerProps = {
  size?: 'sm' | 'md' | 'lg'
  className?: string
}

const spinnerSizes = { sm: 'size-4', md: 'size-6', lg: 'size-8' } as const

/** A decorative spinner: whatever shows it must also say, in text, what is happening. */
export function Spinner({ size = 'md', className }: SpinnerProps) {
  return (
    <svg
      aria-hidden="true"
      focusable="false"
      viewBox="0 0 24 24"
      fill="none"
      className={cn('shrink-0 animate-spin', spinnerSizes[size], className)}
    >
      <circle cx="12" cy="12" r="9" stroke="currentColor" strokeOpacity="0.25" strokeWidth="3" />
      <path d="M21 12a9 9 0 0 0-9-9" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
    </svg>
  )
}

type LoadingBlockProps = {
  /** Read out to screen readers; shown beside the spinner when `showLabel` is set. */
  label?: string
  showLabel?: boolean
  className?: string
}

/** A centred spinner for a region whose content is on its way. */
export function LoadingBlock({ label = 'Loading…', showLabel = false, className }: LoadingBlockProps) {
  return (
    <div
      role="status"
      className={cn('flex min-h-32 items-center justify-center gap-3 py-10 text-olive-700', className)}
    >
      <Spinner size="lg" />
      <span className={showLabel ? 'text-sm text-ink-700' : 'sr-only'}>{label}</span>
    </div>
  )
}
