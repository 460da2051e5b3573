import type { ShopAccount } from '@shared/schemas/shops'
import { CertificateUploadDialog } from '@/components/certificates/certificate-upload-dialog'
import { useReplaceCertificate } from '@/features/shops/api/accounts'

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
  return (
    <CertificateUploadDialog
      open={open}
      onClose={onClose}
      upload={replace.mutateAsync}
      pending={replace.isPending}
      formId="replace-certificate-form"
      title="Replace the resale certificate"
      description="The previous file stays in the records; the new one is what buyers and invoices use from now on."
      submitLabel="Upload certificate"
      successMessage={`The new certificate for ${shop.tradingName} is on file.`}
    />
  )
}
