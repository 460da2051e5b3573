import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type {
  ClaimOrderInput,
  MarkPackedInput,
  PackingOrderDto,
  PackingQueueDto,
  PickListDto,
} from '@shared/schemas/packing'
import { api } from '@/lib/api-client'

export const packingKeys = {
  all: ['packing'] as const,
  queue: () => [...packingKeys.all, 'queue'] as const,
  order: (id: number) => [...packingKeys.all, 'order', id] as const,
  pickList: (ids: readonly number[]) =>
    [...packingKeys.all, 'pick-list', [...ids].sort((a, b) => a - b)] as const,
}

/** Where the documents open (the browser shows the PDF; the server sets inline disposition). */
export const packingSlipHref = (orderId: number) => `/api/orders/${orderId}/packing-slip.pdf`
export const pickListPdfHref = (ids: readonly number[]) => `/api/pick-list.pdf?orders=${ids.join(',')}`

export const packingQueueQuery = () =>
  queryOptions({
    queryKey: packingKeys.queue(),
    queryFn: () => api<PackingQueueDto>('/packing/queue'),
    // Other packers claim orders meanwhile: look again on every visit and every minute.
    refetchOnMount: 'always',
    refetchInterval: 60_000,
  })

export const usePackingQueue = () => useQuery(packingQueueQuery())

export const usePackingOrder = (id: number) =>
  useQuery({
    queryKey: packingKeys.order(id),
    queryFn: async () => (await api<{ order: PackingOrderDto }>(`/packing/orders/${id}`)).order,
    refetchOnMount: 'always',
  })

export const usePickList = (ids: readonly number[]) =>
  useQuery({
    queryKey: packingKeys.pickList(ids),
    queryFn: () => api<PickListDto>(`/pick-list?orders=${ids.join(',')}`),
    enabled: ids.length > 0,
    placeholderData: keepPreviousData,
  })

export function useClaimOrder() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: ({ id, ...body }: ClaimOrderInput & { id: number }) =>
      api<{ order: PackingOrderDto }>(`/orders/${id}/claim`, { method: 'POST', body }),
    onSettled: () => qc.invalidateQueries({ queryKey: packingKeys.all }),
  })
}

export function useMarkPacked(id: number) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (body: MarkPackedInput) =>
      api<{ order: PackingOrderDto }>(`/orders/${id}/packed`, { method: 'POST', body }),
    onSuccess: ({ order }) => qc.setQueryData(packingKeys.order(id), order),
    onSettled: () => qc.invalidateQueries({ queryKey: packingKeys.all }),
  })
}
