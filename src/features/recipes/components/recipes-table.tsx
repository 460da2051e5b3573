import { useMemo } from 'react'
import type { RecipeListItem } from '@shared/schemas/recipes'
import { Badge } from '@/components/ui/badge'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { Money } from '@/components/ui/money'
import { paths } from '@/config/paths'

const col = dataTableColumnHelper<RecipeListItem>()

const pct = (n: number) => `${Number(n.toFixed(2))} %`

/** "Olive oil 40 %, Coconut oil 25 %, +3 more" */
export function oilsSummary(oils: RecipeListItem['oils'], shown = 2) {
  const head = oils.slice(0, shown).map((o) => `${o.name} ${pct(o.pct)}`)
  return oils.length > shown ? `${head.join(', ')}, +${oils.length - shown} more` : head.join(', ')
}

export function RecipesTable({
  recipes,
  currency,
  emptyMessage,
}: {
  recipes: RecipeListItem[]
  currency: string
  emptyMessage: string
}) {
  const columns = useMemo(
    () =>
      col.columns([
        col.accessor('name', { header: 'Recipe' }),
        col.accessor((r) => oilsSummary(r.oils), {
          id: 'oils',
          header: 'Oils',
          meta: { wrap: true },
        }),
        col.accessor('superfatPct', {
          header: 'Superfat',
          meta: { align: 'end' },
          cell: (c) => pct(c.getValue()),
        }),
        col.accessor('cureDays', {
          header: 'Cure',
          meta: { align: 'end' },
          cell: (c) => `${c.getValue()} days`,
        }),
        col.accessor('barsPerMould', {
          header: 'Bars per mould',
          meta: { align: 'end' },
          cell: (c) => (
            <span title={`${c.row.original.barsKeptBack} kept back`}>
              {c.getValue()} <span className="text-ink-600">({c.row.original.barsKeptBack} kept)</span>
            </span>
          ),
        }),
        col.accessor((r) => r.costPerBarCents ?? -1, {
          id: 'cost',
          header: 'Cost per bar',
          meta: { align: 'end' },
          cell: (c) => {
            const r = c.row.original
            if (r.costPerBarCents == null) return '—'
            return (
              <span className="inline-flex items-center gap-2">
                {r.missingCosts.length > 0 ? (
                  <Badge tone="honey">
                    <span title={`No price yet: ${r.missingCosts.join(', ')}`}>Costs missing</span>
                  </Badge>
                ) : null}
                <Money cents={r.costPerBarCents} currency={currency} />
              </span>
            )
          },
        }),
      ]),
    [currency],
  )
  return (
    <DataTable
      label="Recipes"
      columns={columns}
      data={recipes}
      getRowId={(r) => String(r.id)}
      rowHref={(r) => paths.owner.recipe(r.id)}
      searchable
      emptyMessage={emptyMessage}
      initialSorting={[{ id: 'name', desc: false }]}
    />
  )
}
