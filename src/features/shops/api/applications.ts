import { useMutation } from '@tanstack/react-query'
import type { ApplicationReceipt } from '@shared/schemas/shops'
import { api } from '@/lib/api-client'

/** Sends the public application (multipart: the text fields and the certificate file). */
export function useSubmitApplication() {
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (form: FormData) =>
      api<{ application: ApplicationReceipt }>('/applications', { method: 'POST', body: form }),
  })
}
