import { useMemo } from 'react'
import { gramsTo } from '@shared/domain/units/units'
import type { ProductRow } from '@shared/schemas/products'
import { Badge } from '@/components/ui/badge'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { Money } from '@/components/ui/money'
import { paths } from '@/config/paths'
import { ProductTile } from '@/features/products/components/product-tile'

const col = dataTableColumnHelper<ProductRow>()
const columnsIn = (currency: string) =>
  col.columns([
    col.display({
      id: 'photo',
      header: () => <span className="sr-only">Photo</span>,
      cell: (c) => (
        <ProductTile
          sku={c.row.original.sku}
          name={c.row.original.name}
          photoUrl={c.row.original.photo?.url}
        />
      ),
      meta: { className: 'w-14' },
    }),
    col.accessor('sku', { header: 'SKU', meta: { rowLink: true } }),
    col.accessor('name', {
      header: 'Name',
      cell: (c) => (
        <span>
          <span className="block font-medium text-ink-900">{c.getValue()}</span>
          {c.row.original.scentNotes ? (
            <span className="block text-xs text-ink-700">{c.row.original.scentNotes}</span>
          ) : null}
        </span>
      ),
    }),
    col.accessor('recipeName', { header: 'Recipe' }),
    col.accessor('casePack', {
      header: 'Case pack',
      meta: { align: 'end' },
      cell: (c) => `${c.getValue()} bars`,
    }),
    col.accessor('netWeightG', {
      header: 'Net weight',
      meta: { align: 'end' },
      cell: (c) => (
        <span>
          {c.getValue()} g <span className="text-ink-600">· {gramsTo(c.getValue(), 'oz').toFixed(2)} oz</span>
        </span>
      ),
    }),
    col.accessor('msrpCents', {
      header: 'MSRP',
      meta: { align: 'end' },
      cell: (c) => <Money cents={c.getValue()} currency={currency} />,
    }),
    col.accessor((p) => p.costPerBarCents ?? -1, {
      id: 'cost',
      header: 'Cost per bar',
      meta: { align: 'end' },
      cell: (c) => {
        const p = c.row.original
        if (p.costPerBarCents == null) return <span className="text-ink-600">No cost yet</span>
        return (
          <span className="inline-flex items-center gap-2">
            {p.missingCosts.length > 0 ? (
              <span title={`Not priced: ${p.missingCosts.join(', ')}`}>
                <Badge tone="honey">incomplete</Badge>
              </span>
            ) : null}
            <Money cents={p.costPerBarCents} currency={currency} />
          </span>
        )
      },
    }),
    col.accessor((p) => (p.active ? 'On sale' : 'Off sale'), {
      id: 'active',
      header: 'Status',
      cell: (c) => <Badge tone={c.row.original.active ? 'green' : 'neutral'}>{c.getValue()}</Badge>,
    }),
  ])

/** The studio's products; `currency` is the studio's (settings). */
export function ProductsTable({ products, currency }: { products: ProductRow[]; currency: string }) {
  const columns = useMemo(() => columnsIn(currency), [currency])
  return (
    <DataTable
      label="Products"
      columns={columns}
      data={products}
      getRowId={(p) => String(p.id)}
      rowHref={(p) => paths.owner.product(p.id)}
      searchable
      searchPlaceholder="SKU, name or recipe"
      emptyMessage="No products yet. Add the first bar you sell."
    />
  )
}
