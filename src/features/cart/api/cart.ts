import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { CartDto, CartLineInput } from '@shared/schemas/orders'
import { api } from '@/lib/api-client'

export const cartKeys = {
  all: ['cart'] as const,
  detail: () => [...cartKeys.all, 'detail'] as const,
}

export const cartQuery = () =>
  queryOptions({
    queryKey: cartKeys.detail(),
    queryFn: async () => (await api<{ cart: CartDto }>('/cart')).cart,
    // Stock moves while the buyer looks: always ask again when the cart is opened.
    refetchOnMount: 'always',
  })

export const useCart = () => useQuery(cartQuery())

/** Every cart change answers the whole cart, which replaces the cached one. */
function useCartChange<V>(
  request: (v: V) => Promise<{ cart: CartDto }>,
  opts: { handlesError?: boolean } = {},
) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: opts.handlesError ?? false },
    mutationFn: request,
    onSuccess: ({ cart }) => qc.setQueryData(cartKeys.detail(), cart),
  })
}

export const useSetCartLine = (opts: { handlesError?: boolean } = {}) =>
  useCartChange(
    ({ productId, ...line }: CartLineInput & { productId: number }) =>
      api<{ cart: CartDto }>(`/cart/lines/${productId}`, { method: 'PUT', body: line }),
    opts,
  )

export const useRemoveCartLine = () =>
  useCartChange((productId: number) =>
    api<{ cart: CartDto }>(`/cart/lines/${productId}`, { method: 'DELETE' }),
  )

export const useClearCart = () => useCartChange(() => api<{ cart: CartDto }>('/cart', { method: 'DELETE' }))
