import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { InviteUserInput, UpdateUserInput, UserRow } from '@shared/schemas/users'
import { api } from '@/lib/api-client'

export const userKeys = { all: ['users'] as const, list: () => [...userKeys.all, 'list'] as const }

export const useUsers = () =>
  useQuery({
    queryKey: userKeys.list(),
    queryFn: async () => (await api<{ items: UserRow[] }>('/users')).items,
  })

export function useInviteUser() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: InviteUserInput) => api<{ user: UserRow }>('/users', { method: 'POST', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.all }),
  })
}

export function useUpdateUser() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: ({ id, ...patch }: UpdateUserInput & { id: number }) =>
      api<{ user: UserRow }>(`/users/${id}`, { method: 'PATCH', body: patch }),
    onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.all }),
  })
}

export function useResendInvitation() {
  return useMutation({ mutationFn: (id: number) => api<void>(`/users/${id}/invitation`, { method: 'POST' }) })
}
