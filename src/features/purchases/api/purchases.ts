import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type {
  ImportPreview,
  ImportResult,
  PurchaseDetail,
  PurchaseInput,
  PurchaseRow,
  UpdatePurchaseInput,
} from '@shared/schemas/ingredients'
import { api, qs } from '@/lib/api-client'

export type PurchaseFilter = { ingredientId?: number; from?: string; to?: string }

export const purchaseKeys = {
  all: ['purchases'] as const,
  lists: () => [...purchaseKeys.all, 'list'] as const,
  list: (filter: PurchaseFilter) => [...purchaseKeys.lists(), filter] as const,
  detail: (id: number) => [...purchaseKeys.all, 'detail', id] as const,
}

export const usePurchases = (filter: PurchaseFilter = {}) =>
  useQuery({
    queryKey: purchaseKeys.list(filter),
    queryFn: async () => (await api<{ items: PurchaseRow[] }>(`/purchases${qs(filter)}`)).items,
    placeholderData: keepPreviousData,
  })

export const usePurchase = (id: number) =>
  useQuery({
    queryKey: purchaseKeys.detail(id),
    queryFn: async () => (await api<{ purchase: PurchaseDetail }>(`/purchases/${id}`)).purchase,
  })

export function useRecordPurchase() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: PurchaseInput) =>
      api<{ purchase: PurchaseRow }>('/purchases', { method: 'POST', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: purchaseKeys.all }),
  })
}

export function useUpdatePurchase() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: ({ id, ...patch }: UpdatePurchaseInput & { id: number }) =>
      api<{ purchase: PurchaseRow }>(`/purchases/${id}`, { method: 'PATCH', body: patch }),
    onSuccess: () => qc.invalidateQueries({ queryKey: purchaseKeys.all }),
  })
}

/** A CSV as pasted text or as a chosen file. */
export type ImportSource = { text: string } | { file: File }

function importBody(source: ImportSource) {
  if ('text' in source) return { csv: source.text }
  const form = new FormData()
  form.append('file', source.file)
  return form
}

export function usePreviewImport() {
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (source: ImportSource) =>
      api<ImportPreview>('/purchases/import/preview', { method: 'POST', body: importBody(source) }),
  })
}

export function useConfirmImport() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (source: ImportSource) =>
      api<ImportResult>('/purchases/import/confirm', { method: 'POST', body: importBody(source) }),
    onSuccess: () => qc.invalidateQueries({ queryKey: purchaseKeys.all }),
  })
}
