import { useMemo } from 'react'
import { formatDate } from '@shared/domain/dates/dates'
import { formatBaseQuantity, formatEnteredQuantity, formatUnitCost } from '@shared/schemas/ingredients'
import type { PurchaseRow } from '@shared/schemas/ingredients'
import { Badge } from '@/components/ui/badge'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { Money } from '@/components/ui/money'
import { paths } from '@/config/paths'

const col = dataTableColumnHelper<PurchaseRow>()

/** One ingredient's purchases, newest first, each linking to its own page. */
export function IngredientLotsTable({ lots, currency }: { lots: PurchaseRow[]; currency: string }) {
  const columns = useMemo(
    () =>
      col.columns([
        col.accessor('receivedOn', { header: 'Received', cell: (c) => formatDate(c.getValue()) }),
        col.accessor((l) => l.supplierLotCode ?? '—', { id: 'lot', header: 'Supplier lot' }),
        col.accessor('supplier', { header: 'Supplier' }),
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
          header: 'Cost with freight',
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
      label="Purchases of this ingredient"
      columns={columns}
      data={lots}
      getRowId={(l) => String(l.id)}
      rowHref={(l) => paths.owner.purchase(l.id)}
      emptyMessage="No purchases recorded yet."
    />
  )
}
