import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query'
import type { BatchRow, BatchFilter, PourableProduct } from '@shared/schemas/batches'
import { api, qs } from '@/lib/api-client'

export const batchKeys = {
  all: ['batches'] as const,
  lists: () => [...batchKeys.all, 'list'] as const,
  list: (filter: BatchFilter) => [...batchKeys.lists(), filter] as const,
  detail: (id: number) => [...batchKeys.all, 'detail', id] as const,
  products: () => [...batchKeys.all, 'products'] as const,
  suggestions: () => [...batchKeys.all, 'suggestion'] as const,
  trace: () => [...batchKeys.all, 'trace'] as const,
}

export const batchesQuery = (filter: BatchFilter = {}) =>
  queryOptions({
    queryKey: batchKeys.list(filter),
    queryFn: async () =>
      (
        await api<{ items: BatchRow[] }>(
          `/batches${qs({ productId: filter.productId, status: filter.status, pouredFrom: filter.pouredFrom, pouredTo: filter.pouredTo })}`,
        )
      ).items,
    // Orders reserve and ship bars on other screens: look again on every visit.
    refetchOnMount: 'always',
  })

export const useBatches = (filter: BatchFilter = {}) =>
  useQuery({ ...batchesQuery(filter), placeholderData: keepPreviousData })

export const pourableProductsQuery = () =>
  queryOptions({
    queryKey: batchKeys.products(),
    queryFn: async () => (await api<{ items: PourableProduct[] }>('/batches/products')).items,
  })

export const usePourableProducts = () => useQuery(pourableProductsQuery())
