import type { HTMLAttributes, ReactNode } from 'react'
import { cn } from '@/lib/cn'

type CardProps = HTMLAttributes<HTMLDivElement>

/** A white panel on the cream page. */
export function Card({ className, ...rest }: CardProps) {
  return (
    <div
      className={cn(
        'min-w-0 rounded-card bg-white shadow-card ring-1 ring-cream-300/60 print:shadow-none print:ring-ink-300',
        className,
      )}
      {...rest}
    />
  )
}

type CardHeaderProps = {
  title: ReactNode
  description?: ReactNode
  /** Buttons or links for the card, placed at the end of the header (below the title on phones). */
  actions?: ReactNode
  /** The heading level that fits the page outline; h2 under a page's h1 by default. */
  as?: 'h2' | 'h3' | 'h4'
  /** An id for the title, so the card's section can be labelled by it. */
  titleId?: string
  className?: string
}

export function CardHeader({
  title,
  description,
  actions,
  as: Heading = 'h2',
  titleId,
  className,
}: CardHeaderProps) {
  return (
    <div
      className={cn(
        'flex flex-col gap-3 border-b border-cream-200 px-4 py-4 sm:flex-row sm:items-start sm:justify-between sm:px-6',
        className,
      )}
    >
      <div className="min-w-0">
        <Heading id={titleId} className="text-lg font-medium text-ink-900">
          {title}
        </Heading>
        {description ? <div className="mt-0.5 text-sm text-ink-600">{description}</div> : null}
      </div>
      {actions ? <div className="flex shrink-0 flex-wrap items-center gap-2 no-print">{actions}</div> : null}
    </div>
  )
}

type CardBodyProps = HTMLAttributes<HTMLDivElement>

export function CardBody({ className, ...rest }: CardBodyProps) {
  return <div className={cn('px-4 py-4 sm:px-6 sm:py-5', className)} {...rest} />
}
