import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { QueryClient } from '@tanstack/react-query'
import type {
  ApproveShopInput,
  DeclineShopInput,
  InviteBuyerInput,
  ShopAccount,
  ShopSummary,
  ShopUpdateInput,
} from '@shared/schemas/shops'
import type { UserRow } from '@shared/schemas/users'
import { api } from '@/lib/api-client'

export const shopKeys = {
  all: ['shops'] as const,
  list: () => [...shopKeys.all, 'list'] as const,
  detail: (id: number) => [...shopKeys.all, 'detail', id] as const,
  tiers: () => [...shopKeys.all, 'tiers'] as const,
}

export const certificateUrl = (id: number) => `/api/shops/${id}/certificate`

export const shopAccountsQuery = () =>
  queryOptions({
    queryKey: shopKeys.list(),
    queryFn: async () => (await api<{ items: ShopSummary[] }>('/shops')).items,
  })
export const useShopAccounts = () => useQuery(shopAccountsQuery())

export const useShopAccount = (id: number) =>
  useQuery({
    queryKey: shopKeys.detail(id),
    queryFn: async () => (await api<{ shop: ShopAccount }>(`/shops/${id}`)).shop,
    // The page says itself when the account is not there.
    meta: { handlesError: true },
  })

/** The tiers an account can be put on (names only are shown here). */
export const useTierOptions = () =>
  useQuery({
    queryKey: shopKeys.tiers(),
    queryFn: async () => (await api<{ items: { id: number; name: string }[] }>('/price-tiers')).items,
    staleTime: 5 * 60_000,
  })

function settle(qc: QueryClient, shop: ShopAccount) {
  qc.setQueryData(shopKeys.detail(shop.id), shop)
  return qc.invalidateQueries({ queryKey: shopKeys.list() })
}

export function useApproveShop(id: number) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: ApproveShopInput) =>
      api<{ shop: ShopAccount; buyer: UserRow }>(`/shops/${id}/approve`, { method: 'POST', body: input }),
    onSuccess: ({ shop }) => settle(qc, shop),
  })
}

export function useDeclineShop(id: number) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: DeclineShopInput) =>
      api<{ shop: ShopAccount }>(`/shops/${id}/decline`, { method: 'POST', body: input }),
    onSuccess: ({ shop }) => settle(qc, shop),
  })
}

export type StatusMove = 'hold' | 'close' | 'reactivate'

export function useMoveShop(id: number) {
  const qc = useQueryClient()
  return useMutation({
    // ConfirmDialog shows the error itself.
    meta: { handlesError: true },
    mutationFn: (move: StatusMove) => api<{ shop: ShopAccount }>(`/shops/${id}/${move}`, { method: 'POST' }),
    onSuccess: ({ shop }) => settle(qc, shop),
  })
}

export function useUpdateShop(id: number) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (patch: ShopUpdateInput) =>
      api<{ shop: ShopAccount }>(`/shops/${id}`, { method: 'PATCH', body: patch }),
    onSuccess: ({ shop }) => settle(qc, shop),
  })
}

export function useInviteBuyer(id: number) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: InviteBuyerInput) =>
      api<{ buyer: UserRow }>(`/shops/${id}/buyers`, { method: 'POST', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: shopKeys.all }),
  })
}

export function useReplaceCertificate(id: number) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: ({ file, expiresOn }: { file: File; expiresOn: string }) => {
      const form = new FormData()
      form.append('certificateExpiresOn', expiresOn)
      form.append('certificate', file)
      return api<{ shop: ShopAccount }>(`/shops/${id}/certificate`, { method: 'PUT', body: form })
    },
    onSuccess: ({ shop }) => settle(qc, shop),
  })
}
