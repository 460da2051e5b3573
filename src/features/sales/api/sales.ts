import { keepPreviousData, useQuery } from '@tanstack/react-query'
import type { SalesQuery, SalesReport } from '@shared/schemas/sales'
import { api, qs } from '@/lib/api-client'

export const salesKeys = {
  all: ['sales'] as const,
  report: (q: SalesQuery) => [...salesKeys.all, 'report', q] as const,
}

const salesQs = (q: SalesQuery) => qs({ from: q.from, to: q.to, by: q.by })
export const salesCsvHref = (q: SalesQuery) => `/api/sales.csv${salesQs(q)}`

export const useSalesReport = (q: SalesQuery, enabled = true) =>
  useQuery({
    queryKey: salesKeys.report(q),
    queryFn: async () => (await api<{ report: SalesReport }>(`/sales${salesQs(q)}`)).report,
    placeholderData: keepPreviousData,
    enabled,
  })
