import { useEffect, useState } from 'react'
import { useParams, useSearchParams } from 'react-router-dom'
import { useQueryClient } from '@tanstack/react-query'
import { formatCents } from '@shared/domain/money/money'
import { LinkButton } from '@/components/ui/button'
import { Card, CardBody } from '@/components/ui/card'
import { PageHeader } from '@/components/ui/page-header'
import { Spinner } from '@/components/ui/spinner'
import { paths } from '@/config/paths'
import { useCardCheckoutState } from '@/features/card-payments/api/card-payments'
import { PayByCardButton } from '@/features/card-payments/components/pay-by-card-button'
import { invoiceKeys, useInvoice } from '@/features/invoices/api/invoices'

/**
 * Where the card page sends the buyer back. A payment counts once the card service's signed
 * confirmation has reached the studio, so this page asks until it has (usually at once).
 */
export function Component() {
  const { invoiceId } = useParams()
  const id = Number(invoiceId)
  const [search] = useSearchParams()
  const outcome = search.get('outcome') === 'paid' ? 'paid' : 'cancelled'
  const sessionId = search.get('session') ?? ''
  const checkout = useCardCheckoutState(
    id,
    sessionId,
    outcome === 'paid' && /^[A-Za-z0-9_]+$/.test(sessionId),
  )
  const invoice = useInvoice(id)
  const qc = useQueryClient()
  const [startedAt] = useState(() => Date.now())
  const status = checkout.data?.status
  useEffect(() => {
    if (status && status !== 'open') void qc.invalidateQueries({ queryKey: invoiceKeys.all })
  }, [status, qc])

  const back = { to: paths.buyer.invoices, label: 'Invoices' }
  const inv = invoice.data
  const number = inv?.number ?? checkout.data?.invoiceNumber ?? ''
  const money = (c: number) => formatCents(c, inv?.currency ?? 'USD')
  // The query stops asking after 120 tries at 1.5 s; say so rather than spin for ever.
  const giveUp = status === 'open' && checkout.dataUpdatedAt - startedAt > 170_000

  let body
  if (outcome === 'cancelled') {
    body = (
      <>
        <p className="text-ink-800">
          No payment was taken. The invoice is as it was: you can pay by card again, or by bank transfer or
          cheque quoting the invoice number.
        </p>
        <div className="flex flex-wrap gap-2">
          {inv ? <PayByCardButton invoice={inv} size="md" /> : null}
          <LinkButton to={paths.buyer.invoices} variant="secondary">
            Back to invoices
          </LinkButton>
        </div>
      </>
    )
  } else if (checkout.isError) {
    body = (
      <p className="text-ink-800">
        We could not find this card payment. Check your invoices: a payment that went through shows there.
      </p>
    )
  } else if (!status || status === 'open') {
    body = giveUp ? (
      <p className="text-ink-800">
        The card service has not confirmed the payment yet. If your card was charged it will show on the
        invoice shortly; there is no need to pay again.
      </p>
    ) : (
      <p className="flex items-center gap-2 text-ink-800" role="status">
        <Spinner /> Waiting for the card service to confirm your payment…
      </p>
    )
  } else if (status === 'paid') {
    body = (
      <div role="status" className="flex flex-col gap-2">
        <p className="text-lg font-medium text-olive-900">
          Thank you: {money(checkout.data!.amountCents)} received by card.
        </p>
        <p className="text-ink-800">
          {inv && inv.outstandingCents === 0
            ? `Invoice ${number} is paid.`
            : inv
              ? `Invoice ${number} still owes ${money(inv.outstandingCents)}.`
              : `The payment is recorded on invoice ${number}.`}{' '}
          A receipt is on its way by e-mail.
        </p>
      </div>
    )
  } else {
    body = (
      <p role="status" className="text-ink-800">
        The card service reported your payment, but it did not match the invoice, so the studio is checking it
        by hand. You do not need to pay again; the studio will be in touch.
      </p>
    )
  }

  return (
    <>
      <PageHeader back={back} title={number ? `Card payment for invoice ${number}` : 'Card payment'} />
      <Card>
        <CardBody className="flex flex-col gap-4">
          {body}
          {outcome === 'paid' && status && status !== 'open' ? (
            <LinkButton to={paths.buyer.invoices} variant="secondary" className="w-fit">
              Back to invoices
            </LinkButton>
          ) : null}
        </CardBody>
      </Card>
    </>
  )
}
