import { useMemo } from 'react'
import type { ReactNode } from 'react'
import { formatDate } from '@shared/domain/dates/dates'
import type { InvoiceListItem } from '@shared/schemas/invoices'
import { buttonClasses } from '@/components/ui/button'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { Money } from '@/components/ui/money'
import { invoicePdfHref } from '@/features/invoices/api/invoices'
import { InvoiceStatusBadge } from '@/features/invoices/components/invoice-status-badge'

const col = dataTableColumnHelper<InvoiceListItem>()

type Props = {
  items: InvoiceListItem[]
  /** The studio's currency (settings), in which every amount is given. */
  currency: string
  /** The owner's list names the shop; a buyer's does not need to. */
  showShop?: boolean
  /** Each row's PDF as a download (the buyer's list). */
  withPdf?: boolean
  rowHref?: (invoice: InvoiceListItem) => string
  toolbar?: ReactNode
  emptyMessage?: ReactNode
  /** A command per row in a column of its own (the buyer's pay-by-card button), composed by the page. */
  rowAction?: { header: string; cell: (invoice: InvoiceListItem) => ReactNode }
}

/** Invoices and credit notes: number, dates, status, and what was billed, paid and is still due. */
export function InvoicesTable({
  items,
  currency,
  showShop = false,
  withPdf = false,
  rowHref,
  toolbar,
  emptyMessage,
  rowAction,
}: Props) {
  const columns = useMemo(
    () =>
      col.columns([
        col.accessor('number', {
          header: 'Number',
          cell: (c) => (
            <span className="tabular-nums">
              {c.getValue()}
              {c.row.original.kind === 'credit_note' ? <span className="sr-only"> (credit note)</span> : null}
            </span>
          ),
        }),
        ...(showShop ? [col.accessor('shopName', { header: 'Shop', meta: { wrap: true } })] : []),
        col.accessor('orderNumber', { header: 'Order' }),
        col.accessor('issueDate', {
          header: 'Issued · due',
          cell: (c) => (
            <span>
              <span className="block">{formatDate(c.getValue())}</span>
              <span className="block text-xs text-ink-600">
                {c.row.original.kind === 'credit_note'
                  ? 'credit note'
                  : `due ${formatDate(c.row.original.dueDate)}`}
              </span>
            </span>
          ),
        }),
        col.accessor('status', {
          header: 'Status',
          cell: (c) => <InvoiceStatusBadge status={c.getValue()} />,
        }),
        col.accessor('totalCents', {
          header: 'Total',
          meta: { align: 'end' },
          cell: (c) => <Money cents={c.getValue()} currency={currency} />,
        }),
        col.accessor('paidCents', {
          header: 'Paid',
          meta: { align: 'end' },
          cell: (c) => <Money cents={c.getValue()} currency={currency} />,
        }),
        col.accessor('outstandingCents', {
          header: 'Due now',
          meta: { align: 'end' },
          cell: (c) => (
            <Money
              cents={c.getValue()}
              currency={currency}
              className={c.getValue() > 0 ? 'font-medium text-ink-900' : 'text-ink-600'}
            />
          ),
        }),
        ...(withPdf
          ? [
              col.display({
                id: 'pdf',
                header: 'PDF',
                cell: (c) => (
                  <a
                    href={invoicePdfHref(c.row.original.id)}
                    download
                    className={buttonClasses('secondary', 'sm')}
                    aria-label={`Download ${c.row.original.kind === 'credit_note' ? 'credit note' : 'invoice'} ${c.row.original.number} (PDF)`}
                  >
                    Download
                  </a>
                ),
              }),
            ]
          : []),
        ...(rowAction
          ? [
              col.display({
                id: 'action',
                header: rowAction.header,
                cell: (c) => rowAction.cell(c.row.original),
              }),
            ]
          : []),
      ]),
    [showShop, withPdf, rowAction, currency],
  )
  return (
    <DataTable
      label="Invoices"
      columns={columns}
      data={items}
      getRowId={(i) => String(i.id)}
      rowHref={rowHref}
      searchable
      searchPlaceholder="Number, shop, order…"
      toolbar={toolbar}
      emptyMessage={emptyMessage}
      paginate
    />
  )
}
