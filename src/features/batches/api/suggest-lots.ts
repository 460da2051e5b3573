import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query'
import type { BatchSuggestion } from '@shared/schemas/batches'
import { batchKeys } from '@/features/batches/api/batches'
import { api, qs } from '@/lib/api-client'

export type SuggestParams = {
  productId: number
  oilWeightG?: number
  pourDate?: string
  barsCut?: number
  barsKeptBack?: number
}

export const suggestionQuery = (p: SuggestParams) =>
  queryOptions({
    queryKey: [...batchKeys.suggestions(), p] as const,
    queryFn: async () =>
      (await api<{ suggestion: BatchSuggestion }>(`/batches/suggest-lots${qs(p)}`)).suggestion,
    staleTime: 0,
    // The form shows what went wrong beside the fields.
    meta: { handlesError: true },
  })

export const useSuggestion = (p: SuggestParams | null) =>
  useQuery({
    ...suggestionQuery(p ?? { productId: 0 }),
    enabled: p !== null,
    placeholderData: keepPreviousData,
    retry: false,
  })
