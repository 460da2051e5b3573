import { formatCents } from '@shared/domain/money/money'
import { cn } from '@/lib/cn'

/**
 * Formats integer cents as money. The one money formatter is shared/domain/money's formatCents;
 * this name stays for the components that import it.
 */
export function formatMoney(cents: number, currency = 'USD', locale = 'en-US'): string {
  return formatCents(cents, currency, locale)
}

type MoneyProps = {
  /** An integer amount in minor units (cents). */
  cents: number
  /** ISO 4217: the studio's currency (settings), never assumed. */
  currency: string
  /** A BCP 47 locale (default en-US). */
  locale?: string
  className?: string
}

/** An amount of money with tabular figures, so columns of prices line up. */
export function Money({ cents, currency, locale, className }: MoneyProps) {
  return (
    <span className={cn('tabular-nums whitespace-nowrap', className)}>
      {formatMoney(cents, currency, locale)}
    </span>
  )
}
