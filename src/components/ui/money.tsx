import { cn } from '@/lib/cn'

const formatters = new Map<string, Intl.NumberFormat>()

function formatterFor(currency: string, locale: string | undefined): Intl.NumberFormat {
  const key = `${locale ?? ''}|${currency}`
  let f = formatters.get(key)
  if (!f) {
    f = new Intl.NumberFormat(locale, { style: 'currency', currency })
    formatters.set(key, f)
  }
  return f
}

/**
 * Formats an integer amount in the currency's minor unit (cents for USD, none for JPY) as money.
 * The minor-unit exponent comes from Intl, so a currency without cents is not divided by 100.
 */
export function formatMoney(cents: number, currency = 'USD', locale?: string): string {
  const f = formatterFor(currency, locale)
  const digits = f.resolvedOptions().maximumFractionDigits ?? 2
  return f.format(cents / 10 ** digits)
}

type MoneyProps = {
  /** An integer amount in minor units (cents). */
  cents: number
  currency?: string
  /** A BCP 47 locale; the reader's own by default. */
  locale?: string
  className?: string
}

/** An amount of money with tabular figures, so columns of prices line up. */
export function Money({ cents, currency = 'USD', locale, className }: MoneyProps) {
  return (
    <span className={cn('tabular-nums whitespace-nowrap', className)}>
      {formatMoney(cents, currency, locale)}
    </span>
  )
}
