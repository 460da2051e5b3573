import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { ProductDeclaration } from '@shared/schemas/products'
import { productKeys } from '@/features/products/api/products'
import { api } from '@/lib/api-client'

export const useDeclaration = (id: number) =>
  useQuery({
    queryKey: productKeys.declaration(id),
    queryFn: async () =>
      (await api<{ declaration: ProductDeclaration }>(`/products/${id}/declaration`)).declaration,
    // The recipe may have changed on its own screen since the last look.
    refetchOnMount: 'always',
  })

export function useConfirmDeclaration(id: number) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (text: string) =>
      api<{ declaration: ProductDeclaration }>(`/products/${id}/declaration`, {
        method: 'POST',
        body: { text },
      }),
    onSuccess: ({ declaration }) => {
      qc.setQueryData(productKeys.declaration(id), declaration)
      return qc.invalidateQueries({ queryKey: productKeys.detail(id) })
    },
  })
}
