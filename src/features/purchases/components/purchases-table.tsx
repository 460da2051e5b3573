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

/** Every purchase (lot) with what it cost per g or item and what is left of it. */
export function PurchasesTable({
  items,
  currency,
  toolbar,
}: {
  items: PurchaseRow[]
  currency: string
  toolbar?: ReactNode
}) {
  const columns = useMemo(
    () =>
      col.columns([
        col.accessor('receivedOn', { header: 'Received', cell: (c) => formatDate(c.getValue()) }),
        col.accessor('ingredientName', { header: 'Ingredient', meta: { rowLink: true } }),
        // One column for both, so the search finds a lot code too.
        col.accessor((p) => `${p.supplier} ${p.supplierLotCode ?? ''}`, {
          id: 'supplier',
          header: 'Supplier and lot',
          cell: (c) => (
            <span className="flex flex-col leading-tight">
              <span>{c.row.original.supplier}</span>
              <span className="text-xs text-ink-700">{c.row.original.supplierLotCode ?? 'no lot code'}</span>
            </span>
          ),
        }),
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
          header: 'Total',
          meta: { align: 'end' },
          cell: (c) => <Money cents={c.getValue()} currency={currency} />,
        }),
        col.accessor('unitCost', {
          header: 'Unit cost',
          meta: { align: 'end' },
          cell: (c) => formatUnitCost(c.getValue(), c.row.original.unit, currency),
        }),
      ]),
    [currency],
  )
  return (
    <DataTable
      label="Purchases"
      columns={columns}
      data={items}
      getRowId={(p) => String(p.id)}
      rowHref={(p) => paths.owner.purchase(p.id)}
      searchable
      searchPlaceholder="Ingredient, supplier or lot"
      toolbar={toolbar}
      paginate
      emptyMessage="No purchases match. Record one, or import a CSV from a supplier’s invoices."
    />
  )
}
