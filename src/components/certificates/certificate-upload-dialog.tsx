import { useState } from 'react'
import type { FormEvent } from 'react'
import { isValidIsoDate } from '@shared/domain/dates/dates'
import { CERTIFICATE_ACCEPT, CERTIFICATE_MAX_BYTES } from '@shared/schemas/shops'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { ApiError } from '@/lib/api-client'

type Errors = { certificate?: string; certificateExpiresOn?: string; form?: string }

/**
 * Sends a resale certificate file with the date it is valid until: the buyer renewing their own,
 * the owner replacing a shop's. The file is checked here for presence and size (the API judges
 * its bytes); the API's field errors land on the fields, anything else above them.
 */
export function CertificateUploadDialog({
  open,
  onClose,
  upload,
  pending,
  formId,
  title,
  description,
  submitLabel,
  successMessage,
  expiresHint,
}: {
  open: boolean
  onClose: () => void
  upload: (input: { file: File; expiresOn: string }) => Promise<unknown>
  pending: boolean
  formId: string
  title: string
  description: string
  submitLabel: string
  successMessage: string
  expiresHint?: string
}) {
  const [file, setFile] = useState<File | null>(null)
  const [expiresOn, setExpiresOn] = useState('')
  const [errors, setErrors] = useState<Errors>({})

  const close = () => {
    setFile(null)
    setExpiresOn('')
    setErrors({})
    onClose()
  }
  const submit = async (event: FormEvent) => {
    event.preventDefault()
    const next: Errors = {}
    if (!file) next.certificate = 'Choose the certificate file (PDF, JPEG or PNG).'
    else if (file.size === 0) next.certificate = 'The file is empty.'
    else if (file.size > CERTIFICATE_MAX_BYTES) next.certificate = 'The certificate is larger than 5 MB.'
    if (expiresOn && !isValidIsoDate(expiresOn)) next.certificateExpiresOn = 'Enter a date as YYYY-MM-DD.'
    setErrors(next)
    if (Object.keys(next).length > 0 || !file) return
    try {
      await upload({ file, expiresOn })
      toast.success(successMessage)
      close()
    } catch (err) {
      const found: Errors = {}
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
      title={title}
      description={description}
      dismissible={!pending}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={pending}>
            Cancel
          </Button>
          <Button type="submit" form={formId} loading={pending}>
            {submitLabel}
          </Button>
        </>
      }
    >
      <form id={formId} onSubmit={submit} noValidate className="flex flex-col gap-4">
        {errors.form ? <FormError message={errors.form} /> : null}
        <Field label="Certificate file" hint="PDF, JPEG or PNG, up to 5 MB" error={errors.certificate}>
          <Input
            type="file"
            accept={CERTIFICATE_ACCEPT}
            className="h-auto py-1.5"
            onChange={(e) => setFile(e.target.files?.[0] ?? null)}
          />
        </Field>
        <Field label="Valid until" optional hint={expiresHint} error={errors.certificateExpiresOn}>
          <Input type="date" value={expiresOn} onChange={(e) => setExpiresOn(e.target.value)} />
        </Field>
      </form>
    </Dialog>
  )
}
