import { Money } from '@/components/ui/money'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { Stat } from '@/components/ui/stat'
import { formatDate } from '@shared/domain/dates/dates'
import { useInvoices } from '@/features/invoices/api/invoices'
import { InvoicesTable } from '@/features/invoices/components/invoices-table'
import { useStudioCurrency } from '@/features/studio/api/studio'
import { useCardPaymentsStatus } from '@/features/card-payments/api/card-payments'
import { PayByCardButton } from '@/features/card-payments/components/pay-by-card-button'
import type { InvoiceListItem } from '@shared/schemas/invoices'

const payAction = {
  header: 'Pay',
  cell: (invoice: InvoiceListItem) => <PayByCardButton invoice={invoice} />,
}

/** The buyer's own shop's invoices and credit notes, each with its PDF. */
export function Component() {
  const invoices = useInvoices()
  const cards = useCardPaymentsStatus()
  const currency = useStudioCurrency()
  const items = invoices.data ?? []
  const open = items.filter((i) => i.outstandingCents > 0)
  const overdue = open.filter((i) => i.status === 'overdue')
  const nextDue = [...open].sort((a, b) => a.dueDate.localeCompare(b.dueDate))[0]
  return (
    <>
      <PageHeader
        title="Invoices"
        description="Every invoice and credit note of your account. Download the PDF for your records; quote the invoice number with your payment."
      />
      {invoices.isPending ? (
        <LoadingBlock label="Loading your invoices…" />
      ) : (
        <div className="flex flex-col gap-6">
          <div className="grid gap-4 sm:grid-cols-3">
            <Stat
              label="Still to pay"
              value={<Money cents={open.reduce((n, i) => n + i.outstandingCents, 0)} currency={currency} />}
              hint={`${open.length} open ${open.length === 1 ? 'invoice' : 'invoices'}`}
            />
            <Stat
              label="Overdue"
              value={
                <Money cents={overdue.reduce((n, i) => n + i.outstandingCents, 0)} currency={currency} />
              }
              hint={overdue.length ? 'Past the due date' : 'Nothing past due'}
              tone={overdue.length ? 'clay' : 'default'}
            />
            <Stat
              label="Next due"
              value={nextDue ? formatDate(nextDue.dueDate) : '—'}
              hint={nextDue ? nextDue.number : 'Nothing open'}
            />
          </div>
          <InvoicesTable
            items={items}
            currency={currency}
            withPdf
            rowAction={cards.data?.enabled ? payAction : undefined}
            emptyMessage="No invoices yet: they are sent when your orders ship."
          />
        </div>
      )}
    </>
  )
}
