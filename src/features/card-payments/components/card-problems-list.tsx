import { Link } from 'react-router-dom'
import { useQueryClient } from '@tanstack/react-query'
import { formatCents } from '@shared/domain/money/money'
import { Button } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { toast } from '@/components/ui/toast'
import {
  cardPaymentKeys,
  useCardProblems,
  useDismissCardProblem,
} from '@/features/card-payments/api/card-payments'

const money = (cents: number | null, currency: string | null) =>
  cents === null || !currency ? '—' : formatCents(cents, currency.toUpperCase())

/**
 * Completed card payments that were not recorded (amount or currency not what was asked, or more
 * than the invoice owed by then). The owner settles each with the card service, then dismisses it.
 */
export function CardProblemsList({ invoiceHref }: { invoiceHref: (id: number) => string }) {
  const problems = useCardProblems()
  const dismiss = useDismissCardProblem()
  const qc = useQueryClient()
  const items = problems.data ?? []
  if (items.length === 0) return null
  return (
    <Card className="border-l-4 border-clay-600">
      <CardHeader
        title="Card payments to look at"
        description="The card service reported these payments, but they were not recorded on an invoice. Check them with the card service (refund, or record the payment by hand), then dismiss."
      />
      <CardBody>
        <ul className="divide-y divide-cream-200 text-sm" aria-label="Card payments to look at">
          {items.map((p) => (
            <li key={p.id} className="flex flex-wrap items-start justify-between gap-3 py-3">
              <div className="min-w-0">
                <p className="font-medium text-ink-900">
                  {p.invoiceId && p.invoiceNumber ? (
                    <Link to={invoiceHref(p.invoiceId)} className="text-olive-800 underline">
                      Invoice {p.invoiceNumber}
                    </Link>
                  ) : (
                    'No invoice of ours'
                  )}
                  {p.shopName ? ` · ${p.shopName}` : ''}
                </p>
                <p className="text-ink-800">{p.message}</p>
                <p className="text-xs text-ink-600">
                  Asked {money(p.expectedCents, p.expectedCurrency)} · received{' '}
                  {money(p.receivedCents, p.receivedCurrency)} · {new Date(p.createdAt).toLocaleString()} ·{' '}
                  <span className="font-mono">{p.paymentIntentId ?? p.sessionId}</span>
                </p>
              </div>
              <Button
                size="sm"
                variant="secondary"
                loading={dismiss.isPending && dismiss.variables === p.id}
                onClick={() =>
                  dismiss.mutate(p.id, {
                    onSuccess: () => {
                      toast.success('Dismissed.')
                      void qc.invalidateQueries({ queryKey: cardPaymentKeys.problems() })
                    },
                  })
                }
              >
                Dismiss
              </Button>
            </li>
          ))}
        </ul>
      </CardBody>
    </Card>
  )
}
