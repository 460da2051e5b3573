import { DomainError } from '@shared/domain/errors'

/**
 * The one date helper of the product. Dates cross every boundary as ISO calendar dates
 * (`YYYY-MM-DD`) and all arithmetic runs on UTC midnights, so neither the server's nor the
 * browser's time zone can move a date by a day. Only `isoToday` looks at a time zone: it asks
 * which calendar date it is *there*.
 */

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/
const MS_PER_DAY = 86_400_000
const MIN_YEAR = 1
const MAX_YEAR = 9999

export function isValidIsoDate(s: unknown): s is string {
  return typeof s === 'string' && parseUtc(s) !== null
}

function parseUtc(s: string): number | null {
  const m = ISO_DATE.exec(s)
  if (!m) return null
  const year = Number(m[1])
  const month = Number(m[2])
  const day = Number(m[3])
  if (year < MIN_YEAR || month < 1 || month > 12 || day < 1) return null
  // setUTCFullYear keeps years below 100 literal (Date.UTC would map 0026 to 1926).
  const d = new Date(0)
  d.setUTCFullYear(year, month - 1, day)
  if (d.getUTCMonth() !== month - 1 || d.getUTCDate() !== day) return null
  return d.getTime()
}

function toUtc(iso: string, field?: string): number {
  const ms = typeof iso === 'string' ? parseUtc(iso) : null
  if (ms === null)
    throw new DomainError('invalid_date', `Not a calendar date (YYYY-MM-DD): ${String(iso)}`, field)
  return ms
}

function fromUtc(ms: number): string {
  const d = new Date(ms)
  const year = d.getUTCFullYear()
  if (!Number.isFinite(ms) || year < MIN_YEAR || year > MAX_YEAR) {
    throw new DomainError('invalid_date', `Date out of range: year ${year}`)
  }
  const mm = String(d.getUTCMonth() + 1).padStart(2, '0')
  const dd = String(d.getUTCDate()).padStart(2, '0')
  return `${String(year).padStart(4, '0')}-${mm}-${dd}`
}

function wholeDays(n: number, field = 'days'): number {
  if (!Number.isSafeInteger(n))
    throw new DomainError('invalid_days', `Days must be a whole number: ${n}`, field)
  return n
}

export function addDays(iso: string, n: number): string {
  return fromUtc(toUtc(iso) + wholeDays(n) * MS_PER_DAY)
}

export function addWeeks(iso: string, n: number): string {
  return addDays(iso, wholeDays(n, 'weeks') * 7)
}

/** to − from in whole days: positive when `toIso` is later. */
export function daysBetween(fromIso: string, toIso: string): number {
  return Math.round((toUtc(toIso) - toUtc(fromIso)) / MS_PER_DAY)
}

/** −1, 0 or 1; usable directly as a sort comparator. */
export function compareIso(a: string, b: string): -1 | 0 | 1 {
  const d = toUtc(a) - toUtc(b)
  return d < 0 ? -1 : d > 0 ? 1 : 0
}

/** The Monday on or before the date (ISO 8601 weeks start on Monday). */
export function startOfIsoWeek(iso: string): string {
  const ms = toUtc(iso)
  const sinceMonday = (new Date(ms).getUTCDay() + 6) % 7
  return fromUtc(ms - sinceMonday * MS_PER_DAY)
}

export function yearOf(iso: string): number {
  return new Date(toUtc(iso)).getUTCFullYear()
}

// One formatter per time zone: making an Intl.DateTimeFormat costs far more than using one, and
// the studio's "today" is asked for on every catalogue and order request.
const dayFormats = new Map<string, Intl.DateTimeFormat>()
function dayFormat(timeZone: string): Intl.DateTimeFormat {
  let f = dayFormats.get(timeZone)
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', {
      timeZone,
      calendar: 'gregory',
      numberingSystem: 'latn',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
    })
    if (dayFormats.size < 50) dayFormats.set(timeZone, f)
  }
  return f
}

/** The calendar date at `now` in `timeZone` (an IANA name; UTC when omitted). */
export function isoToday(now: Date = new Date(), timeZone = 'UTC'): string {
  if (!(now instanceof Date) || Number.isNaN(now.getTime())) {
    throw new DomainError('invalid_date', 'Not a valid instant')
  }
  let parts: Intl.DateTimeFormatPart[]
  try {
    parts = dayFormat(timeZone).formatToParts(now)
  } catch {
    throw new DomainError('invalid_time_zone', `Unknown time zone: ${timeZone}`, 'timeZone')
  }
  const part = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? ''
  const iso = `${part('year').padStart(4, '0')}-${part('month')}-${part('day')}`
  return fromUtc(toUtc(iso))
}

/** A date for people to read, e.g. "Dec 1, 2026" in en-US; the date itself never shifts. */
export function formatDate(iso: string, locale = 'en-US'): string {
  const ms = toUtc(iso)
  try {
    return new Intl.DateTimeFormat(locale, {
      timeZone: 'UTC',
      year: 'numeric',
      month: 'short',
      day: 'numeric',
    }).format(ms)
  } catch {
    throw new DomainError('invalid_locale', `Unknown locale: ${locale}`, 'locale')
  }
}
