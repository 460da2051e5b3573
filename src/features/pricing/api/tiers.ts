import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { TierCreateInput, TierRow, TierUpdateInput } from '@shared/schemas/pricing'
import { pricingKeys } from '@/features/pricing/api/pricing'
import { api } from '@/lib/api-client'

export const useTiers = () =>
  useQuery({
    queryKey: pricingKeys.tiers(),
    queryFn: async () => (await api<{ items: TierRow[] }>('/price-tiers')).items,
  })

// A tier's margin changes every suggestion on the pricing screen: both are refreshed.
export function useCreateTier() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: TierCreateInput) =>
      api<{ tier: TierRow }>('/price-tiers', { method: 'POST', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: pricingKeys.all }),
  })
}

export function useUpdateTier(id: number) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (patch: TierUpdateInput) =>
      api<{ tier: TierRow }>(`/price-tiers/${id}`, { method: 'PATCH', body: patch }),
    onSuccess: () => qc.invalidateQueries({ queryKey: pricingKeys.all }),
  })
}
