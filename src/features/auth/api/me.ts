import { queryOptions, useQuery } from '@tanstack/react-query'
import type { SessionUser } from '@shared/schemas/auth'
import { ApiError, api } from '@/lib/api-client'

export const authKeys = { all: ['auth'] as const, me: () => [...authKeys.all, 'me'] as const }

/** The signed-in user, or null when signed out. */
export async function fetchMe(): Promise<SessionUser | null> {
  try {
    return (await api<{ user: SessionUser }>('/auth/me', { allowUnauthorized: true })).user
  } catch (err) {
    if (err instanceof ApiError && err.status === 401) return null
    throw err
  }
}

export const meQueryOptions = () =>
  queryOptions({ queryKey: authKeys.me(), queryFn: fetchMe, staleTime: 5 * 60_000 })

export function useMe() {
  return useQuery(meQueryOptions())
}
