import { useId } from 'react'
import type { KeyboardEvent, MouseEvent, ReactNode } from 'react'
import { Link, useNavigate } from 'react-router-dom'
import {
  FlexRender,
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createPaginatedRowModel,
  createSortedRowModel,
  filterFn_includesString,
  globalFilteringFeature,
  metaHelper,
  rowPaginationFeature,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  sortFn_datetime,
  sortFn_text,
  tableFeatures,
  useTable,
} from '@tanstack/react-table'
import type { Cell, ColumnDef, ColumnHelper, Header, Row, RowData, SortingState } from '@tanstack/react-table'
import { cn } from '@/lib/cn'
import { Button } from '@/components/ui/button'
import { Input } from '@/components/ui/field'

/** Per-column presentation, set in a column's `meta`. */
export type DataTableColumnMeta = {
  /** 'end' for numbers and money, so digits line up; 'start' otherwise. */
  align?: 'start' | 'end'
  /** With `rowHref`, the column whose cell carries the row's link (the first column by default). */
  rowLink?: boolean
  /** Lets long text (a note, an address) wrap; cells stay on one line otherwise and the table scrolls. */
  wrap?: boolean
  /** Extra classes for this column's header and cells, such as a minimum width. */
  className?: string
}

/** Everything a `DataTable` can do: client-side sorting, a text search over all columns, pages. */
export const dataTableFeatures = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  globalFilteringFeature,
  rowPaginationFeature,
  filteredRowModel: createFilteredRowModel(),
  sortedRowModel: createSortedRowModel(),
  paginatedRowModel: createPaginatedRowModel(),
  filterFns: { includesString: filterFn_includesString },
  sortFns: {
    alphanumeric: sortFn_alphanumeric,
    text: sortFn_text,
    datetime: sortFn_datetime,
    basic: sortFn_basic,
  },
  columnMeta: metaHelper<DataTableColumnMeta>(),
})

export type DataTableFeatures = typeof dataTableFeatures
// The value type varies per column; `any` here is what the column helper's `columns()` returns.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type DataTableColumn<T extends RowData> = ColumnDef<DataTableFeatures, T, any>

/**
 * A column helper typed for `DataTable`. Build columns once, at module scope or in a `useMemo`:
 *
 *   const col = dataTableColumnHelper<OrderRow>()
 *   const columns = col.columns([
 *     col.accessor('number', { header: 'Order' }),
 *     col.accessor('totalCents', { header: 'Total', meta: { align: 'end' }, cell: (c) => <Money cents={c.getValue()} currency={currency} /> }),
 *   ])
 */
export function dataTableColumnHelper<T extends RowData>(): ColumnHelper<DataTableFeatures, T> {
  return createColumnHelper<DataTableFeatures, T>()
}

export const DATA_TABLE_PAGE_SIZE = 25

type DataTableProps<T extends RowData> = {
  /** Names the table for assistive technology (a visually hidden caption). */
  label: string
  columns: ReadonlyArray<DataTableColumn<T>>
  /** Keep this array stable between renders (query data is; a fresh `?? []` each render is not). */
  data: ReadonlyArray<T>
  getRowId?: (row: T, index: number) => string
  /** Shows a "Search" box that filters rows on the text of every column. */
  searchable?: boolean
  searchPlaceholder?: string
  /** More filters of the caller's own, shown beside the search box. */
  toolbar?: ReactNode
  /** Shown in the body when there are no rows at all. */
  emptyMessage?: ReactNode
  /** Where a row leads; its link sits in the first column (or the one with `meta.rowLink`). */
  rowHref?: (row: T) => string
  /** Runs when a row is clicked or, when focused, Enter is pressed. Prefer `rowHref` for navigation. */
  onRowClick?: (row: T) => void
  /** Splits the rows into pages of 25. */
  paginate?: boolean
  initialSorting?: SortingState
  className?: string
}

/** A sortable, searchable table of records, scrolling sideways on narrow screens. */
export function DataTable<T extends RowData>({
  label,
  columns,
  data,
  getRowId,
  searchable = false,
  searchPlaceholder,
  toolbar,
  emptyMessage = 'Nothing here yet.',
  rowHref,
  onRowClick,
  paginate = false,
  initialSorting,
  className,
}: DataTableProps<T>) {
  const searchId = useId()
  const captionId = useId()

  const table = useTable({
    features: dataTableFeatures,
    columns,
    data,
    getRowId,
    globalFilterFn: 'includesString',
    initialState: {
      sorting: initialSorting ?? [],
      pagination: { pageIndex: 0, pageSize: DATA_TABLE_PAGE_SIZE },
    },
  })

  const search = typeof table.state.globalFilter === 'string' ? table.state.globalFilter : ''
  const rows = paginate ? table.getRowModel().rows : table.getPrePaginatedRowModel().rows
  const matching = table.getFilteredRowModel().rows.length
  const columnCount = Math.max(1, table.getAllLeafColumns().length)
  const linkColumnId = rowHref
    ? (table.getAllLeafColumns().find((c) => c.columnDef.meta?.rowLink)?.id ??
      table.getAllLeafColumns()[0]?.id)
    : undefined

  const { pageIndex, pageSize } = table.state.pagination
  const pageCount = table.getPageCount()
  const firstShown = matching === 0 ? 0 : pageIndex * pageSize + 1
  const lastShown = Math.min(matching, (pageIndex + 1) * pageSize)

  return (
    <div
      className={cn(
        'min-w-0 rounded-card bg-white shadow-card ring-1 ring-cream-300/60 print:shadow-none',
        className,
      )}
    >
      {searchable || toolbar ? (
        <div className="flex flex-col gap-3 border-b border-cream-200 px-4 py-3 sm:flex-row sm:items-end sm:px-5 no-print">
          {searchable ? (
            <div className="flex w-full flex-col gap-1 sm:max-w-xs">
              <label htmlFor={searchId} className="text-sm font-medium text-ink-800">
                Search
              </label>
              <Input
                id={searchId}
                type="search"
                value={search}
                placeholder={searchPlaceholder}
                autoComplete="off"
                onChange={(event) => table.setGlobalFilter(event.target.value)}
              />
            </div>
          ) : null}
          {toolbar ? <div className="flex flex-wrap items-end gap-3">{toolbar}</div> : null}
        </div>
      ) : null}

      <p role="status" className="sr-only">
        {search ? `${matching} matching ${matching === 1 ? 'row' : 'rows'}` : ''}
      </p>

      {/* Focusable, so a keyboard can scroll a table wider than the screen. */}
      <div
        role="region"
        aria-labelledby={captionId}
        tabIndex={0}
        className="relative overflow-x-auto focus-visible:outline-offset-[-2px] print:overflow-visible"
      >
        <table className="w-full border-collapse text-sm">
          <caption id={captionId} className="sr-only">
            {label}
          </caption>
          <thead className="border-b border-cream-300 bg-cream-50">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => (
                  <HeaderCell key={header.id} header={header} />
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.length === 0 ? (
              <tr>
                <td colSpan={columnCount} className="px-4 py-10 text-center text-ink-700">
                  {search ? `No rows match “${search}”.` : emptyMessage}
                </td>
              </tr>
            ) : (
              rows.map((row) =>
                rowHref ? (
                  <LinkedRow
                    key={row.id}
                    row={row}
                    href={rowHref(row.original)}
                    linkColumnId={linkColumnId}
                  />
                ) : (
                  <PlainRow key={row.id} row={row} onRowClick={onRowClick} />
                ),
              )
            )}
          </tbody>
        </table>
      </div>

      {paginate && pageCount > 1 ? (
        <div className="flex flex-col gap-2 border-t border-cream-200 px-4 py-3 sm:flex-row sm:items-center sm:justify-between sm:px-5 no-print">
          <p className="text-sm text-ink-700 tabular-nums">
            {firstShown}–{lastShown} of {matching}
          </p>
          <div className="flex items-center gap-2">
            <Button
              size="sm"
              variant="secondary"
              onClick={() => table.previousPage()}
              disabled={!table.getCanPreviousPage()}
            >
              Previous page
            </Button>
            <span className="px-1 text-sm whitespace-nowrap text-ink-700 tabular-nums">
              Page {pageIndex + 1} of {pageCount}
            </span>
            <Button
              size="sm"
              variant="secondary"
              onClick={() => table.nextPage()}
              disabled={!table.getCanNextPage()}
            >
              Next page
            </Button>
          </div>
        </div>
      ) : null}
    </div>
  )
}

// The outer columns line up with the toolbar and footer text above and below the table.
const edgePadding = 'first:pl-4 last:pr-4 sm:first:pl-5 sm:last:pr-5'

function alignClass(meta: DataTableColumnMeta | undefined) {
  return meta?.align === 'end' ? 'text-right tabular-nums' : 'text-left'
}

function HeaderCell<T extends RowData>({ header }: { header: Header<DataTableFeatures, T, unknown> }) {
  const column = header.column
  const meta = column.columnDef.meta
  const canSort = !header.isPlaceholder && column.getCanSort()
  const sorted = column.getIsSorted()
  const ariaSort = sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined
  const cellClass = cn(
    'px-3 py-2.5 text-xs font-medium tracking-wide whitespace-nowrap text-ink-700 uppercase sm:px-4',
    edgePadding,
    alignClass(meta),
    meta?.className,
  )

  if (header.isPlaceholder) return <th colSpan={header.colSpan} className={cellClass} />
  return (
    <th scope="col" colSpan={header.colSpan} aria-sort={ariaSort} className={cellClass}>
      {canSort ? (
        <button
          type="button"
          onClick={column.getToggleSortingHandler()}
          className={cn(
            '-mx-1.5 inline-flex items-center gap-1 rounded-sm px-1.5 py-0.5 font-medium tracking-wide uppercase',
            'hover:bg-cream-200 hover:text-ink-900',
            meta?.align === 'end' && 'flex-row-reverse',
          )}
        >
          <FlexRender header={header} />
          <SortMark direction={sorted} />
        </button>
      ) : (
        <FlexRender header={header} />
      )}
    </th>
  )
}

function SortMark({ direction }: { direction: false | 'asc' | 'desc' }) {
  return (
    <svg
      aria-hidden="true"
      viewBox="0 0 12 12"
      className={cn('size-3 shrink-0 fill-current', direction ? 'text-olive-700' : 'text-ink-400')}
    >
      {direction !== 'desc' ? (
        <path d="M6 1.5 9.5 5h-7L6 1.5Z" opacity={direction === 'asc' ? 1 : 0.7} />
      ) : null}
      {direction !== 'asc' ? (
        <path d="M6 10.5 2.5 7h7L6 10.5Z" opacity={direction === 'desc' ? 1 : 0.7} />
      ) : null}
    </svg>
  )
}

function BodyCell<T extends RowData>({
  cell,
  children,
}: {
  cell: Cell<DataTableFeatures, T, unknown>
  children?: ReactNode
}) {
  const meta = cell.column.columnDef.meta
  return (
    <td
      className={cn(
        'px-3 py-2.5 align-middle text-ink-800 sm:px-4',
        edgePadding,
        meta?.wrap ? 'min-w-48' : 'whitespace-nowrap',
        alignClass(meta),
        meta?.className,
      )}
    >
      {children ?? <FlexRender cell={cell} />}
    </td>
  )
}

// Clicks on a control inside a row belong to that control, and a drag that selected text
// (a lot code, say) is not a click on the row.
function isRowClick(event: MouseEvent<HTMLElement>) {
  const target = event.target as Element
  if (target.closest('a, button, input, select, textarea, label, summary, [role="button"]')) return false
  const selection = window.getSelection?.()
  return !(selection && !selection.isCollapsed && selection.toString().length > 0)
}

function PlainRow<T extends RowData>({
  row,
  onRowClick,
}: {
  row: Row<DataTableFeatures, T>
  onRowClick?: (row: T) => void
}) {
  const clickable = Boolean(onRowClick)
  function onKeyDown(event: KeyboardEvent<HTMLTableRowElement>) {
    if (event.target !== event.currentTarget) return
    if (event.key === 'Enter' || event.key === ' ') {
      event.preventDefault()
      onRowClick?.(row.original)
    }
  }
  return (
    <tr
      tabIndex={clickable ? 0 : undefined}
      onClick={clickable ? (event) => isRowClick(event) && onRowClick?.(row.original) : undefined}
      onKeyDown={clickable ? onKeyDown : undefined}
      className={cn(
        'border-b border-cream-200 last:border-b-0',
        clickable && 'cursor-pointer hover:bg-cream-50 focus-visible:outline-offset-[-2px]',
      )}
    >
      {row.getAllCells().map((cell) => (
        <BodyCell key={cell.id} cell={cell} />
      ))}
    </tr>
  )
}

function LinkedRow<T extends RowData>({
  row,
  href,
  linkColumnId,
}: {
  row: Row<DataTableFeatures, T>
  href: string
  linkColumnId: string | undefined
}) {
  const navigate = useNavigate()
  return (
    <tr
      onClick={(event) => {
        if (event.button === 0 && !event.metaKey && !event.ctrlKey && isRowClick(event)) void navigate(href)
      }}
      className="cursor-pointer border-b border-cream-200 last:border-b-0 hover:bg-cream-50"
    >
      {row.getAllCells().map((cell) =>
        cell.column.id === linkColumnId ? (
          <BodyCell key={cell.id} cell={cell}>
            <Link to={href} className="font-medium text-olive-800 underline-offset-2 hover:underline">
              <FlexRender cell={cell} />
            </Link>
          </BodyCell>
        ) : (
          <BodyCell key={cell.id} cell={cell} />
        ),
      )}
    </tr>
  )
}
