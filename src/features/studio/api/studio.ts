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

type StudioPublic = { studio: Settings['studio']; currency: string }

export const studioProfileQuery = () =>
  queryOptions({
    queryKey: studioKeys.profile(),
    queryFn: () => api<StudioPublic>('/studio'),
    select: (r: StudioPublic) => r.studio,
    staleTime: 5 * 60_000,
  })
export const useStudioProfile = () => useQuery(studioProfileQuery())

/**
 * The studio's currency (ISO 4217) for amounts a list gives without one, for every role (the
 * settings themselves are the owner's). USD, the settings' default, until it has loaded.
 */
export function useStudioCurrency(): string {
  return useQuery({ ...studioProfileQuery(), select: (r: StudioPublic) => r.currency }).data ?? 'USD'
}

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
