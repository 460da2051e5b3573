import { useMutation, useQuery } from '@tanstack/react-query'
import type { PaymentDto, ReceivablesDto, RecordPaymentInput, ReminderDto } from '@shared/schemas/payments'
import { api, qs } from '@/lib/api-client'

export const paymentKeys = {
  all: ['payments'] as const,
  receivables: () => [...paymentKeys.all, 'receivables'] as const,
}

export const paymentsCsvHref = (f: { from?: string; to?: string; shopId?: number }) =>
  `/api/payments.csv${qs(f)}`

/** The page composing this refreshes the invoice once the payment is in (features do not share keys). */
export function useRecordPayment(invoiceId: number) {
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (body: RecordPaymentInput) =>
      api<{ payment: PaymentDto }>(`/invoices/${invoiceId}/payments`, { method: 'POST', body }),
  })
}

export function useSendReminder(invoiceId: number) {
  return useMutation({
    mutationFn: () => api<{ reminder: ReminderDto }>(`/invoices/${invoiceId}/remind`, { method: 'POST' }),
  })
}

export const useReceivables = () =>
  useQuery({
    queryKey: paymentKeys.receivables(),
    queryFn: () => api<ReceivablesDto>('/receivables'),
    refetchOnMount: 'always',
  })
