import { formatDate } from '@shared/domain/dates/dates'
import type { PlanProduct } from '@shared/schemas/planning'
import { Badge } from '@/components/ui/badge'
import { Button } from '@/components/ui/button'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'

const col = dataTableColumnHelper<PlanProduct>()
const num = (n: number) => n.toLocaleString('en-US', { maximumFractionDigits: 1 })

/** Each product's stock, demand, run-out date and suggested pour. */
export function PlanTable({
  products,
  onPlan,
}: {
  products: PlanProduct[]
  onPlan: (p: PlanProduct) => void
}) {
  const columns = col.columns([
    col.accessor('name', {
      header: 'Product',
      cell: (c) => (
        <span>
          <span className="block font-medium text-ink-900">{c.getValue()}</span>
          <span className="block text-xs text-ink-700">
            {c.row.original.sku} · {c.row.original.cureDays}-day cure
          </span>
        </span>
      ),
    }),
    col.accessor('readyBars', {
      header: 'Ready',
      meta: { align: 'end' },
      cell: (c) => {
        const p = c.row.original
        return (
          <span>
            {p.readyBars}
            {p.curingBars || p.plannedBars ? (
              <span className="block text-xs text-ink-700">
                + {p.curingBars} curing{p.plannedBars ? `, ${p.plannedBars} planned` : ''}
              </span>
            ) : null}
          </span>
        )
      },
    }),
    col.accessor('weeklyDemandBars', {
      header: 'Bars a week',
      meta: { align: 'end' },
      cell: (c) => (
        <span>
          {num(c.getValue())}
          {c.row.original.preorderBars ? (
            <span className="block text-xs text-ink-700">+ {c.row.original.preorderBars} pre-ordered</span>
          ) : null}
        </span>
      ),
    }),
    col.accessor((p) => p.runOutDate ?? '9999-12-31', {
      id: 'runOut',
      header: 'Runs out',
      cell: (c) => {
        const p = c.row.original
        if (!p.runOutDate) return <span className="text-ink-700">No demand in the window</span>
        return formatDate(p.runOutDate)
      },
    }),
    col.accessor((p) => p.latestPourDate ?? '9999-12-31', {
      id: 'latest',
      header: 'Pour by',
      cell: (c) => {
        const p = c.row.original
        if (!p.latestPourDate) return '—'
        return (
          <span className="flex flex-col items-start gap-1">
            {formatDate(p.latestPourDate)}
            {p.suggestion?.late ? <Badge tone="clay">Late: pour now</Badge> : null}
          </span>
        )
      },
    }),
    col.display({
      id: 'suggestion',
      header: 'Suggested pour',
      meta: { wrap: true },
      cell: (c) => {
        const p = c.row.original
        if (!p.suggestion)
          return <span className="text-ink-700">{p.runOutDate ? 'None needed within the plan' : 'None'}</span>
        return (
          <span className="flex flex-col items-start gap-1">
            <span>
              {p.suggestion.moulds} {p.suggestion.moulds === 1 ? 'mould' : 'moulds'} · {p.suggestion.bars}{' '}
              bars
            </span>
            {p.shortIngredients.length ? (
              <span className="text-xs text-clay-700" title={p.shortIngredients.join(', ')}>
                {p.shortIngredients.length === 1
                  ? `${p.shortIngredients[0]} to buy`
                  : `${p.shortIngredients.length} ingredients to buy`}
              </span>
            ) : null}
            <Button
              size="sm"
              variant="secondary"
              onClick={() => onPlan(p)}
              aria-label={`Plan this pour of ${p.name}`}
            >
              Plan this pour
            </Button>
          </span>
        )
      },
    }),
  ])
  return (
    <DataTable
      label="Pour plan by product"
      columns={columns}
      data={products}
      getRowId={(p) => String(p.productId)}
      initialSorting={[{ id: 'latest', desc: false }]}
      emptyMessage="No active product with a current recipe."
    />
  )
}
