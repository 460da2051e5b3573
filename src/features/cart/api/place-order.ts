import { useMutation, useQueryClient } from '@tanstack/react-query'
import type { OrderDto, PlaceOrderInput } from '@shared/schemas/orders'
import { cartKeys } from '@/features/cart/api/cart'
import { api } from '@/lib/api-client'

/**
 * Places the cart as an order. The caller makes one Idempotency-Key per attempt (and keeps it
 * while that attempt is retried), so a double click or a resent request makes a single order.
 */
export function usePlaceOrder() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: ({ idempotencyKey, ...input }: PlaceOrderInput & { idempotencyKey: string }) =>
      api<{ order: OrderDto }>('/orders', {
        method: 'POST',
        body: input,
        headers: { 'Idempotency-Key': idempotencyKey },
      }),
    onSettled: () => qc.invalidateQueries({ queryKey: cartKeys.all }),
  })
}
