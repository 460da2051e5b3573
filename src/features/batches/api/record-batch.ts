import { useMutation, useQueryClient } from '@tanstack/react-query'
import type { BatchDetail, RecordBatchInput } from '@shared/schemas/batches'
import { batchKeys } from '@/features/batches/api/batches'
import { api } from '@/lib/api-client'

export function useRecordBatch() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: RecordBatchInput) =>
      api<{ batch: BatchDetail }>('/batches', { method: 'POST', body: input }),
    onSuccess: ({ batch }) => {
      qc.setQueryData(batchKeys.detail(batch.id), batch)
      // Lots were drawn down: the next suggestion must see what is left.
      return qc.invalidateQueries({ queryKey: batchKeys.all })
    },
  })
}
