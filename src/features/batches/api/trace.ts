import { queryOptions, useQuery } from '@tanstack/react-query'
import type { TraceLotOption, TraceResult } from '@shared/schemas/batches'
import { batchKeys } from '@/features/batches/api/batches'
import { api } from '@/lib/api-client'

export const traceLotsQuery = () =>
  queryOptions({
    queryKey: [...batchKeys.trace(), 'lots'] as const,
    queryFn: async () => (await api<{ items: TraceLotOption[] }>('/trace/ingredient-lots')).items,
    refetchOnMount: 'always',
  })

export const useTraceLots = () => useQuery(traceLotsQuery())

export const traceQuery = (lotId: number) =>
  queryOptions({
    queryKey: [...batchKeys.trace(), 'lot', lotId] as const,
    queryFn: async () => (await api<{ trace: TraceResult }>(`/trace/ingredient-lots/${lotId}`)).trace,
    refetchOnMount: 'always',
  })

export const useTrace = (lotId: number | null) =>
  useQuery({ ...traceQuery(lotId ?? 0), enabled: lotId !== null })

/** The CSV download is a plain link: the browser saves the attachment with the session cookie. */
export const traceCsvHref = (lotId: number) => `/api/trace/ingredient-lots/${lotId}.csv`
