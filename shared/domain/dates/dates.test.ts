import { describe, expect, it } from 'vitest'
import {
  addDays,
  addWeeks,
  compareIso,
  daysBetween,
  formatDate,
  isoToday,
  isValidIsoDate,
  startOfIsoWeek,
  yearOf,
} from '@shared/domain/dates/dates'

describe('isValidIsoDate', () => {
  it.each([
    { s: '2026-12-01', valid: true, source: 'hand calculation' },
    { s: '2024-02-29', valid: true, source: 'Gregorian leap-year rule: divisible by 4 (memory)' },
    { s: '2000-02-29', valid: true, source: 'Gregorian leap-year rule: divisible by 400 (memory)' },
    {
      s: '2100-02-29',
      valid: false,
      source: 'Gregorian leap-year rule: century not divisible by 400 (memory)',
    },
    { s: '2026-02-29', valid: false, source: 'hand calculation: 2026 is not a leap year' },
    { s: '2026-04-31', valid: false, source: 'hand calculation: April has 30 days' },
    { s: '2026-13-01', valid: false, source: 'hand calculation' },
    { s: '2026-00-10', valid: false, source: 'hand calculation' },
    { s: '2026-12-00', valid: false, source: 'hand calculation' },
    { s: '0000-01-01', valid: false, source: 'product rule: years 0001–9999' },
    { s: '2026-1-01', valid: false, source: 'ISO 8601 calendar date YYYY-MM-DD (memory)' },
    { s: '2026-12-01T00:00:00Z', valid: false, source: 'product rule: a date, not an instant' },
    { s: ' 2026-12-01', valid: false, source: 'product rule: no surrounding spaces' },
    { s: '', valid: false, source: 'bad input' },
    { s: 20261201, valid: false, source: 'bad input' },
    { s: null, valid: false, source: 'bad input' },
  ])('$s → $valid ($source)', ({ s, valid }) => {
    expect(isValidIsoDate(s)).toBe(valid)
  })
})

describe('addDays and addWeeks', () => {
  it.each([
    { iso: '2026-12-01', n: 30, expected: '2026-12-31', source: 'hand calculation' },
    { iso: '2026-12-31', n: 1, expected: '2027-01-01', source: 'hand calculation: year end' },
    { iso: '2024-02-28', n: 1, expected: '2024-02-29', source: 'hand calculation: leap day' },
    {
      iso: '2026-03-08',
      n: 28,
      expected: '2026-04-05',
      source: 'hand calculation: 28-day cure, common practice',
    },
    // 2026-03-29 is the EU summer-time change; UTC arithmetic must not notice it.
    { iso: '2026-03-28', n: 1, expected: '2026-03-29', source: 'hand calculation: across a DST change' },
    { iso: '2026-03-01', n: -1, expected: '2026-02-28', source: 'hand calculation' },
    { iso: '2026-12-01', n: 0, expected: '2026-12-01', source: 'hand calculation' },
  ])('$iso + $n days = $expected ($source)', ({ iso, n, expected }) => {
    expect(addDays(iso, n)).toBe(expected)
  })

  it.each([
    { iso: '2026-11-30', n: 1, expected: '2026-12-07', source: 'hand calculation' },
    { iso: '2026-12-28', n: 1, expected: '2027-01-04', source: 'hand calculation' },
    { iso: '2026-12-01', n: -4, expected: '2026-11-03', source: 'hand calculation' },
  ])('$iso + $n weeks = $expected ($source)', ({ iso, n, expected }) => {
    expect(addWeeks(iso, n)).toBe(expected)
  })

  it.each([
    { iso: '2026-02-30', n: 1, code: 'invalid_date', source: 'bad input' },
    { iso: 'tomorrow', n: 1, code: 'invalid_date', source: 'bad input' },
    { iso: '2026-12-01', n: 1.5, code: 'invalid_days', source: 'bad input: whole days only' },
    { iso: '2026-12-01', n: Number.NaN, code: 'invalid_days', source: 'bad input' },
    { iso: '9999-12-31', n: 1, code: 'invalid_date', source: 'bad input: past year 9999' },
  ])('rejects $iso + $n with $code ($source)', ({ iso, n, code }) => {
    expect(() => addDays(iso, n)).toThrow(expect.objectContaining({ code }))
  })
})

describe('daysBetween', () => {
  it.each([
    { from: '2025-01-01', to: '2026-01-01', expected: 365, source: 'hand calculation' },
    { from: '2024-02-01', to: '2024-03-01', expected: 29, source: 'hand calculation: leap February' },
    { from: '2025-02-01', to: '2025-03-01', expected: 28, source: 'hand calculation' },
    { from: '2026-12-31', to: '2026-12-01', expected: -30, source: 'hand calculation: to before from' },
    { from: '2026-10-24', to: '2026-10-26', expected: 2, source: 'hand calculation: across a DST change' },
    { from: '2026-12-01', to: '2026-12-01', expected: 0, source: 'hand calculation' },
  ])('$from → $to = $expected ($source)', ({ from, to, expected }) => {
    expect(daysBetween(from, to)).toBe(expected)
  })

  it('rejects a bad date (bad input)', () => {
    expect(() => daysBetween('2026-12-01', '2026-12-32')).toThrow(
      expect.objectContaining({ code: 'invalid_date' }),
    )
  })
})

describe('compareIso', () => {
  it.each([
    { a: '2026-12-01', b: '2026-12-02', expected: -1, source: 'hand calculation' },
    { a: '2027-01-01', b: '2026-12-31', expected: 1, source: 'hand calculation' },
    { a: '2026-12-01', b: '2026-12-01', expected: 0, source: 'hand calculation' },
  ])('$a vs $b = $expected ($source)', ({ a, b, expected }) => {
    expect(compareIso(a, b)).toBe(expected)
  })

  it('sorts dates in calendar order (hand calculation)', () => {
    expect(['2027-01-01', '2026-02-01', '2026-12-01'].sort(compareIso)).toEqual([
      '2026-02-01',
      '2026-12-01',
      '2027-01-01',
    ])
  })

  it('rejects a bad date (bad input)', () => {
    expect(() => compareIso('2026-12-01', '12/01/2026')).toThrow(
      expect.objectContaining({ code: 'invalid_date' }),
    )
  })
})

describe('startOfIsoWeek', () => {
  it.each([
    { iso: '2026-12-01', expected: '2026-11-30', source: 'hand calculation: a Tuesday' },
    { iso: '2026-11-30', expected: '2026-11-30', source: 'hand calculation: a Monday is its own week start' },
    { iso: '2026-11-29', expected: '2026-11-23', source: 'ISO 8601: Sunday ends the week (memory)' },
    { iso: '2027-01-01', expected: '2026-12-28', source: 'hand calculation: a Friday across the year end' },
  ])('$iso → $expected ($source)', ({ iso, expected }) => {
    expect(startOfIsoWeek(iso)).toBe(expected)
  })
})

describe('yearOf', () => {
  it.each([
    { iso: '2026-12-31', expected: 2026, source: 'hand calculation' },
    { iso: '0026-01-01', expected: 26, source: 'hand calculation: a two-digit year stays literal' },
  ])('$iso → $expected ($source)', ({ iso, expected }) => {
    expect(yearOf(iso)).toBe(expected)
  })
})

describe('isoToday', () => {
  it.each([
    { now: '2026-12-01T23:30:00Z', tz: undefined, expected: '2026-12-01', source: 'hand calculation: UTC' },
    {
      now: '2026-12-01T23:30:00Z',
      tz: 'Europe/Berlin',
      expected: '2026-12-02',
      source: 'hand calculation: UTC+1',
    },
    {
      now: '2026-12-02T03:00:00Z',
      tz: 'America/Chicago',
      expected: '2026-12-01',
      source: 'hand calculation: UTC−6',
    },
    {
      now: '2026-07-01T04:30:00Z',
      tz: 'America/New_York',
      expected: '2026-07-01',
      source: 'hand calculation: UTC−4 in summer',
    },
    {
      now: '2026-07-01T03:30:00Z',
      tz: 'America/New_York',
      expected: '2026-06-30',
      source: 'hand calculation: UTC−4 in summer',
    },
    {
      now: '2026-12-31T12:00:00Z',
      tz: 'Pacific/Kiritimati',
      expected: '2027-01-01',
      source: 'hand calculation: UTC+14',
    },
  ])('$now in $tz → $expected ($source)', ({ now, tz, expected }) => {
    expect(isoToday(new Date(now), tz)).toBe(expected)
  })

  it.each([
    {
      now: new Date('2026-12-01T00:00:00Z'),
      tz: 'Mars/Olympus',
      code: 'invalid_time_zone',
      source: 'bad input',
    },
    { now: new Date('not a date'), tz: 'UTC', code: 'invalid_date', source: 'bad input' },
  ])('rejects $tz / $now with $code ($source)', ({ now, tz, code }) => {
    expect(() => isoToday(now, tz)).toThrow(expect.objectContaining({ code }))
  })

  it('defaults to now (hand calculation: agrees with the UTC date of Date.now)', () => {
    const before = new Date().toISOString().slice(0, 10)
    const today = isoToday()
    const after = new Date().toISOString().slice(0, 10)
    expect([before, after]).toContain(today)
  })
})

describe('formatDate', () => {
  it.each([
    {
      iso: '2026-12-01',
      locale: undefined,
      expected: 'Dec 1, 2026',
      source: 'CLDR en-US medium date (memory)',
    },
    { iso: '2026-12-01', locale: 'en-GB', expected: '1 Dec 2026', source: 'CLDR en-GB medium date (memory)' },
    {
      iso: '2027-01-01',
      locale: 'en-US',
      expected: 'Jan 1, 2027',
      source: 'CLDR en-US medium date (memory)',
    },
  ])('$iso in $locale → $expected ($source)', ({ iso, locale, expected }) => {
    expect(formatDate(iso, locale)).toBe(expected)
  })

  it.each([
    { iso: '2026-12-32', locale: 'en-US', code: 'invalid_date', source: 'bad input' },
    { iso: '2026-12-01', locale: 'not a locale!', code: 'invalid_locale', source: 'bad input' },
  ])('rejects $iso / $locale with $code ($source)', ({ iso, locale, code }) => {
    expect(() => formatDate(iso, locale)).toThrow(expect.objectContaining({ code }))
  })
})
