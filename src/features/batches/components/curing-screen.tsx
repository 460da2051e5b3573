import { useMemo, useState } from 'react'
import type { ReactNode } from 'react'
import { Link } from 'react-router-dom'
import { BATCH_STATUS_LABELS } from '@shared/schemas/batches'
import type { BatchRow, BatchFilter } from '@shared/schemas/batches'
import { formatDate } from '@shared/domain/dates/dates'
import { Badge } from '@/components/ui/badge'
import { Button } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { EmptyState } from '@/components/ui/empty-state'
import { Field, Input, Select } from '@/components/ui/field'
import { Money } from '@/components/ui/money'
import { ProgressBar } from '@/components/ui/progress'
import { LoadingBlock } from '@/components/ui/spinner'
import { Stat } from '@/components/ui/stat'
import { useBatches, usePourableProducts } from '@/features/batches/api/batches'
import { bars, cureText, daysLeftText, localToday } from '@/features/batches/components/format'
import { ReadyTimeline } from '@/features/batches/components/ready-timeline'
import { StockMoveDialog } from '@/features/batches/components/stock-move-dialog'

type Props = {
  /** Owners see the cost frozen on each batch; packers never do (nor does the API send it). */
  showCosts: boolean
  /** The studio's currency (settings) for the costs shown. */
  currency?: string
  batchHref: (id: number) => string
  /** What to offer when nothing has been poured yet (the owner's "Record a batch"). */
  emptyAction?: ReactNode
}

const col = dataTableColumnHelper<BatchRow>()

/** Every batch by where it stands: curing (with its progress), ready to sell, used up. */
export function CuringScreen({ showCosts, currency = 'USD', batchHref, emptyAction }: Props) {
  const [filter, setFilter] = useState<BatchFilter>({})
  const products = usePourableProducts()
  const batches = useBatches(filter)
  const [moving, setMoving] = useState<BatchRow | null>(null)
  const today = localToday()

  const groups = useMemo(() => {
    const items = batches.data ?? []
    return {
      curing: items.filter((b) => b.status === 'curing'),
      ready: items.filter((b) => b.status === 'ready'),
      usedUp: items.filter((b) => b.status === 'used_up').reverse(),
    }
  }, [batches.data])

  const readyBars = groups.ready.reduce((s, b) => s + b.free, 0)
  const reservedBars = groups.ready.reduce((s, b) => s + b.reserved, 0)
  const curingBars = groups.curing.reduce((s, b) => s + b.free, 0)
  const next = groups.curing[0]

  const columns = useMemo(
    () =>
      col.columns([
        col.accessor('lotCode', {
          header: 'Lot code',
          cell: (c) => <span className="font-mono text-sm font-medium">{c.getValue()}</span>,
        }),
        col.accessor('productName', { header: 'Product', meta: { wrap: true } }),
        col.accessor('readyDate', { header: 'Ready since', cell: (c) => formatDate(c.getValue()) }),
        col.accessor('free', { header: 'Free', meta: { align: 'end' } }),
        col.accessor('reserved', { header: 'Reserved', meta: { align: 'end' } }),
        col.accessor((b) => b.location ?? '—', { id: 'location', header: 'Location', meta: { wrap: true } }),
        ...(showCosts
          ? [
              col.accessor((b) => b.costPerBarCents ?? 0, {
                id: 'cost',
                header: 'Cost per bar',
                meta: { align: 'end' as const },
                cell: (c) =>
                  c.row.original.costPerBarCents == null ? (
                    '—'
                  ) : (
                    <Money cents={c.getValue()} currency={currency} />
                  ),
              }),
            ]
          : []),
        col.display({
          id: 'actions',
          // A visible header: a visually hidden one sits outside the table's scroll box and widens phone pages.
          header: 'Actions',
          cell: (c) => (
            <Button
              size="sm"
              variant="ghost"
              onClick={() => setMoving(c.row.original)}
              aria-label={`Write off or correct ${c.row.original.lotCode}`}
            >
              Write off…
            </Button>
          ),
        }),
      ]),
    [showCosts, currency],
  )

  const usedColumns = useMemo(
    () =>
      col.columns([
        col.accessor('lotCode', {
          header: 'Lot code',
          cell: (c) => <span className="font-mono text-sm">{c.getValue()}</span>,
        }),
        col.accessor('productName', { header: 'Product', meta: { wrap: true } }),
        col.accessor('pourDate', { header: 'Poured', cell: (c) => formatDate(c.getValue()) }),
        col.accessor('sellableBars', { header: 'Bars made', meta: { align: 'end' } }),
      ]),
    [],
  )

  const filtered = filter.productId || filter.pouredFrom || filter.pouredTo
  const productOptions = products.data ?? []

  return (
    <div className="flex flex-col gap-6">
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <Stat
          label="Ready to sell"
          value={bars(readyBars)}
          hint={`${groups.ready.length} ready ${groups.ready.length === 1 ? 'batch' : 'batches'}`}
        />
        <Stat
          label="Reserved for orders"
          value={bars(reservedBars)}
          hint="Promised, not yet shipped"
          tone={reservedBars ? 'honey' : 'default'}
        />
        <Stat
          label="Curing"
          value={bars(curingBars)}
          hint={`${groups.curing.length} ${groups.curing.length === 1 ? 'batch' : 'batches'} on the racks`}
        />
        <Stat
          label="Next ready"
          value={next ? formatDate(next.readyDate) : '—'}
          hint={next ? `${next.lotCode}, ${bars(next.free)}` : 'Nothing curing'}
        />
      </div>

      <Card>
        <CardHeader
          title="Ready over the next eight weeks"
          description="Free bars of curing batches, by the week their cure ends."
        />
        <CardBody>
          {batches.data ? <ReadyTimeline batches={batches.data} today={today} /> : <LoadingBlock />}
        </CardBody>
      </Card>

      <Card>
        <CardBody>
          <form
            className="grid gap-4 sm:grid-cols-[2fr_1fr_1fr_auto] sm:items-end"
            onSubmit={(e) => e.preventDefault()}
            aria-label="Filter batches"
          >
            <Field label="Product">
              <Select
                value={filter.productId ?? ''}
                onChange={(e) =>
                  setFilter((f) => ({ ...f, productId: e.target.value ? Number(e.target.value) : undefined }))
                }
              >
                <option value="">All products</option>
                {productOptions.map((p) => (
                  <option key={p.id} value={p.id}>
                    {p.name} ({p.sku})
                  </option>
                ))}
              </Select>
            </Field>
            <Field label="Poured from">
              <Input
                type="date"
                value={filter.pouredFrom ?? ''}
                max={filter.pouredTo}
                onChange={(e) => setFilter((f) => ({ ...f, pouredFrom: e.target.value || undefined }))}
              />
            </Field>
            <Field label="Poured until">
              <Input
                type="date"
                value={filter.pouredTo ?? ''}
                min={filter.pouredFrom}
                onChange={(e) => setFilter((f) => ({ ...f, pouredTo: e.target.value || undefined }))}
              />
            </Field>
            <Button variant="secondary" onClick={() => setFilter({})} disabled={!filtered}>
              Clear filters
            </Button>
          </form>
        </CardBody>
      </Card>

      {batches.isPending ? (
        <LoadingBlock label="Loading batches…" />
      ) : (batches.data ?? []).length === 0 ? (
        <EmptyState
          title={filtered ? 'No batches match these filters.' : 'No batches poured yet.'}
          message={
            filtered
              ? 'Try another product or a wider range of pour dates.'
              : 'Batches appear here from the day they are poured.'
          }
          action={filtered ? undefined : emptyAction}
        />
      ) : (
        <>
          <section aria-labelledby="curing-heading" className="flex flex-col gap-3">
            <h2 id="curing-heading" className="text-lg font-medium text-ink-900">
              {BATCH_STATUS_LABELS.curing} <span className="text-ink-600">({groups.curing.length})</span>
            </h2>
            {groups.curing.length === 0 ? (
              <p className="text-sm text-ink-700">Nothing is curing.</p>
            ) : (
              <ul className="grid gap-3 md:grid-cols-2 xl:grid-cols-3">
                {groups.curing.map((b) => (
                  <li key={b.id}>
                    <Card className="flex h-full flex-col gap-3 p-4">
                      <div className="flex items-start justify-between gap-3">
                        <div className="min-w-0">
                          <Link to={batchHref(b.id)} className="font-mono text-sm font-medium text-olive-800">
                            {b.lotCode}
                          </Link>
                          <p className="truncate text-sm text-ink-800">{b.productName}</p>
                        </div>
                        <Badge tone="honey">{daysLeftText(b.daysLeft)}</Badge>
                      </div>
                      <ProgressBar value={b.progress} label="Cure" valueText={cureText(b)} tone="honey" />
                      <p className="text-sm text-ink-800">Ready {formatDate(b.readyDate)}</p>
                      <div className="flex items-center justify-between gap-2 text-sm text-ink-700">
                        <span>
                          {bars(b.free)} free
                          {b.reserved ? `, ${b.reserved} reserved` : ''}
                          {b.location ? ` · ${b.location}` : ''}
                        </span>
                        <Button
                          size="sm"
                          variant="ghost"
                          onClick={() => setMoving(b)}
                          aria-label={`Write off or correct ${b.lotCode}`}
                        >
                          Write off…
                        </Button>
                      </div>
                    </Card>
                  </li>
                ))}
              </ul>
            )}
          </section>

          <section aria-labelledby="ready-heading" className="flex flex-col gap-3">
            <h2 id="ready-heading" className="text-lg font-medium text-ink-900">
              {BATCH_STATUS_LABELS.ready} <span className="text-ink-600">({groups.ready.length})</span>
            </h2>
            <DataTable
              label="Ready batches"
              columns={columns}
              data={groups.ready}
              getRowId={(b) => String(b.id)}
              rowHref={(b) => batchHref(b.id)}
              emptyMessage="No batch is ready yet."
            />
          </section>

          <section aria-labelledby="used-heading" className="flex flex-col gap-3">
            <h2 id="used-heading" className="text-lg font-medium text-ink-900">
              {BATCH_STATUS_LABELS.used_up} <span className="text-ink-600">({groups.usedUp.length})</span>
            </h2>
            <DataTable
              label="Used-up batches"
              columns={usedColumns}
              data={groups.usedUp}
              getRowId={(b) => String(b.id)}
              rowHref={(b) => batchHref(b.id)}
              emptyMessage="No batch has run out yet."
              paginate
            />
          </section>
        </>
      )}
      <StockMoveDialog batch={moving} open={moving !== null} onClose={() => setMoving(null)} />
    </div>
  )
}
