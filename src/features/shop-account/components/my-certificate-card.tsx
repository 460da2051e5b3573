import { useState } from 'react'
import type { FormEvent } from 'react'
import { formatDate, isValidIsoDate } from '@shared/domain/dates/dates'
import { CERTIFICATE_ACCEPT, CERTIFICATE_MAX_BYTES } from '@shared/schemas/shops'
import type { ShopSummary } from '@shared/schemas/shops'
import { Badge } from '@/components/ui/badge'
import { Button, buttonClasses } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { Dialog } from '@/components/ui/dialog'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { MY_CERTIFICATE_URL, useRenewMyCertificate } from '@/features/shop-account/api/my-certificate'
import { ApiError } from '@/lib/api-client'

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
  const [file, setFile] = useState<File | null>(null)
  const [expiresOn, setExpiresOn] = useState('')
  const [errors, setErrors] = useState<{
    certificate?: string
    certificateExpiresOn?: string
    form?: string
  }>({})

  const close = () => {
    setFile(null)
    setExpiresOn('')
    setErrors({})
    onClose()
  }
  const submit = async (event: FormEvent) => {
    event.preventDefault()
    const next: typeof errors = {}
    if (!file) next.certificate = 'Choose the certificate file (PDF, JPEG or PNG).'
    else if (file.size === 0) next.certificate = 'The file is empty.'
    else if (file.size > CERTIFICATE_MAX_BYTES) next.certificate = 'The certificate is larger than 5 MB.'
    if (expiresOn && !isValidIsoDate(expiresOn)) next.certificateExpiresOn = 'Enter a date as YYYY-MM-DD.'
    setErrors(next)
    if (Object.keys(next).length > 0 || !file) return
    try {
      await renew.mutateAsync({ file, expiresOn })
      toast.success('Thank you: the studio has your renewed certificate.')
      close()
    } catch (err) {
      const found: typeof errors = {}
      if (err instanceof ApiError) {
        for (const d of err.fieldErrors)
          if (d.field === 'certificate' || d.field === 'certificateExpiresOn') found[d.field] = d.message
        if (Object.keys(found).length === 0) found.form = err.message
      } else found.form = 'The upload did not work. Please try again.'
      setErrors(found)
    }
  }

  return (
    <Dialog
      open={open}
      onClose={close}
      title="Upload a renewed certificate"
      description="It replaces the one on file; the studio checks it."
      dismissible={!renew.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={renew.isPending}>
            Cancel
          </Button>
          <Button type="submit" form="renew-certificate-form" loading={renew.isPending}>
            Upload
          </Button>
        </>
      }
    >
      <form id="renew-certificate-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        {errors.form ? <FormError message={errors.form} /> : null}
        <Field label="Certificate file" hint="PDF, JPEG or PNG, up to 5 MB" error={errors.certificate}>
          <Input
            type="file"
            accept={CERTIFICATE_ACCEPT}
            className="h-auto py-1.5"
            onChange={(e) => setFile(e.target.files?.[0] ?? null)}
          />
        </Field>
        <Field
          label="Valid until"
          optional
          hint="As printed on the certificate"
          error={errors.certificateExpiresOn}
        >
          <Input type="date" value={expiresOn} onChange={(e) => setExpiresOn(e.target.value)} />
        </Field>
      </form>
    </Dialog>
  )
}
