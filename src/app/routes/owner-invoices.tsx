import { useMemo } from 'react'
import { useSearchParams } from 'react-router-dom'
import { DOCUMENT_STATUSES, DOCUMENT_STATUS_LABELS } from '@shared/schemas/invoices'
import { Button, buttonClasses } from '@/components/ui/button'
import { Card, CardBody } from '@/components/ui/card'
import { Field, Input, Select } from '@/components/ui/field'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { Stat } from '@/components/ui/stat'
import { Money } from '@/components/ui/money'
import { paths } from '@/config/paths'
import { invoicesCsvHref, useInvoices } from '@/features/invoices/api/invoices'
import type { InvoiceFilter } from '@/features/invoices/api/invoices'
import { InvoicesTable } from '@/features/invoices/components/invoices-table'
import { paymentsCsvHref } from '@/features/payments/api/payments'
import { useShops, useStudioCurrency } from '@/features/studio/api/studio'

/** Every invoice and credit note, with filters kept in the address (so "Overdue" can be linked to). */
export function Component() {
  const [params, setParams] = useSearchParams()
  const filter: InvoiceFilter = useMemo(
    () => ({
      status: params.get('status') || undefined,
      shopId: params.get('shopId') ? Number(params.get('shopId')) : undefined,
      from: params.get('from') || undefined,
      to: params.get('to') || undefined,
    }),
    [params],
  )
  const invoices = useInvoices(filter)
  const shops = useShops()
  const currency = useStudioCurrency()
  const set = (key: string, value: string) => {
    const next = new URLSearchParams(params)
    if (value) next.set(key, value)
    else next.delete(key)
    setParams(next, { replace: true })
  }
  const items = invoices.data ?? []
  const owed = items.reduce((n, i) => n + i.outstandingCents, 0)
  const overdue = items.filter((i) => i.status === 'overdue')
  const filtered = Boolean(filter.status || filter.shopId || filter.from || filter.to)

  return (
    <>
      <PageHeader
        title="Invoices"
        description="Raised when an order ships (at confirmation for prepay accounts), numbered without gaps per year. A void invoice stays on file beside its credit note."
        actions={
          <>
            <a href={invoicesCsvHref(filter)} download className={buttonClasses('secondary')}>
              Export invoices (CSV)
            </a>
            <a
              href={paymentsCsvHref({ from: filter.from, to: filter.to, shopId: filter.shopId })}
              download
              className={buttonClasses('secondary')}
            >
              Export payments (CSV)
            </a>
          </>
        }
      />
      <div className="flex flex-col gap-6">
        <div className="grid gap-4 sm:grid-cols-3">
          <Stat label={filtered ? 'Invoices shown' : 'Invoices'} value={items.length} />
          <Stat
            label="Still owed"
            value={<Money cents={owed} currency={currency} />}
            hint={filtered ? 'On the invoices shown' : 'On all invoices'}
          />
          <Stat
            label="Overdue"
            value={<Money cents={overdue.reduce((n, i) => n + i.outstandingCents, 0)} currency={currency} />}
            hint={`${overdue.length} ${overdue.length === 1 ? 'invoice' : 'invoices'}`}
            tone={overdue.length ? 'clay' : 'default'}
          />
        </div>
        <Card>
          <CardBody>
            <form
              aria-label="Filter invoices"
              onSubmit={(e) => e.preventDefault()}
              className="grid gap-4 sm:grid-cols-2 lg:grid-cols-[1fr_1.5fr_1fr_1fr_auto] lg:items-end"
            >
              <Field label="Status">
                <Select value={filter.status ?? ''} onChange={(e) => set('status', e.target.value)}>
                  <option value="">Any status</option>
                  {DOCUMENT_STATUSES.map((s) => (
                    <option key={s} value={s}>
                      {DOCUMENT_STATUS_LABELS[s]}
                    </option>
                  ))}
                </Select>
              </Field>
              <Field label="Shop">
                <Select value={filter.shopId ?? ''} onChange={(e) => set('shopId', e.target.value)}>
                  <option value="">All shops</option>
                  {(shops.data ?? [])
                    .filter((s) => s.status !== 'applied' && s.status !== 'declined')
                    .map((s) => (
                      <option key={s.id} value={s.id}>
                        {s.tradingName}
                      </option>
                    ))}
                </Select>
              </Field>
              <Field label="Issued from">
                <Input
                  type="date"
                  value={filter.from ?? ''}
                  max={filter.to}
                  onChange={(e) => set('from', e.target.value)}
                />
              </Field>
              <Field label="Issued until">
                <Input
                  type="date"
                  value={filter.to ?? ''}
                  min={filter.from}
                  onChange={(e) => set('to', e.target.value)}
                />
              </Field>
              <Button
                variant="secondary"
                disabled={!filtered}
                onClick={() => setParams(new URLSearchParams(), { replace: true })}
              >
                Clear filters
              </Button>
            </form>
          </CardBody>
        </Card>
        {invoices.isPending ? (
          <LoadingBlock label="Loading invoices…" />
        ) : (
          <InvoicesTable
            items={items}
            currency={currency}
            showShop
            rowHref={(i) => paths.owner.invoice(i.id)}
            emptyMessage={
              filtered
                ? 'No invoices match these filters.'
                : 'No invoices yet: they are raised when orders ship.'
            }
          />
        )}
      </div>
    </>
  )
}
