import { formatDate } from '@shared/domain/dates/dates'
import { CERTIFICATE_STATUS_LABELS, SHOP_STATUS_LABELS } from '@shared/schemas/shops'
import type { CertificateStatus, ShopStatus } from '@shared/schemas/shops'
import { Badge } from '@/components/ui/badge'
import type { BadgeTone } from '@/components/ui/badge'

const STATUS_TONE: Record<ShopStatus, BadgeTone> = {
  applied: 'sky',
  active: 'green',
  on_hold: 'honey',
  closed: 'neutral',
  declined: 'neutral',
}

export function ShopStatusBadge({ status }: { status: ShopStatus }) {
  return (
    <Badge tone={STATUS_TONE[status]}>
      {status === 'applied' ? 'Application' : SHOP_STATUS_LABELS[status]}
    </Badge>
  )
}

const CERT_TONE: Record<CertificateStatus, BadgeTone> = {
  none: 'neutral',
  on_file: 'green',
  expiring: 'honey',
  expired: 'clay',
}

/** The certificate's state, with its expiry date when one is known. */
export function CertificateBadge({
  status,
  expiresOn,
}: {
  status: CertificateStatus
  expiresOn: string | null
}) {
  return (
    <span className="inline-flex flex-col items-start gap-0.5">
      <Badge tone={CERT_TONE[status]}>{CERTIFICATE_STATUS_LABELS[status]}</Badge>
      {status !== 'none' && expiresOn ? (
        <span className="text-xs text-ink-700">
          {status === 'expired' ? 'expired' : 'until'} {formatDate(expiresOn)}
        </span>
      ) : null}
    </span>
  )
}
