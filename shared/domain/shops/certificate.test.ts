import { describe, expect, it } from 'vitest'
import { CERTIFICATE_WARNING_DAYS, certificateStatus } from '@shared/domain/shops/certificate'

describe('certificateStatus', () => {
  // Days are counted on the calendar (Gregorian: 2028 is a leap year, February has 29 days).
  it.each<[boolean, string | null, string, string, string]>([
    // onFile, expiresOn, today, expected, source
    [false, null, '2026-12-01', 'none', 'no file: product rule'],
    [
      false,
      '2027-06-30',
      '2026-12-01',
      'none',
      'an expiry date without a file is still no certificate: product rule',
    ],
    [true, null, '2026-12-01', 'on_file', 'no known expiry: product rule'],
    [true, '2027-06-30', '2026-12-01', 'on_file', '211 days left, beyond the 30-day window'],
    [true, '2026-12-31', '2026-12-01', 'expiring', '30 days left: the window includes day 30'],
    [true, '2027-01-01', '2026-12-01', 'on_file', '31 days left: outside the window'],
    [
      true,
      '2026-12-01',
      '2026-12-01',
      'expiring',
      'the expiry day itself is still valid (valid through the date)',
    ],
    [true, '2026-11-30', '2026-12-01', 'expired', 'one day after the expiry date'],
    [true, '2028-03-01', '2028-02-01', 'expiring', '29 days across a leap-year February'],
  ])('%s, %s on %s → %s (%s)', (onFile, expiresOn, today, expected) => {
    expect(certificateStatus(onFile, expiresOn, today)).toBe(expected)
  })

  it('uses a 30-day window unless told otherwise', () => {
    expect(CERTIFICATE_WARNING_DAYS).toBe(30)
    expect(certificateStatus(true, '2026-12-11', '2026-12-01', 7)).toBe('on_file')
  })
})
