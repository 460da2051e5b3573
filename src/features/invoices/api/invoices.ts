import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type {
  InvoiceDto,
  InvoiceListItem,
  InvoiceListQueryInput,
  VoidInvoiceInput,
} from '@shared/schemas/invoices'
import { api, qs } from '@/lib/api-client'

export type InvoiceFilter = Pick<InvoiceListQueryInput, 'from' | 'to' | 'kind'> & {
  status?: string
  shopId?: number
}

export const invoiceKeys = {
  all: ['invoices'] as const,
  lists: () => [...invoiceKeys.all, 'list'] as const,
  list: (filter: InvoiceFilter) => [...invoiceKeys.lists(), filter] as const,
  detail: (id: number) => [...invoiceKeys.all, 'detail', id] as const,
}

const filterQs = (f: InvoiceFilter) =>
  qs({ status: f.status, shopId: f.shopId, from: f.from, to: f.to, kind: f.kind })

export const invoicePdfHref = (id: number) => `/api/invoices/${id}/pdf`
export const invoicesCsvHref = (f: InvoiceFilter) => `/api/invoices.csv${filterQs(f)}`

export const invoicesQuery = (filter: InvoiceFilter = {}) =>
  queryOptions({
    queryKey: invoiceKeys.list(filter),
    queryFn: async () => (await api<{ items: InvoiceListItem[] }>(`/invoices${filterQs(filter)}`)).items,
    // Statuses move with the calendar and with payments recorded elsewhere.
    refetchOnMount: 'always',
  })

export const useInvoices = (filter: InvoiceFilter = {}) =>
  useQuery({ ...invoicesQuery(filter), placeholderData: keepPreviousData })

export const useInvoice = (id: number) =>
  useQuery({
    queryKey: invoiceKeys.detail(id),
    queryFn: async () => (await api<{ invoice: InvoiceDto }>(`/invoices/${id}`)).invoice,
    refetchOnMount: 'always',
  })

export function useVoidInvoice(id: number) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (body: VoidInvoiceInput) =>
      api<{ invoice: InvoiceDto; creditNote: InvoiceDto }>(`/invoices/${id}/void`, { method: 'POST', body }),
    onSuccess: () => qc.invalidateQueries({ queryKey: invoiceKeys.all }),
  })
}

export function useSendInvoice(id: number) {
  return useMutation({
    mutationFn: () => api<{ sentTo: string[] }>(`/invoices/${id}/send`, { method: 'POST' }),
  })
}
