import { useMutation, useQueryClient } from '@tanstack/react-query'
import type { ShopSummary } from '@shared/schemas/shops'
import { myShopKeys } from '@/features/shop-account/api/my-shop'
import { api } from '@/lib/api-client'

export const MY_CERTIFICATE_URL = '/api/shops/mine/certificate'

/** The buyer sends a renewed resale certificate; the studio is told by e-mail. */
export function useRenewMyCertificate() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: ({ file, expiresOn }: { file: File; expiresOn: string }) => {
      const form = new FormData()
      form.append('certificateExpiresOn', expiresOn)
      form.append('certificate', file)
      return api<{ shop: ShopSummary }>('/shops/mine/certificate', { method: 'PUT', body: form })
    },
    onSuccess: ({ shop }) => qc.setQueryData(myShopKeys.all, shop),
  })
}
