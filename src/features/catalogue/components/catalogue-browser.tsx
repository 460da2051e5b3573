import { useEffect, useId, useMemo, useState } from 'react'
import type { ReactNode } from 'react'
import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createSortedRowModel,
  filterFn_arrIncludes,
  filterFn_includesString,
  globalFilteringFeature,
  rowSortingFeature,
  sortFn_basic,
  sortFn_text,
  tableFeatures,
  useTable,
} from '@tanstack/react-table'
import { formatOunces } from '@shared/domain/units/units'
import type { CatalogueItem } from '@shared/schemas/catalogue'
import { EmptyState } from '@/components/ui/empty-state'
import { Input, Select } from '@/components/ui/field'
import { Money } from '@/components/ui/money'
import { PriceBreaks } from '@/features/catalogue/components/price-breaks'
import { StockBadges } from '@/features/catalogue/components/stock-badges'
import { cn } from '@/lib/cn'

// The catalogue's filtering and sorting run on TanStack Table's row model; the rows are drawn as
// a table on wide screens and as cards on phones.
const features = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  globalFilteringFeature,
  filteredRowModel: createFilteredRowModel(),
  sortedRowModel: createSortedRowModel(),
  filterFns: { includesString: filterFn_includesString, arrIncludes: filterFn_arrIncludes },
  sortFns: { text: sortFn_text, basic: sortFn_basic },
})

const col = createColumnHelper<typeof features, CatalogueItem>()

/** What a product can ship: 'ready' (whole cases ready now) and/or 'curing' (a batch on its way). */
function availability(item: CatalogueItem): string[] {
  const tags: string[] = []
  if (item.readyCases > 0) tags.push('ready')
  if (item.nextReady) tags.push('curing')
  return tags
}

const columns = col.columns([
  col.accessor((i) => [i.name, i.sku, i.scentNotes ?? '', i.description ?? ''].join(' '), {
    id: 'search',
    filterFn: 'includesString',
    enableGlobalFilter: true,
  }),
  col.accessor('name', { id: 'name', sortFn: 'text', enableGlobalFilter: false }),
  col.accessor((i) => i.priceBreaks[0]?.unitPriceCents ?? 0, {
    id: 'price',
    sortFn: 'basic',
    enableGlobalFilter: false,
  }),
  col.accessor('readyBars', { id: 'ready', sortFn: 'basic', enableGlobalFilter: false }),
  col.accessor(availability, { id: 'availability', filterFn: 'arrIncludes', enableGlobalFilter: false }),
])

const SORTS = {
  'name-asc': { label: 'Name, A to Z', sorting: [{ id: 'name', desc: false }] },
  'name-desc': { label: 'Name, Z to A', sorting: [{ id: 'name', desc: true }] },
  'price-asc': { label: 'Price, lowest first', sorting: [{ id: 'price', desc: false }] },
  'price-desc': { label: 'Price, highest first', sorting: [{ id: 'price', desc: true }] },
  'ready-desc': { label: 'Most ready stock first', sorting: [{ id: 'ready', desc: true }] },
} as const
type SortKey = keyof typeof SORTS

const SHOW = { all: 'All products', ready: 'Ready now', curing: 'Curing (coming soon)' } as const
type ShowKey = keyof typeof SHOW

function useWide(query = '(min-width: 1024px)') {
  const [wide, setWide] = useState(() => typeof window !== 'undefined' && window.matchMedia?.(query).matches)
  useEffect(() => {
    const m = window.matchMedia?.(query)
    if (!m) return
    const on = () => setWide(m.matches)
    m.addEventListener('change', on)
    return () => m.removeEventListener('change', on)
  }, [query])
  return wide
}

type Props = {
  items: CatalogueItem[]
  currency: string
  /** The photo or SKU tile of a product; `size` is 'sm' in table rows and 'lg' on cards. */
  renderTile: (item: CatalogueItem, size: 'sm' | 'lg') => ReactNode
  /** The ordering control of a product ("Add to cart" with its cases stepper). */
  renderAction: (item: CatalogueItem) => ReactNode
}

/** The buyer's catalogue: search, a ready/curing filter and a sort over the shop's priced products. */
export function CatalogueBrowser({ items, currency, renderTile, renderAction }: Props) {
  const searchId = useId()
  const showId = useId()
  const sortId = useId()
  const wide = useWide()
  const [search, setSearch] = useState('')
  const [show, setShow] = useState<ShowKey>('all')
  const [sort, setSort] = useState<SortKey>('name-asc')

  const state = useMemo(
    () => ({
      globalFilter: search,
      columnFilters: show === 'all' ? [] : [{ id: 'availability', value: [show] }],
      sorting: [...SORTS[sort].sorting],
    }),
    [search, show, sort],
  )
  const table = useTable({
    features,
    columns,
    data: items,
    getRowId: (i) => String(i.productId),
    globalFilterFn: 'includesString',
    state,
  })
  const rows = table.getRowModel().rows.map((r) => r.original)

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-col gap-3 rounded-card bg-white px-4 py-3 shadow-card ring-1 ring-cream-300/60 sm:flex-row sm:items-end sm:px-5">
        <div className="flex w-full flex-col gap-1 sm:max-w-xs">
          <label htmlFor={searchId} className="text-sm font-medium text-ink-800">
            Search
          </label>
          <Input
            id={searchId}
            type="search"
            value={search}
            placeholder="Name, SKU or scent"
            autoComplete="off"
            onChange={(e) => setSearch(e.target.value)}
          />
        </div>
        <div className="flex flex-col gap-1 sm:w-52">
          <label htmlFor={showId} className="text-sm font-medium text-ink-800">
            Show
          </label>
          <Select id={showId} value={show} onChange={(e) => setShow(e.target.value as ShowKey)}>
            {Object.entries(SHOW).map(([k, label]) => (
              <option key={k} value={k}>
                {label}
              </option>
            ))}
          </Select>
        </div>
        <div className="flex flex-col gap-1 sm:w-56">
          <label htmlFor={sortId} className="text-sm font-medium text-ink-800">
            Sort by
          </label>
          <Select id={sortId} value={sort} onChange={(e) => setSort(e.target.value as SortKey)}>
            {Object.entries(SORTS).map(([k, s]) => (
              <option key={k} value={k}>
                {s.label}
              </option>
            ))}
          </Select>
        </div>
        <p role="status" className="text-sm text-ink-700 sm:ml-auto sm:pb-2">
          {rows.length === items.length
            ? `${items.length} ${items.length === 1 ? 'product' : 'products'}`
            : `${rows.length} of ${items.length} products`}
        </p>
      </div>

      {rows.length === 0 ? (
        <EmptyState
          title={items.length === 0 ? 'Nothing to order yet' : 'No product matches'}
          message={
            items.length === 0
              ? 'The studio has not priced any products for your account yet.'
              : 'Try another word, or show all products.'
          }
        />
      ) : wide ? (
        <div className="overflow-hidden rounded-card bg-white shadow-card ring-1 ring-cream-300/60">
          <table className="w-full border-collapse text-sm">
            <caption className="sr-only">Products you can order</caption>
            <thead className="border-b border-cream-300 bg-cream-50">
              <tr className="text-left text-xs font-medium tracking-wide text-ink-700 uppercase">
                <th scope="col" className="py-2.5 pr-3 pl-5">
                  Product
                </th>
                <th scope="col" className="px-3 py-2.5">
                  Case
                </th>
                <th scope="col" className="px-3 py-2.5">
                  Your price
                </th>
                <th scope="col" className="px-3 py-2.5">
                  Stock
                </th>
                <th scope="col" className="py-2.5 pr-5 pl-3">
                  Order
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((item) => (
                <tr key={item.productId} className="border-b border-cream-200 align-top last:border-b-0">
                  <td className="py-3 pr-3 pl-5">
                    <div className="flex items-start gap-3">
                      {renderTile(item, 'sm')}
                      <div className="min-w-0">
                        <p className="font-medium text-ink-900">{item.name}</p>
                        <p className="text-xs text-ink-600">
                          {item.sku}
                          {item.scentNotes ? ` · ${item.scentNotes}` : ''}
                        </p>
                        <p className="mt-0.5 text-xs text-ink-600">
                          MSRP <Money cents={item.msrpCents} currency={currency} />
                        </p>
                      </div>
                    </div>
                  </td>
                  <td className="px-3 py-3 whitespace-nowrap text-ink-800">
                    <CaseFacts item={item} />
                  </td>
                  <td className="px-3 py-3">
                    <PriceBreaks breaks={item.priceBreaks} casePack={item.casePack} currency={currency} />
                  </td>
                  <td className="px-3 py-3">
                    <StockBadges item={item} />
                  </td>
                  <td className="py-3 pr-5 pl-3">{renderAction(item)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : (
        <ul className="grid gap-4 sm:grid-cols-2" aria-label="Products you can order">
          {rows.map((item) => (
            <li
              key={item.productId}
              className={cn(
                'flex flex-col gap-3 rounded-card bg-white p-4 shadow-card ring-1 ring-cream-300/60',
              )}
            >
              <div className="flex items-start gap-3">
                <div className="w-20 shrink-0">{renderTile(item, 'lg')}</div>
                <div className="min-w-0">
                  <h2 className="font-medium text-ink-900">{item.name}</h2>
                  <p className="text-xs text-ink-600">{item.sku}</p>
                  {item.scentNotes ? <p className="mt-1 text-sm text-ink-700">{item.scentNotes}</p> : null}
                </div>
              </div>
              {item.description ? <p className="text-sm text-ink-700">{item.description}</p> : null}
              <div className="text-sm text-ink-800">
                <CaseFacts item={item} /> · MSRP <Money cents={item.msrpCents} currency={currency} />
              </div>
              <PriceBreaks breaks={item.priceBreaks} casePack={item.casePack} currency={currency} />
              <StockBadges item={item} />
              <div className="mt-auto border-t border-cream-200 pt-3">{renderAction(item)}</div>
            </li>
          ))}
        </ul>
      )}
    </div>
  )
}

function CaseFacts({ item }: { item: CatalogueItem }) {
  return (
    <span>
      {item.casePack} bars a case, {item.netWeightG} g ({formatOunces(item.netWeightG)}) each
    </span>
  )
}
