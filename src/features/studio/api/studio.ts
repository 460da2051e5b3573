import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { Settings } from '@shared/schemas/settings'
import type { StudioProfileInput } from '@shared/schemas/settings-form'
import type { ShopSummary } from '@shared/schemas/shops'
import { api } from '@/lib/api-client'

export const studioKeys = {
  all: ['studio'] as const,
  profile: () => [...studioKeys.all, 'profile'] as const,
  settings: () => [...studioKeys.all, 'settings'] as const,
  shops: () => [...studioKeys.all, 'shops'] as const,
}

export const studioProfileQuery = () =>
  queryOptions({
    queryKey: studioKeys.profile(),
    queryFn: async () => (await api<{ studio: Settings['studio'] }>('/studio')).studio,
    staleTime: 5 * 60_000,
  })
export const useStudioProfile = () => useQuery(studioProfileQuery())

export const useSettings = () =>
  useQuery({
    queryKey: studioKeys.settings(),
    queryFn: async () => (await api<{ settings: Settings }>('/settings')).settings,
  })

export const useShops = () =>
  useQuery({
    queryKey: studioKeys.shops(),
    queryFn: async () => (await api<{ items: ShopSummary[] }>('/shops')).items,
  })

export function useSaveStudioProfile() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: StudioProfileInput) =>
      api<{ settings: Settings }>('/settings/studio', { method: 'PUT', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: studioKeys.all }),
  })
}
