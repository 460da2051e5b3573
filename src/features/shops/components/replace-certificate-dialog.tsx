import { useState } from 'react'
import type { FormEvent } from 'react'
import { isValidIsoDate } from '@shared/domain/dates/dates'
import { CERTIFICATE_ACCEPT, CERTIFICATE_MAX_BYTES } from '@shared/schemas/shops'
import type { ShopAccount } from '@shared/schemas/shops'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useReplaceCertificate } from '@/features/shops/api/accounts'
import { ApiError } from '@/lib/api-client'

/** The owner files a new certificate for the shop, with the date it is valid until. */
export function ReplaceCertificateDialog({
  shop,
  open,
  onClose,
}: {
  shop: ShopAccount
  open: boolean
  onClose: () => void
}) {
  const replace = useReplaceCertificate(shop.id)
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
      await replace.mutateAsync({ file, expiresOn })
      toast.success(`The new certificate for ${shop.tradingName} is on file.`)
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
      title="Replace the resale certificate"
      description="The previous file stays in the records; the new one is what buyers and invoices use from now on."
      dismissible={!replace.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={replace.isPending}>
            Cancel
          </Button>
          <Button type="submit" form="replace-certificate-form" loading={replace.isPending}>
            Upload certificate
          </Button>
        </>
      }
    >
      <form id="replace-certificate-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        {errors.form ? <FormError message={errors.form} /> : null}
        <Field label="Certificate file" hint="PDF, JPEG or PNG, up to 5 MB" error={errors.certificate}>
          <Input
            type="file"
            accept={CERTIFICATE_ACCEPT}
            className="h-auto py-1.5"
            onChange={(e) => setFile(e.target.files?.[0] ?? null)}
          />
        </Field>
        <Field label="Valid until" optional error={errors.certificateExpiresOn}>
          <Input type="date" value={expiresOn} onChange={(e) => setExpiresOn(e.target.value)} />
        </Field>
      </form>
    </Dialog>
  )
}
