import { useSearchParams } from 'react-router-dom'
import type { OrderFilters } from '@/features/orders/api/orders'

/** The list's filters live in the address, so a filtered list can be bookmarked and shared. */
export function useOrderFilters(): [OrderFilters, (next: OrderFilters) => void] {
  const [params, setParams] = useSearchParams()
  const num = (k: string) => {
    const v = Number(params.get(k))
    return Number.isSafeInteger(v) && v > 0 ? v : undefined
  }
  const filters: OrderFilters = {
    status: params.get('status') || undefined,
    shopId: num('shopId'),
    from: params.get('from') || undefined,
    to: params.get('to') || undefined,
    q: params.get('q') || undefined,
    page: num('page') ?? 1,
    pageSize: 25,
  }
  const set = (next: OrderFilters) => {
    const p = new URLSearchParams()
    for (const [k, v] of Object.entries(next)) {
      if (v === undefined || v === '' || k === 'pageSize' || (k === 'page' && v === 1)) continue
      p.set(k, String(v))
    }
    setParams(p, { replace: true })
  }
  return [filters, set]
}
