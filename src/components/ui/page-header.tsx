import type { ReactNode } from 'react'
import { Link } from 'react-router-dom'
import { cn } from '@/lib/cn'

type PageHeaderProps = {
  title: ReactNode
  description?: ReactNode
  /** The page's main commands, at the end of the title row (below it on phones). */
  actions?: ReactNode
  /** A link back up the hierarchy, e.g. `{ to: '/orders', label: 'All orders' }`. */
  back?: { to: string; label: string }
  className?: string
}

/** The top of every page: its one h1, a line about it, and its commands. */
export function PageHeader({ title, description, actions, back, className }: PageHeaderProps) {
  return (
    <header className={cn('mb-6 flex flex-col gap-4', className)}>
      {back ? (
        <Link
          to={back.to}
          className="inline-flex w-fit items-center gap-1 rounded-sm text-sm font-medium text-olive-800 no-underline hover:text-olive-900 hover:underline no-print"
        >
          <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4 fill-current">
            <path d="M9.78 3.72a.75.75 0 0 1 0 1.06L6.56 8l3.22 3.22a.75.75 0 1 1-1.06 1.06L4.97 8.53a.75.75 0 0 1 0-1.06l3.75-3.75a.75.75 0 0 1 1.06 0Z" />
          </svg>
          {back.label}
        </Link>
      ) : null}
      <div className="flex flex-col gap-4 sm:flex-row sm:items-start sm:justify-between">
        <div className="min-w-0">
          <h1 className="text-2xl font-medium tracking-tight text-ink-900">{title}</h1>
          {description ? <div className="mt-1 max-w-prose text-ink-700">{description}</div> : null}
        </div>
        {actions ? (
          <div className="flex shrink-0 flex-wrap items-center gap-2 no-print">{actions}</div>
        ) : null}
      </div>
    </header>
  )
}
