import type { PlanIngredient } from '@shared/schemas/planning'
import { Badge } from '@/components/ui/badge'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'

const col = dataTableColumnHelper<PlanIngredient>()
export const formatQty = (q: number, unit: 'g' | 'each') =>
  unit === 'each'
    ? `${q.toLocaleString('en-US')} pcs`
    : q >= 1000
      ? `${(q / 1000).toLocaleString('en-US', { maximumFractionDigits: 2 })} kg`
      : `${q.toLocaleString('en-US', { maximumFractionDigits: 1 })} g`

const columns = col.columns([
  col.accessor('name', { header: 'Ingredient' }),
  col.accessor('needed', {
    header: 'The plan needs',
    meta: { align: 'end' },
    cell: (c) => formatQty(c.getValue(), c.row.original.unit),
  }),
  col.accessor('onHand', {
    header: 'On hand',
    meta: { align: 'end' },
    cell: (c) => formatQty(c.getValue(), c.row.original.unit),
  }),
  col.accessor('toBuy', {
    header: 'To buy',
    meta: { align: 'end' },
    cell: (c) =>
      c.getValue() > 0 ? (
        <Badge tone="clay">{formatQty(c.getValue(), c.row.original.unit)}</Badge>
      ) : (
        <span className="text-ink-700">Enough</span>
      ),
  }),
])

/** What the suggested and planned pours take, against the lots on the shelves. */
export function PlanIngredients({ ingredients }: { ingredients: PlanIngredient[] }) {
  return (
    <DataTable
      label="Ingredients the plan needs"
      columns={columns}
      data={ingredients}
      getRowId={(i) => String(i.ingredientId)}
      emptyMessage="The plan has no pours, so it needs nothing."
    />
  )
}
