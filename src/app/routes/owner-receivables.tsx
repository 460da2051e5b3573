import { formatMoney, Money } from '@/components/ui/money'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { Stat } from '@/components/ui/stat'
import { LinkButton } from '@/components/ui/button'
import { formatDate } from '@shared/domain/dates/dates'
import { paths } from '@/config/paths'
import { useReceivables } from '@/features/payments/api/payments'
import { AgeingChart } from '@/features/payments/components/ageing-chart'
import { ReceivablesTable } from '@/features/payments/components/receivables-table'
import { CardProblemsList } from '@/features/card-payments/components/card-problems-list'

/** What the shops owe, by how late it is: the owner's receivables. */
export function Component() {
  const r = useReceivables()
  return (
    <>
      <PageHeader
        title="Receivables"
        description="Open invoices by days past their due date. Paid and void invoices are left out."
        actions={
          <LinkButton to={`${paths.owner.invoices}?status=overdue`} variant="secondary">
            Overdue invoices
          </LinkButton>
        }
      />
      {!r.data ? (
        <LoadingBlock label="Working out what is owed…" />
      ) : (
        <div className="flex flex-col gap-6">
          <CardProblemsList invoiceHref={paths.owner.invoice} />
          <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
            <Stat
              label="Owed in total"
              value={<Money cents={r.data.outstandingCents} currency={r.data.currency} />}
              hint={`As of ${formatDate(r.data.asOf)}`}
            />
            <Stat
              label="Overdue"
              value={<Money cents={r.data.overdueCents} currency={r.data.currency} />}
              hint={r.data.overdueCents ? 'Past the due date' : 'Nothing past due'}
              tone={r.data.overdueCents ? 'clay' : 'default'}
            />
            <Stat
              label="Shops owing"
              value={r.data.shops.length}
              hint={`${r.data.buckets.reduce((n, b) => n + b.invoices, 0)} open invoices`}
            />
          </div>
          <ul className="grid gap-4 sm:grid-cols-3 lg:grid-cols-5" aria-label="Ageing buckets">
            {r.data.buckets.map((b) => (
              <li key={b.bucket}>
                <Stat
                  label={b.label}
                  value={formatMoney(b.cents, r.data.currency)}
                  hint={`${b.invoices} ${b.invoices === 1 ? 'invoice' : 'invoices'}`}
                  tone={
                    b.bucket === 'current' || b.cents === 0
                      ? 'default'
                      : b.bucket === '1_30'
                        ? 'honey'
                        : 'clay'
                  }
                />
              </li>
            ))}
          </ul>
          <Card>
            <CardHeader title="By age" description="Days past due, from the invoice's due date to today." />
            <CardBody>
              <AgeingChart buckets={r.data.buckets} currency={r.data.currency} />
            </CardBody>
          </Card>
          <section aria-labelledby="shops-heading" className="flex flex-col gap-3">
            <h2 id="shops-heading" className="text-lg font-medium text-ink-900">
              By shop
            </h2>
            <ReceivablesTable
              shops={r.data.shops}
              currency={r.data.currency}
              shopHref={(id) => `${paths.owner.invoices}?shopId=${id}`}
            />
          </section>
        </div>
      )}
    </>
  )
}
