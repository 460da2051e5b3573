import type { ReactNode } from 'react'
import { cn } from '@/lib/cn'

type FormErrorProps = {
  /** The form-level message (e.g. from the server); nothing renders while it is empty. */
  message?: ReactNode
  title?: ReactNode
  className?: string
}

/** A banner at the top of a form for a problem that belongs to no single field. */
export function FormError({ message, title, className }: FormErrorProps) {
  if (message == null || message === false || message === '') return null
  return (
    <div
      role="alert"
      className={cn(
        'flex items-start gap-3 rounded-md border border-clay-300 bg-clay-50 px-4 py-3',
        className,
      )}
    >
      <svg
        aria-hidden="true"
        viewBox="0 0 20 20"
        className="mt-0.5 size-5 shrink-0 fill-current text-clay-600"
      >
        <path d="M10 2a8 8 0 1 0 0 16 8 8 0 0 0 0-16Zm-.9 4h1.8v5.5H9.1V6Zm0 7h1.8v1.8H9.1V13Z" />
      </svg>
      <div className="min-w-0 text-sm text-clay-700">
        {title ? <p className="font-medium">{title}</p> : null}
        <div className={title ? 'mt-0.5' : undefined}>{message}</div>
      </div>
    </div>
  )
}
