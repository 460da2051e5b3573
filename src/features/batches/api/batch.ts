import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { BatchDetail, UpdateBatchInput } from '@shared/schemas/batches'
import { batchKeys } from '@/features/batches/api/batches'
import { api } from '@/lib/api-client'

export const batchQuery = (id: number) =>
  queryOptions({
    queryKey: batchKeys.detail(id),
    queryFn: async () => (await api<{ batch: BatchDetail }>(`/batches/${id}`)).batch,
    refetchOnMount: 'always',
  })

export const useBatch = (id: number) => useQuery(batchQuery(id))

export function useUpdateBatch(id: number) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (patch: UpdateBatchInput) =>
      api<{ batch: BatchDetail }>(`/batches/${id}`, { method: 'PATCH', body: patch }),
    onSuccess: ({ batch }) => {
      qc.setQueryData(batchKeys.detail(id), batch)
      return qc.invalidateQueries({ queryKey: batchKeys.lists() })
    },
  })
}
