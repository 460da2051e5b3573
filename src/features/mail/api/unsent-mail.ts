import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { SendUnsentMailResult, UnsentMailDto } from '@shared/schemas/mail'
import { api } from '@/lib/api-client'

export const unsentMailKeys = {
  all: ['unsent-mail'] as const,
  list: () => [...unsentMailKeys.all, 'list'] as const,
}

export const useUnsentMail = () =>
  useQuery({
    queryKey: unsentMailKeys.list(),
    queryFn: async () => (await api<{ items: UnsentMailDto[] }>('/unsent-mail')).items,
    refetchOnMount: 'always',
  })

/** Both answers change the list: the e-mail left it, or its try count and error moved on. */
export function useSendUnsentMail() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (id: number) => api<SendUnsentMailResult>(`/unsent-mail/${id}/send`, { method: 'POST' }),
    onSettled: () => qc.invalidateQueries({ queryKey: unsentMailKeys.list() }),
  })
}

export function useDismissUnsentMail() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (id: number) => api<void>(`/unsent-mail/${id}/dismiss`, { method: 'POST' }),
    onSettled: () => qc.invalidateQueries({ queryKey: unsentMailKeys.list() }),
  })
}
