import { useState } from 'react'
import { Link, useParams } from 'react-router-dom'
import { useQueryClient } from '@tanstack/react-query'
import { addDays, compareIso, formatDate, isoToday } from '@shared/domain/dates/dates'
import { INVOICE_KIND_LABELS } from '@shared/schemas/invoices'
import { PAYMENT_TERMS_LABELS } from '@shared/schemas/shops'
import { Button, buttonClasses } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { EmptyState } from '@/components/ui/empty-state'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { toast } from '@/components/ui/toast'
import { paths } from '@/config/paths'
import { invoiceKeys, invoicePdfHref, useInvoice, useSendInvoice } from '@/features/invoices/api/invoices'
import { InvoiceStatusBadge } from '@/features/invoices/components/invoice-status-badge'
import { InvoiceSummary } from '@/features/invoices/components/invoice-summary'
import { VoidDialog } from '@/features/invoices/components/void-dialog'
import { paymentKeys, useSendReminder } from '@/features/payments/api/payments'
import { PaymentDialog } from '@/features/payments/components/payment-dialog'
import { CardPaymentsPanel } from '@/features/card-payments/components/card-payments-panel'

/** One invoice or credit note: its PDF, payments, reminders, and voiding it with a credit note. */
export function Component() {
  const { invoiceId } = useParams()
  const id = Number(invoiceId)
  const qc = useQueryClient()
  const invoice = useInvoice(id)
  const send = useSendInvoice(id)
  const remind = useSendReminder(id)
  const [paying, setPaying] = useState(false)
  const [voiding, setVoiding] = useState(false)
  const back = { to: paths.owner.invoices, label: 'Invoices' }
  const refresh = () => {
    void qc.invalidateQueries({ queryKey: invoiceKeys.all })
    void qc.invalidateQueries({ queryKey: paymentKeys.all })
  }

  if (invoice.isPending) return <LoadingBlock label="Loading the invoice…" />
  if (!invoice.data) {
    return (
      <>
        <PageHeader title="Invoice not found" back={back} />
        <EmptyState title="There is no such invoice." />
      </>
    )
  }
  const inv = invoice.data
  const today = isoToday(new Date(), Intl.DateTimeFormat().resolvedOptions().timeZone)
  const credit = inv.kind === 'credit_note'
  const owed = inv.outstandingCents > 0
  const lastReminder = inv.reminders[0]?.sentOn ?? null
  const nextReminder = lastReminder ? addDays(lastReminder, 7) : null
  const canRemind = owed && (!nextReminder || compareIso(nextReminder, today) <= 0)

  return (
    <>
      <PageHeader
        back={back}
        title={`${INVOICE_KIND_LABELS[inv.kind]} ${inv.number}`}
        description={
          <span className="flex flex-wrap items-center gap-2">
            <InvoiceStatusBadge status={inv.status} />
            <span>
              {inv.shopName} · order {inv.orderNumber}
              {inv.poNumber ? ` · PO ${inv.poNumber}` : ''}
            </span>
          </span>
        }
        actions={
          <>
            <a
              href={invoicePdfHref(inv.id)}
              target="_blank"
              rel="noopener"
              className={buttonClasses('secondary')}
            >
              PDF
            </a>
            <Button
              variant="secondary"
              loading={send.isPending}
              onClick={() =>
                send.mutate(undefined, { onSuccess: (r) => toast.success(`Sent to ${r.sentTo.join(', ')}.`) })
              }
            >
              E-mail again
            </Button>
            {!credit && inv.status !== 'void' ? (
              <>
                <Button
                  variant="secondary"
                  loading={remind.isPending}
                  disabled={!canRemind}
                  title={
                    !owed
                      ? 'Nothing is owed'
                      : canRemind
                        ? undefined
                        : `Next reminder possible on ${formatDate(nextReminder!)}`
                  }
                  onClick={() =>
                    remind.mutate(undefined, {
                      onSuccess: (r) => {
                        toast.success(`Reminder sent to ${r.reminder.sentTo.join(', ')}.`)
                        refresh()
                      },
                    })
                  }
                >
                  Send reminder
                </Button>
                <Button disabled={!owed} onClick={() => setPaying(true)}>
                  Record a payment
                </Button>
              </>
            ) : null}
          </>
        }
      />

      <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
        <div className="flex min-w-0 flex-col gap-6">
          {inv.status === 'void' ? (
            <Card className="border-l-4 border-clay-600">
              <CardBody className="text-sm text-ink-800">
                Void{inv.voidedAt ? ` since ${formatDate(inv.voidedAt.slice(0, 10))}` : ''}: {inv.voidReason}.{' '}
                {inv.creditNote ? (
                  <>
                    Cancelled by credit note{' '}
                    <Link
                      to={paths.owner.invoice(inv.creditNote.id)}
                      className="font-medium text-olive-800 underline"
                    >
                      {inv.creditNote.number}
                    </Link>
                    .
                  </>
                ) : null}
              </CardBody>
            </Card>
          ) : null}
          {credit && inv.creditsInvoice ? (
            <Card>
              <CardBody className="text-sm text-ink-800">
                This credit note cancels invoice{' '}
                <Link
                  to={paths.owner.invoice(inv.creditsInvoice.id)}
                  className="font-medium text-olive-800 underline"
                >
                  {inv.creditsInvoice.number}
                </Link>{' '}
                in full.
              </CardBody>
            </Card>
          ) : null}
          <InvoiceSummary invoice={inv} />
          <CardPaymentsPanel invoice={inv} onChanged={refresh} />
        </div>

        <div className="flex min-w-0 flex-col gap-6">
          <Card>
            <CardHeader title="Details" />
            <CardBody>
              <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2 text-sm">
                <dt className="text-ink-600">Issued</dt>
                <dd>{formatDate(inv.issueDate)}</dd>
                {!credit ? (
                  <>
                    <dt className="text-ink-600">Due</dt>
                    <dd>{formatDate(inv.dueDate)}</dd>
                  </>
                ) : null}
                <dt className="text-ink-600">Terms</dt>
                <dd>{PAYMENT_TERMS_LABELS[inv.terms]}</dd>
                <dt className="text-ink-600">Order</dt>
                <dd>
                  <Link to={paths.owner.order(inv.orderId)} className="text-olive-800 underline">
                    {inv.orderNumber}
                  </Link>
                </dd>
                <dt className="text-ink-600">PO number</dt>
                <dd>{inv.poNumber ?? '—'}</dd>
                {inv.shipment ? (
                  <>
                    <dt className="text-ink-600">Shipped</dt>
                    <dd>
                      {formatDate(inv.shipment.shipDate)}, {inv.shipment.carrier}
                      <span className="block font-mono">{inv.shipment.trackingNumber}</span>
                    </dd>
                  </>
                ) : null}
              </dl>
            </CardBody>
          </Card>
          <Card>
            <CardHeader title="Bill to" />
            <CardBody className="text-sm text-ink-800">
              <p className="font-medium text-ink-900">{inv.billTo.legalName}</p>
              {inv.billTo.tradingName !== inv.billTo.legalName ? (
                <p>Trading as {inv.billTo.tradingName}</p>
              ) : null}
              <p>Attn. {inv.billTo.contactName}</p>
              {inv.billTo.lines.map((l) => (
                <p key={l}>{l}</p>
              ))}
              <p className="mt-1">{inv.billTo.contactEmail}</p>
              {inv.billTo.taxId ? <p>Tax / resale id {inv.billTo.taxId}</p> : null}
            </CardBody>
          </Card>
          {!credit ? (
            <Card>
              <CardHeader title="Reminders" />
              <CardBody className="text-sm">
                {inv.reminders.length === 0 ? (
                  <p className="text-ink-700">None sent.</p>
                ) : (
                  <ul className="flex flex-col gap-1.5">
                    {inv.reminders.map((r) => (
                      <li key={`${r.sentOn}-${r.sentTo}`}>
                        {formatDate(r.sentOn)},{' '}
                        {r.source === 'daily' ? 'daily reminder' : `by ${r.sentBy ?? 'the studio'}`}
                        <span className="block text-xs text-ink-600">{r.sentTo}</span>
                      </li>
                    ))}
                  </ul>
                )}
                {owed && nextReminder && !canRemind ? (
                  <p className="mt-2 text-ink-700">The next reminder can go on {formatDate(nextReminder)}.</p>
                ) : null}
              </CardBody>
            </Card>
          ) : null}
          {!credit && inv.status !== 'void' ? (
            <Card>
              <CardHeader title="Void this invoice" />
              <CardBody className="flex flex-col items-start gap-3 text-sm text-ink-700">
                <p>
                  {inv.paidCents > 0
                    ? 'Payments are recorded against it, so it cannot be voided.'
                    : 'Issues a credit note for the full amount. The invoice keeps its number.'}
                </p>
                <Button variant="danger" disabled={inv.paidCents > 0} onClick={() => setVoiding(true)}>
                  Void with credit note
                </Button>
              </CardBody>
            </Card>
          ) : null}
        </div>
      </div>

      {paying ? (
        <PaymentDialog
          invoice={inv}
          today={today}
          open
          onClose={() => setPaying(false)}
          onRecorded={refresh}
        />
      ) : null}
      <VoidDialog invoice={inv} open={voiding} onClose={() => setVoiding(false)} />
    </>
  )
}
