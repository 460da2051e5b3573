import { useMemo } from 'react'
import type { ReactNode } from 'react'
import type { OrderDto } from '@shared/schemas/orders'
import { Badge } from '@/components/ui/badge'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { Money } from '@/components/ui/money'
import { casesText, formatDay } from '@/features/orders/components/format'
import { OrderStatusBadge } from '@/features/orders/components/order-status-badge'

const col = dataTableColumnHelper<OrderDto>()

type Props = {
  orders: OrderDto[]
  /** Where a row leads (the buyer's or the owner's order page). */
  hrefFor: (order: OrderDto) => string
  /** The owner sees every shop: a column says whose order it is. */
  showShop?: boolean
  toolbar?: ReactNode
  emptyMessage?: ReactNode
}

/** A page of orders as the server sent it (the server filters, sorts newest first and pages). */
export function OrdersTable({ orders, hrefFor, showShop = false, toolbar, emptyMessage }: Props) {
  const columns = useMemo(
    () =>
      col.columns([
        col.accessor('number', { header: 'Order', enableSorting: false }),
        col.accessor((o) => o.placedAt, {
          id: 'placed',
          header: 'Placed',
          enableSorting: false,
          cell: (c) => formatDay(c.getValue()),
        }),
        ...(showShop ? [col.accessor('shopName', { header: 'Shop', enableSorting: false })] : []),
        col.accessor((o) => o.poNumber ?? '—', { id: 'po', header: 'PO number', enableSorting: false }),
        col.accessor('status', {
          header: 'Status',
          enableSorting: false,
          cell: (c) => (
            <span className="inline-flex flex-wrap gap-1">
              <OrderStatusBadge status={c.getValue()} />
              {c.row.original.waitingForStock && c.row.original.status !== 'cancelled' ? (
                <Badge tone="honey">Pre-order waiting</Badge>
              ) : null}
            </span>
          ),
        }),
        col.accessor((o) => o.lines.reduce((n, l) => n + l.cases, 0), {
          id: 'cases',
          header: 'Cases',
          enableSorting: false,
          meta: { align: 'end' },
          cell: (c) => casesText(c.getValue()),
        }),
        col.accessor((o) => o.totalCents ?? 0, {
          id: 'total',
          header: 'Total',
          enableSorting: false,
          meta: { align: 'end' },
          cell: (c) => <Money cents={c.getValue()} currency={c.row.original.currency} />,
        }),
      ]),
    [showShop],
  )
  return (
    <DataTable
      label="Orders"
      columns={columns}
      data={orders}
      getRowId={(o) => String(o.id)}
      rowHref={hrefFor}
      toolbar={toolbar}
      emptyMessage={emptyMessage ?? 'No orders yet.'}
    />
  )
}
