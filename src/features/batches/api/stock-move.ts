import { useMutation, useQueryClient } from '@tanstack/react-query'
import type { StockFigures, StockMoveBody, StockMoveRow } from '@shared/schemas/batches'
import { batchKeys } from '@/features/batches/api/batches'
import { api } from '@/lib/api-client'

export function useStockMove(batchId: number) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: StockMoveBody) =>
      api<{ move: StockMoveRow; stock: StockFigures }>(`/batches/${batchId}/moves`, {
        method: 'POST',
        body: input,
      }),
    onSuccess: () =>
      Promise.all([
        qc.invalidateQueries({ queryKey: batchKeys.detail(batchId) }),
        qc.invalidateQueries({ queryKey: batchKeys.lists() }),
        qc.invalidateQueries({ queryKey: batchKeys.trace() }),
      ]),
  })
}
