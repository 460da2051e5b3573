import type { ApplicationInput, ApplicationReceipt } from '@shared/schemas/shops'
import { applicationReceivedEmail, newApplicationEmail } from '@templates/email/shops'
import { env } from '@server/config/env'
import { sequelize } from '@server/db/sequelize'
import { sendMail } from '@server/lib/mailer'
import { audit } from '@server/modules/audit/audit.service'
import { getSettings } from '@server/modules/settings/settings.service'
import type { CertificateUpload } from '@server/modules/shops/certificate-file'
import { storeCertificate } from '@server/modules/shops/certificate.service'
import { Shop } from '@server/modules/shops/shop.model'
import { ownerAddresses } from '@server/modules/shops/shops.service'

export function receiptOf(a: { tradingName?: unknown; contactEmail?: unknown }): ApplicationReceipt {
  return {
    tradingName: typeof a.tradingName === 'string' ? a.tradingName.trim().slice(0, 160) : '',
    contactEmail: typeof a.contactEmail === 'string' ? a.contactEmail.trim().toLowerCase().slice(0, 254) : '',
    status: 'applied',
  }
}

/**
 * A shop applies: the certificate and the shop (status applied) are written in one transaction,
 * then the owners and the applicant are told by e-mail.
 */
export async function submitApplication(
  input: ApplicationInput,
  certificate: CertificateUpload,
): Promise<ApplicationReceipt> {
  const { shopId, owners } = await sequelize.transaction(async (t) => {
    const uploadId = await storeCertificate(certificate, null, t)
    const shop = await Shop.create(
      {
        legalName: input.legalName,
        tradingName: input.tradingName,
        contactName: input.contactName,
        contactEmail: input.contactEmail,
        contactPhone: input.contactPhone,
        billingAddress: input.billingAddress,
        shippingAddress: input.shippingAddress,
        taxId: input.taxId,
        certificateUploadId: uploadId,
        certificateExpiresOn: null,
        tierId: null,
        status: 'applied',
        storeType: input.storeType,
        website: input.website,
        notes: null,
        declineReason: null,
      },
      { transaction: t },
    )
    await audit(
      {
        userId: null,
        action: 'shop.applied',
        entity: 'shop',
        entityId: shop.id,
        data: { uploadId, note: certificate.filename },
      },
      t,
    )
    return { shopId: shop.id, owners: await ownerAddresses(t) }
  })
  const studioName = (await getSettings()).studio.name
  if (owners.length > 0) {
    await sendMail({
      to: owners,
      replyTo: input.contactEmail,
      ...newApplicationEmail({
        studioName,
        link: `${env.APP_URL}/studio/accounts/${shopId}`,
        application: {
          tradingName: input.tradingName,
          legalName: input.legalName,
          contactName: input.contactName,
          contactEmail: input.contactEmail,
          contactPhone: input.contactPhone,
          storeType: input.storeType,
          city: input.billingAddress.city,
          region: input.billingAddress.region,
        },
      }),
    })
  }
  await sendMail({
    to: input.contactEmail,
    ...applicationReceivedEmail({
      studioName,
      contactName: input.contactName,
      tradingName: input.tradingName,
    }),
  })
  return receiptOf(input)
}
