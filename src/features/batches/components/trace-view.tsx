import { useMemo } from 'react'
import { Link } from 'react-router-dom'
import type { TraceLotOption, TraceResult, TraceRow } from '@shared/schemas/batches'
import { formatDate } from '@shared/domain/dates/dates'
import { buttonClasses } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { EmptyState } from '@/components/ui/empty-state'
import { Field, Select } from '@/components/ui/field'
import { LoadingBlock } from '@/components/ui/spinner'
import { traceCsvHref } from '@/features/batches/api/trace'
import { formatQuantity } from '@/features/batches/components/format'

const col = dataTableColumnHelper<TraceRow>()

const lotLabel = (l: TraceLotOption) =>
  `${l.supplierLotCode ?? `Lot #${l.id}`} · ${l.supplier} · received ${formatDate(l.receivedOn)}${l.batches ? ` · ${l.batches} ${l.batches === 1 ? 'batch' : 'batches'}` : ' · not used yet'}`

/** The purchase lot to trace, grouped by ingredient. */
export function TraceLotPicker({
  lots,
  value,
  onChange,
}: {
  lots: TraceLotOption[]
  value: number | null
  onChange: (id: number | null) => void
}) {
  const byIngredient = useMemo(() => {
    const groups = new Map<string, TraceLotOption[]>()
    for (const l of lots) groups.set(l.ingredientName, [...(groups.get(l.ingredientName) ?? []), l])
    return [...groups].sort(([a], [b]) => a.localeCompare(b))
  }, [lots])
  return (
    <Field label="Ingredient lot" hint="A purchase, by its supplier's lot code.">
      <Select value={value ?? ''} onChange={(e) => onChange(e.target.value ? Number(e.target.value) : null)}>
        <option value="">Choose a lot…</option>
        {byIngredient.map(([name, items]) => (
          <optgroup key={name} label={name}>
            {items.map((l) => (
              <option key={l.id} value={l.id}>
                {lotLabel(l)}
              </option>
            ))}
          </optgroup>
        ))}
      </Select>
    </Field>
  )
}

/** Where one purchase went: the batches made with it and the shops their bars were shipped to. */
export function TraceTable({ trace, batchHref }: { trace: TraceResult; batchHref: (id: number) => string }) {
  const unit = trace.lot.unit
  const columns = useMemo(
    () =>
      col.columns([
        col.accessor('batchLotCode', {
          header: 'Batch',
          cell: (c) => (
            <Link to={batchHref(c.row.original.batchId)} className="font-mono text-olive-800 underline">
              {c.getValue()}
            </Link>
          ),
        }),
        col.accessor('pourDate', { header: 'Poured', cell: (c) => formatDate(c.getValue()) }),
        col.accessor('productSku', { header: 'Product' }),
        col.accessor('quantityUsed', {
          header: 'Used',
          meta: { align: 'end' },
          cell: (c) => formatQuantity(c.getValue(), unit),
        }),
        col.accessor((r) => r.shopName ?? 'None shipped yet', { id: 'shop', header: 'Shop' }),
        col.accessor((r) => r.orderNumber ?? '—', { id: 'order', header: 'Order' }),
        col.accessor('bars', { header: 'Bars', meta: { align: 'end' } }),
        col.accessor((r) => (r.shipDate ? formatDate(r.shipDate) : '—'), {
          id: 'shipped',
          header: 'Shipped',
        }),
      ]),
    [batchHref, unit],
  )
  const shops = new Set(trace.rows.filter((r) => r.shopName).map((r) => r.shopName))
  return (
    <div className="flex flex-col gap-4">
      <Card>
        <CardHeader
          title={`${trace.lot.ingredientName}, ${trace.lot.supplierLotCode ?? `lot #${trace.lot.id}`}`}
          description={`${trace.lot.supplier}, received ${formatDate(trace.lot.receivedOn)}. ${formatQuantity(trace.lot.quantity, unit)} bought, ${formatQuantity(trace.lot.remaining, unit)} left.`}
          actions={
            <a href={traceCsvHref(trace.lot.id)} download className={buttonClasses('secondary')}>
              Download CSV
            </a>
          }
        />
        <CardBody>
          <p className="text-sm text-ink-800">
            Used in {trace.batches.length} {trace.batches.length === 1 ? 'batch' : 'batches'}; bars from them
            went to {shops.size} {shops.size === 1 ? 'shop' : 'shops'}.
          </p>
        </CardBody>
      </Card>
      {trace.rows.length === 0 ? (
        <EmptyState
          title="No batch has used this lot yet."
          message="Once a batch is poured with it, the batch and its shops show here."
        />
      ) : (
        <DataTable
          label="Where the lot went"
          columns={columns}
          data={trace.rows}
          getRowId={(r, i) => `${r.batchId}-${r.orderNumber ?? ''}-${i}`}
        />
      )}
    </div>
  )
}

export function TraceLoading() {
  return <LoadingBlock label="Following the lot…" />
}
