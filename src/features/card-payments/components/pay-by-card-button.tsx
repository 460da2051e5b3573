import { Button } from '@/components/ui/button'
import type { ButtonSize } from '@/components/ui/button'
import { useCardPaymentsStatus, useStartCardCheckout } from '@/features/card-payments/api/card-payments'

const PAYABLE = ['open', 'part_paid', 'overdue']

type Props = {
  invoice: { id: number; number: string; status: string; kind: string; outstandingCents: number }
  size?: ButtonSize
}

/**
 * Sends the buyer to the card service's hosted page to pay what the invoice still owes. Hidden
 * when the studio takes no cards here, and for paid, void and credit-note documents.
 */
export function PayByCardButton({ invoice, size = 'sm' }: Props) {
  const status = useCardPaymentsStatus()
  const start = useStartCardCheckout(invoice.id)
  if (!status.data?.enabled) return null
  if (invoice.kind !== 'invoice' || !PAYABLE.includes(invoice.status) || invoice.outstandingCents <= 0)
    return null
  return (
    <Button
      size={size}
      loading={start.isPending || start.isSuccess}
      aria-label={`Pay by card: invoice ${invoice.number}`}
      onClick={() =>
        start.mutate(undefined, {
          onSuccess: ({ checkout }) => window.location.assign(checkout.url),
        })
      }
    >
      Pay by card
    </Button>
  )
}
