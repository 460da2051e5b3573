import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type {
  AcceptSuggestionsInput,
  PriceBreakView,
  PriceWarning,
  PricingItem,
  PricingOverview,
} from '@shared/schemas/pricing'
import { api } from '@/lib/api-client'

export const pricingKeys = {
  all: ['pricing'] as const,
  overview: () => [...pricingKeys.all, 'overview'] as const,
  tiers: () => [...pricingKeys.all, 'tiers'] as const,
}

export const pricingQuery = () =>
  queryOptions({
    queryKey: pricingKeys.overview(),
    queryFn: () => api<PricingOverview>('/pricing'),
    // Costs move with every purchase and recipe edit, made on other screens.
    refetchOnMount: 'always',
  })
export const usePricing = () => useQuery(pricingQuery())

/** Puts returned rows into the overview at once, so the table shows the new prices without a flash. */
function mergeItems(qc: ReturnType<typeof useQueryClient>, items: PricingItem[]) {
  qc.setQueryData<PricingOverview>(pricingKeys.overview(), (old) =>
    old
      ? { ...old, items: old.items.map((it) => items.find((n) => n.productId === it.productId) ?? it) }
      : old,
  )
}

export function useSavePriceBreaks() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: ({
      productId,
      tierId,
      breaks,
    }: {
      productId: number
      tierId: number
      breaks: PriceBreakView[]
    }) =>
      api<{ item: PricingItem; warnings: PriceWarning[] }>(`/pricing/${productId}/${tierId}`, {
        method: 'PUT',
        body: { breaks },
      }),
    onSuccess: ({ item }) => {
      mergeItems(qc, [item])
      return qc.invalidateQueries({ queryKey: pricingKeys.all })
    },
  })
}

export function useAcceptSuggestions() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: AcceptSuggestionsInput) =>
      api<{ accepted: number; items: PricingItem[] }>('/pricing/accept', { method: 'POST', body: input }),
    onSuccess: ({ items }) => {
      mergeItems(qc, items)
      return qc.invalidateQueries({ queryKey: pricingKeys.all })
    },
  })
}
