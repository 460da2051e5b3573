import { useMutation, useQuery } from '@tanstack/react-query'
import type {
  CardCheckoutDto,
  CardCheckoutStateDto,
  CardPaymentProblemDto,
  CardPaymentsStatusDto,
  RefundDto,
  RefundInput,
} from '@shared/schemas/card-payments'
import { api } from '@/lib/api-client'

export const cardPaymentKeys = {
  all: ['card-payments'] as const,
  status: () => [...cardPaymentKeys.all, 'status'] as const,
  checkout: (invoiceId: number, sessionId: string) =>
    [...cardPaymentKeys.all, 'checkout', invoiceId, sessionId] as const,
  problems: () => [...cardPaymentKeys.all, 'problems'] as const,
}

/** Whether the studio takes cards here; the pay-by-card button hides without it. */
export const useCardPaymentsStatus = () =>
  useQuery({
    queryKey: cardPaymentKeys.status(),
    queryFn: () => api<CardPaymentsStatusDto>('/card-payments/status'),
    staleTime: 5 * 60_000,
  })

/** Opens a hosted checkout for what the invoice owes; the caller sends the browser to its page. */
export function useStartCardCheckout(invoiceId: number) {
  return useMutation({
    mutationFn: () =>
      api<{ checkout: CardCheckoutDto }>(`/invoices/${invoiceId}/card-checkout`, { method: 'POST' }),
  })
}

/** The return page asks until the card service's confirmation has landed (or a few minutes pass). */
export function useCardCheckoutState(invoiceId: number, sessionId: string, enabled: boolean) {
  return useQuery({
    queryKey: cardPaymentKeys.checkout(invoiceId, sessionId),
    queryFn: async () =>
      (await api<{ checkout: CardCheckoutStateDto }>(`/invoices/${invoiceId}/card-checkouts/${sessionId}`))
        .checkout,
    enabled,
    refetchInterval: (q) => (q.state.data?.status === 'open' && q.state.dataUpdateCount < 120 ? 1500 : false),
  })
}

/** The page composing this refreshes the invoice once the refund is in (features do not share keys). */
export function useRefundPayment(paymentId: number) {
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (body: RefundInput) =>
      api<{ refund: RefundDto }>(`/payments/${paymentId}/refunds`, { method: 'POST', body }),
  })
}

export const useCardProblems = () =>
  useQuery({
    queryKey: cardPaymentKeys.problems(),
    queryFn: async () => (await api<{ items: CardPaymentProblemDto[] }>('/card-payments/problems')).items,
    refetchOnMount: 'always',
  })

export function useDismissCardProblem() {
  return useMutation({
    mutationFn: (id: number) => api<void>(`/card-payments/problems/${id}/dismiss`, { method: 'POST' }),
  })
}
