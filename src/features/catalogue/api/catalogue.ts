import { queryOptions, useQuery } from '@tanstack/react-query'
import type { CatalogueDto, CatalogueItem } from '@shared/schemas/catalogue'
import { api } from '@/lib/api-client'

export const catalogueKeys = {
  all: ['catalogue'] as const,
  list: () => [...catalogueKeys.all, 'list'] as const,
}

export const catalogueQuery = () =>
  queryOptions({
    queryKey: catalogueKeys.list(),
    queryFn: async (): Promise<CatalogueItem[]> => (await api<CatalogueDto>('/catalogue')).items,
  })

export const useCatalogue = () => useQuery(catalogueQuery())
