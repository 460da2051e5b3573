import { useMemo } from 'react'
import type { ReactNode } from 'react'
import { formatDate } from '@shared/domain/dates/dates'
import { formatBaseQuantity, formatEnteredQuantity, formatUnitCost } from '@shared/schemas/ingredients'
import type { PurchaseBatchUse, PurchaseDetail } from '@shared/schemas/ingredients'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { Money } from '@/components/ui/money'
import { ProgressBar } from '@/components/ui/progress'
import { paths } from '@/config/paths'

function Item({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div>
      <dt className="text-sm text-ink-700">{label}</dt>
      <dd className="mt-0.5 font-medium text-ink-900">{children}</dd>
    </div>
  )
}

const col = dataTableColumnHelper<PurchaseBatchUse>()

/** One purchase: what was bought, what it cost, what is left, and the batches it went into. */
export function PurchaseSummary({ purchase: p, currency }: { purchase: PurchaseDetail; currency: string }) {
  const columns = useMemo(
    () =>
      col.columns([
        col.accessor('lotCode', { header: 'Batch lot' }),
        col.accessor((b) => b.productName ?? '—', { id: 'product', header: 'Product' }),
        col.accessor('pourDate', { header: 'Poured', cell: (c) => formatDate(c.getValue()) }),
        col.accessor('quantity', {
          header: 'Used',
          meta: { align: 'end' },
          cell: (c) => formatBaseQuantity(c.getValue(), p.unit),
        }),
      ]),
    [p.unit],
  )
  const used = p.quantity - p.remaining
  return (
    <div className="flex flex-col gap-6">
      <Card>
        <CardHeader title="Purchase" as="h2" />
        <CardBody className="flex flex-col gap-5">
          <dl className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
            <Item label="Supplier">{p.supplier}</Item>
            <Item label="Supplier lot code">{p.supplierLotCode ?? '—'}</Item>
            <Item label="Received">{formatDate(p.receivedOn)}</Item>
            <Item label="Bought">
              {formatEnteredQuantity(p.enteredQuantity, p.enteredUnit)}
              {p.enteredUnit === 'oz' || p.enteredUnit === 'lb'
                ? ` = ${formatBaseQuantity(p.quantity, p.unit)}`
                : ''}
            </Item>
            <Item label="Cost">
              <Money cents={p.costCents} currency={currency} /> +{' '}
              <Money cents={p.freightCents} currency={currency} /> freight ={' '}
              <Money cents={p.totalCents} currency={currency} />
            </Item>
            <Item label="Unit cost">{formatUnitCost(p.unitCost, p.unit, currency)}</Item>
            {p.notes ? (
              <div className="sm:col-span-2 lg:col-span-3">
                <dt className="text-sm text-ink-700">Notes</dt>
                <dd className="mt-0.5 whitespace-pre-line text-ink-900">{p.notes}</dd>
              </div>
            ) : null}
          </dl>
          <ProgressBar
            label="Left of this purchase"
            value={p.quantity > 0 ? p.remaining / p.quantity : 0}
            valueText={`${formatBaseQuantity(p.remaining, p.unit)} of ${formatBaseQuantity(p.quantity, p.unit)}`}
            tone={p.remaining === 0 ? 'clay' : 'olive'}
          />
          {used > 0 ? (
            <p className="text-sm text-ink-700">{formatBaseQuantity(used, p.unit)} has gone into batches.</p>
          ) : null}
        </CardBody>
      </Card>
      <section aria-labelledby="purchase-batches" className="flex flex-col gap-3">
        <h2 id="purchase-batches" className="text-lg font-medium text-ink-900">
          Batches that used it
        </h2>
        <DataTable
          label="Batches that used this purchase"
          columns={columns}
          data={p.batches}
          getRowId={(b) => String(b.batchId)}
          rowHref={(b) => paths.owner.batch(b.batchId)}
          emptyMessage="No batch has used this purchase yet."
        />
      </section>
    </div>
  )
}
