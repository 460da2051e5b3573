import { useMemo } from 'react'
import type { ReactNode } from 'react'
import { formatDate } from '@shared/domain/dates/dates'
import { formatBaseQuantity, formatEnteredQuantity, formatUnitCost } from '@shared/schemas/ingredients'
import type { PurchaseRow } from '@shared/schemas/ingredients'
import { Badge } from '@/components/ui/badge'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { Money } from '@/components/ui/money'
import { paths } from '@/config/paths'

const col = dataTableColumnHelper<PurchaseRow>()

type Props = {
  items: PurchaseRow[]
  /** The studio's currency (settings). */
  currency: string
  /**
   * `all`: every purchase, naming the ingredient, with supplier and lot in one searchable column.
   * `ingredient`: one ingredient's purchases, supplier lot and supplier apart.
   */
  view: 'all' | 'ingredient'
  label: string
  emptyMessage: ReactNode
  toolbar?: ReactNode
  searchable?: boolean
  searchPlaceholder?: string
  paginate?: boolean
}

/**
 * Purchases (ingredient lots): when each came, what was bought and is left, its cost with freight
 * and the unit cost per g or item; every row opens the purchase. The purchases list and an
 * ingredient's page both show it.
 */
export function PurchaseLotsTable({ items, currency, view, label, emptyMessage, ...table }: Props) {
  const columns = useMemo(
    () =>
      col.columns([
        col.accessor('receivedOn', { header: 'Received', cell: (c) => formatDate(c.getValue()) }),
        ...(view === 'all'
          ? [
              col.accessor('ingredientName', { header: 'Ingredient', meta: { rowLink: true } }),
              // One column for both, so the search finds a lot code too.
              col.accessor((p) => `${p.supplier} ${p.supplierLotCode ?? ''}`, {
                id: 'supplier',
                header: 'Supplier and lot',
                cell: (c) => (
                  <span className="flex flex-col leading-tight">
                    <span>{c.row.original.supplier}</span>
                    <span className="text-xs text-ink-700">
                      {c.row.original.supplierLotCode ?? 'no lot code'}
                    </span>
                  </span>
                ),
              }),
            ]
          : [
              col.accessor((l) => l.supplierLotCode ?? '—', { id: 'lot', header: 'Supplier lot' }),
              col.accessor('supplier', { header: 'Supplier' }),
            ]),
        col.accessor('quantity', {
          header: 'Bought',
          meta: { align: 'end' },
          cell: (c) => formatEnteredQuantity(c.row.original.enteredQuantity, c.row.original.enteredUnit),
        }),
        col.accessor('remaining', {
          header: 'Left',
          meta: { align: 'end' },
          cell: (c) =>
            c.getValue() === 0 ? (
              <Badge>Used up</Badge>
            ) : (
              formatBaseQuantity(c.getValue(), c.row.original.unit)
            ),
        }),
        col.accessor('totalCents', {
          header: view === 'all' ? 'Total' : 'Cost with freight',
          meta: { align: 'end' },
          cell: (c) => <Money cents={c.getValue()} currency={currency} />,
        }),
        col.accessor('unitCost', {
          header: 'Unit cost',
          meta: { align: 'end' },
          cell: (c) => formatUnitCost(c.getValue(), c.row.original.unit, currency),
        }),
      ]),
    [currency, view],
  )
  return (
    <DataTable
      label={label}
      columns={columns}
      data={items}
      getRowId={(p) => String(p.id)}
      rowHref={(p) => paths.owner.purchase(p.id)}
      emptyMessage={emptyMessage}
      {...table}
    />
  )
}
