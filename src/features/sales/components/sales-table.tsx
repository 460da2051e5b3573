import type { SalesReport, SalesRow } from '@shared/schemas/sales'
import { SALES_GROUP_LABELS } from '@shared/schemas/sales'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { formatMoney } from '@/components/ui/money'

const col = dataTableColumnHelper<SalesRow>()

/** The report's rows with a total line under them. */
export function SalesTable({ report, currency }: { report: SalesReport; currency: string }) {
  const money = (c: number) => formatMoney(c, currency)
  const pct = (p: number | null) => (p === null ? '—' : `${p.toFixed(1)} %`)
  const columns = col.columns([
    col.accessor('label', { header: SALES_GROUP_LABELS[report.by] }),
    col.accessor('orders', { header: 'Orders', meta: { align: 'end' } }),
    col.accessor('bars', { header: 'Bars sold', meta: { align: 'end' } }),
    col.accessor('revenueCents', {
      header: 'Revenue',
      meta: { align: 'end' },
      cell: (c) => money(c.getValue()),
    }),
    col.accessor('costCents', {
      header: 'Cost of bars',
      meta: { align: 'end' },
      cell: (c) => money(c.getValue()),
    }),
    col.accessor('marginCents', {
      header: 'Margin',
      meta: { align: 'end' },
      cell: (c) => money(c.getValue()),
    }),
    col.accessor((r) => r.marginPct ?? -1, {
      id: 'marginPct',
      header: 'Margin %',
      meta: { align: 'end' },
      cell: (c) => pct(c.row.original.marginPct),
    }),
  ])
  const t = report.totals
  return (
    <div className="flex flex-col gap-3">
      <DataTable
        label={`Sales by ${SALES_GROUP_LABELS[report.by].toLowerCase()}`}
        columns={columns}
        data={report.rows}
        getRowId={(r) => String(r.key ?? 'none')}
        emptyMessage="Nothing shipped in this period."
      />
      {report.rows.length ? (
        <p className="text-sm text-ink-800">
          <strong>Total:</strong> {t.orders} {t.orders === 1 ? 'order' : 'orders'}, {t.bars} bars, revenue{' '}
          {money(t.revenueCents)}, cost {money(t.costCents)}, margin {money(t.marginCents)} (
          {pct(t.marginPct)}).
        </p>
      ) : null}
    </div>
  )
}
