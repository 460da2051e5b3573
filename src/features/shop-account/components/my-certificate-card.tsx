import { useState } from 'react'
import { formatDate } from '@shared/domain/dates/dates'
import type { ShopSummary } from '@shared/schemas/shops'
import { CertificateUploadDialog } from '@/components/certificates/certificate-upload-dialog'
import { Badge } from '@/components/ui/badge'
import { Button, buttonClasses } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { MY_CERTIFICATE_URL, useRenewMyCertificate } from '@/features/shop-account/api/my-certificate'

function statusLine(shop: ShopSummary) {
  switch (shop.certificateStatus) {
    case 'none':
      return {
        tone: 'neutral' as const,
        badge: 'None on file',
        text: 'Without a certificate, sales tax is added to your orders.',
      }
    case 'expired':
      return {
        tone: 'clay' as const,
        badge: 'Expired',
        text: `It expired on ${formatDate(shop.certificateExpiresOn!)}. Send the renewed one so your orders stay tax exempt.`,
      }
    case 'expiring':
      return {
        tone: 'honey' as const,
        badge: 'Expires soon',
        text: `It is valid until ${formatDate(shop.certificateExpiresOn!)}. Send the renewed one when you have it.`,
      }
    default:
      return {
        tone: 'green' as const,
        badge: 'On file',
        text: shop.certificateExpiresOn
          ? `Valid until ${formatDate(shop.certificateExpiresOn)}.`
          : 'On file with the studio.',
      }
  }
}

/** The buyer's resale certificate: download the one on file, send a renewed one. */
export function MyCertificateCard({ shop }: { shop: ShopSummary }) {
  const [uploading, setUploading] = useState(false)
  const s = statusLine(shop)
  return (
    <Card>
      <CardHeader title="Resale certificate" actions={<Badge tone={s.tone}>{s.badge}</Badge>} />
      <CardBody className="flex flex-col gap-4">
        <p className="text-sm text-ink-700">
          {shop.certificateFilename ? (
            <span className="block font-medium break-all text-ink-900">{shop.certificateFilename}</span>
          ) : null}
          {s.text}
        </p>
        <div className="flex flex-wrap gap-2">
          {shop.certificateOnFile ? (
            <a href={MY_CERTIFICATE_URL} download className={buttonClasses('secondary', 'sm')}>
              Download certificate
            </a>
          ) : null}
          <Button size="sm" onClick={() => setUploading(true)}>
            Upload a renewed certificate
          </Button>
        </div>
      </CardBody>
      <RenewDialog open={uploading} onClose={() => setUploading(false)} />
    </Card>
  )
}

function RenewDialog({ open, onClose }: { open: boolean; onClose: () => void }) {
  const renew = useRenewMyCertificate()
  return (
    <CertificateUploadDialog
      open={open}
      onClose={onClose}
      upload={renew.mutateAsync}
      pending={renew.isPending}
      formId="renew-certificate-form"
      title="Upload a renewed certificate"
      description="It replaces the one on file; the studio checks it."
      submitLabel="Upload"
      successMessage="Thank you: the studio has your renewed certificate."
      expiresHint="As printed on the certificate"
    />
  )
}
