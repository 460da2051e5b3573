import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { CatalogueItem } from '@shared/schemas/catalogue'
import type {
  CancelOrderInput,
  EditOrderLinesInput,
  OrderDto,
  OrderListDto,
  OrderListQueryInput,
  ReorderResultDto,
} from '@shared/schemas/orders'
import { api, qs } from '@/lib/api-client'

export type OrderFilters = Pick<OrderListQueryInput, 'shopId' | 'from' | 'to' | 'q' | 'page' | 'pageSize'> & {
  status?: string
}

export const orderKeys = {
  all: ['orders'] as const,
  lists: () => [...orderKeys.all, 'list'] as const,
  list: (filters: OrderFilters) => [...orderKeys.lists(), filters] as const,
  details: () => [...orderKeys.all, 'detail'] as const,
  detail: (id: number) => [...orderKeys.details(), id] as const,
  productOptions: (id: number) => [...orderKeys.all, 'product-options', id] as const,
}

function filterQuery(filters: OrderFilters) {
  return qs({
    status: filters.status,
    shopId: filters.shopId as number | undefined,
    from: filters.from,
    to: filters.to,
    q: filters.q,
    page: filters.page as number | undefined,
    pageSize: filters.pageSize as number | undefined,
  })
}

export const ordersQuery = (filters: OrderFilters) =>
  queryOptions({
    queryKey: orderKeys.list(filters),
    queryFn: () => api<OrderListDto>(`/orders${filterQuery(filters)}`),
    placeholderData: keepPreviousData,
  })

export const useOrders = (filters: OrderFilters) => useQuery(ordersQuery(filters))

/** The export of the same filters (without paging), for a plain download link. */
export function ordersCsvHref(filters: OrderFilters): string {
  return `/api/orders.csv${filterQuery({ ...filters, page: undefined, pageSize: undefined })}`
}

export const orderQuery = (id: number) =>
  queryOptions({
    queryKey: orderKeys.detail(id),
    queryFn: async () => (await api<{ order: OrderDto }>(`/orders/${id}`)).order,
  })

export const useOrder = (id: number) => useQuery(orderQuery(id))

export const useOrderProductOptions = (id: number, enabled: boolean) =>
  useQuery({
    queryKey: orderKeys.productOptions(id),
    queryFn: async () => (await api<{ items: CatalogueItem[] }>(`/orders/${id}/product-options`)).items,
    enabled,
  })

function useOrderChange<V>(request: (v: V) => Promise<{ order: OrderDto }>, handlesError = false) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError },
    mutationFn: request,
    onSuccess: ({ order }) => {
      qc.setQueryData(orderKeys.detail(order.id), order)
      return qc.invalidateQueries({ queryKey: orderKeys.lists() })
    },
  })
}

export const useConfirmOrder = (id: number) =>
  useOrderChange(() => api<{ order: OrderDto }>(`/orders/${id}/confirm`, { method: 'POST' }))

export const useCancelOrder = (id: number) =>
  useOrderChange(
    (input: CancelOrderInput) =>
      api<{ order: OrderDto }>(`/orders/${id}/cancel`, { method: 'POST', body: input }),
    true,
  )

export const useEditOrderLines = (id: number) =>
  useOrderChange(
    (input: EditOrderLinesInput) =>
      api<{ order: OrderDto }>(`/orders/${id}/lines`, { method: 'PATCH', body: input }),
    true,
  )

/** Puts the order's lines into the cart; the caller refreshes the cart from the answer. */
export const useReorder = (id: number) =>
  useMutation({ mutationFn: () => api<ReorderResultDto>(`/orders/${id}/reorder`, { method: 'POST' }) })
