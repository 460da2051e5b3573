import { daysBetween } from '@shared/domain/dates/dates'
import type { CertificateStatus } from '@shared/schemas/shops'

/** How many days ahead an expiry date starts to be flagged "expires soon" (the studio's own rule). */
export const CERTIFICATE_WARNING_DAYS = 30

/**
 * Where a shop's resale certificate stands on `today`. A certificate is valid through its
 * expiry date (it expires at the end of that day); without a known expiry date it counts as on file.
 */
export function certificateStatus(
  onFile: boolean,
  expiresOn: string | null,
  today: string,
  warningDays = CERTIFICATE_WARNING_DAYS,
): CertificateStatus {
  if (!onFile) return 'none'
  if (!expiresOn) return 'on_file'
  const left = daysBetween(today, expiresOn)
  if (left < 0) return 'expired'
  if (left <= warningDays) return 'expiring'
  return 'on_file'
}
