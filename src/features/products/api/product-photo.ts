import { useMutation, useQueryClient } from '@tanstack/react-query'
import type { ProductRow } from '@shared/schemas/products'
import { productKeys } from '@/features/products/api/products'
import { api } from '@/lib/api-client'

export function useUploadProductPhoto(id: number) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (file: File) => {
      const form = new FormData()
      form.append('photo', file)
      return api<{ product: ProductRow }>(`/products/${id}/photo`, { method: 'POST', body: form })
    },
    onSuccess: ({ product }) => {
      qc.setQueryData(productKeys.detail(id), product)
      return qc.invalidateQueries({ queryKey: productKeys.list() })
    },
  })
}

export function useRemoveProductPhoto(id: number) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: () => api<{ product: ProductRow }>(`/products/${id}/photo`, { method: 'DELETE' }),
    onSuccess: ({ product }) => {
      qc.setQueryData(productKeys.detail(id), product)
      return qc.invalidateQueries({ queryKey: productKeys.list() })
    },
  })
}
