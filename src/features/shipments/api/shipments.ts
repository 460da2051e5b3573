import { useMutation } from '@tanstack/react-query'
import type { ShipOrderInput, ShipResultDto } from '@shared/schemas/shipments'
import { api } from '@/lib/api-client'

/** Ships a packed order; the page that composes it refreshes the order on success. */
export function useShipOrder(id: number) {
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (body: ShipOrderInput) => api<ShipResultDto>(`/orders/${id}/ship`, { method: 'POST', body }),
  })
}
