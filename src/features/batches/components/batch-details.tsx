import { useMemo, useState } from 'react'
import type { ReactNode } from 'react'
import { Link } from 'react-router-dom'
import { BATCH_STATUS_LABELS, MOVE_KIND_LABELS, WRITE_OFF_REASON_LABELS } from '@shared/schemas/batches'
import type { BatchDetail, BatchLotRow, BatchShipment, StockMoveRow } from '@shared/schemas/batches'
import { isWriteOffReason } from '@shared/domain/stock/ledger'
import { formatDate } from '@shared/domain/dates/dates'
import { formatGrams } from '@shared/domain/units/units'
import { Badge } from '@/components/ui/badge'
import { Button } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { EmptyState } from '@/components/ui/empty-state'
import { Money } from '@/components/ui/money'
import { PageHeader } from '@/components/ui/page-header'
import { ProgressBar } from '@/components/ui/progress'
import { Stat } from '@/components/ui/stat'
import { BatchNotesDialog } from '@/features/batches/components/batch-notes-dialog'
import { bars, cureText, daysLeftText, formatQuantity } from '@/features/batches/components/format'
import { StockMoveDialog } from '@/features/batches/components/stock-move-dialog'

type Props = {
  batch: BatchDetail
  back: { to: string; label: string }
  /** Owners: costs, links to purchases, editing location and notes. */
  owner: boolean
  purchaseHref?: (lotId: number) => string
  /** The studio's currency (settings) for the costs an owner sees. */
  currency?: string
}

const lotCol = dataTableColumnHelper<BatchLotRow>()
const moveCol = dataTableColumnHelper<StockMoveRow>()
const shipCol = dataTableColumnHelper<BatchShipment>()

const statusTone = { curing: 'honey', ready: 'green', used_up: 'neutral' } as const

function signed(n: number) {
  return n > 0 ? `+${n}` : n < 0 ? `−${Math.abs(n)}` : '0'
}

/** One batch: what it is, what went into it, every move of its bars, and where they went. */
export function BatchDetails({ batch, back, owner, purchaseHref, currency = 'USD' }: Props) {
  const [moving, setMoving] = useState(false)
  const [editing, setEditing] = useState(false)

  const lotColumns = useMemo(
    () =>
      lotCol.columns([
        lotCol.accessor('ingredientName', { header: 'Ingredient' }),
        lotCol.accessor('supplier', { header: 'Supplier' }),
        lotCol.accessor((l) => l.supplierLotCode ?? '—', {
          id: 'code',
          header: 'Supplier lot code',
          cell: (c) =>
            purchaseHref ? (
              <Link
                to={purchaseHref(c.row.original.ingredientLotId)}
                aria-label={`Purchase ${c.getValue()} of ${c.row.original.ingredientName}`}
              >
                {c.getValue()}
              </Link>
            ) : (
              c.getValue()
            ),
        }),
        lotCol.accessor('receivedOn', { header: 'Received', cell: (c) => formatDate(c.getValue()) }),
        lotCol.accessor('quantity', {
          header: 'Used',
          meta: { align: 'end' },
          cell: (c) => formatQuantity(c.getValue(), c.row.original.unit),
        }),
        ...(owner
          ? [
              lotCol.accessor((l) => l.costCents ?? 0, {
                id: 'cost',
                header: 'Cost',
                meta: { align: 'end' as const },
                cell: (c) => <Money cents={Math.round(c.getValue())} currency={currency} />,
              }),
            ]
          : []),
      ]),
    [owner, purchaseHref, currency],
  )

  const moveColumns = useMemo(
    () =>
      moveCol.columns([
        moveCol.accessor('createdAt', {
          header: 'When',
          cell: (c) =>
            new Date(c.getValue()).toLocaleString('en-US', { dateStyle: 'medium', timeStyle: 'short' }),
        }),
        moveCol.accessor((m) => MOVE_KIND_LABELS[m.kind], { id: 'kind', header: 'Move' }),
        moveCol.accessor('freeDelta', {
          header: 'Free',
          meta: { align: 'end' },
          cell: (c) => signed(c.getValue()),
        }),
        moveCol.accessor('reservedDelta', {
          header: 'Reserved',
          meta: { align: 'end' },
          cell: (c) => signed(c.getValue()),
        }),
        moveCol.accessor(
          (m) =>
            m.reason && isWriteOffReason(m.reason) ? WRITE_OFF_REASON_LABELS[m.reason] : (m.reason ?? ''),
          {
            id: 'reason',
            header: 'Reason',
          },
        ),
        moveCol.accessor((m) => m.note ?? '', { id: 'note', header: 'Note', meta: { wrap: true } }),
        moveCol.accessor((m) => m.userName ?? '—', { id: 'user', header: 'By' }),
      ]),
    [],
  )

  const shipColumns = useMemo(
    () =>
      shipCol.columns([
        shipCol.accessor('shopName', { header: 'Shop' }),
        shipCol.accessor('orderNumber', { header: 'Order' }),
        shipCol.accessor('bars', { header: 'Bars', meta: { align: 'end' } }),
        shipCol.accessor('shippedOn', { header: 'Shipped', cell: (c) => formatDate(c.getValue()) }),
      ]),
    [],
  )

  const facts: [string, ReactNode][] = [
    ['Product', `${batch.productName} (${batch.sku})`],
    ['Poured', formatDate(batch.pourDate)],
    ['Cure', `${batch.cureDays} days`],
    ['Ready', formatDate(batch.readyDate)],
    ['Oils', formatGrams(batch.oilWeightG)],
    ['Bars cut', String(batch.barsCut)],
    [
      'Kept back',
      batch.barsKeptBack
        ? `${batch.barsKeptBack}${batch.keptBackReason ? ` (${batch.keptBackReason})` : ''}`
        : 'None',
    ],
    ['Sellable bars', String(batch.sellableBars)],
    ['Location', batch.location ?? '—'],
    ['Recorded by', batch.createdByName ?? '—'],
  ]
  if (owner && batch.costPerBarCents != null)
    facts.push([
      'Cost per bar (frozen at pouring)',
      <Money key="c" cents={batch.costPerBarCents} currency={currency} />,
    ])
  if (owner && batch.ingredientCostCents != null)
    facts.push([
      'Ingredients for the batch',
      <Money key="i" cents={batch.ingredientCostCents} currency={currency} />,
    ])

  return (
    <>
      <PageHeader
        back={back}
        title={<span className="font-mono">{batch.lotCode}</span>}
        description={
          <span className="flex flex-wrap items-center gap-2">
            {batch.productName} · poured {formatDate(batch.pourDate)}
            <Badge tone={statusTone[batch.status]}>{BATCH_STATUS_LABELS[batch.status]}</Badge>
          </span>
        }
        actions={
          <>
            {owner ? (
              <Button variant="secondary" onClick={() => setEditing(true)}>
                Edit location and notes
              </Button>
            ) : null}
            <Button onClick={() => setMoving(true)}>Write off or correct</Button>
          </>
        }
      />
      <div className="flex flex-col gap-6">
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <Stat
            label="Free"
            value={bars(batch.free)}
            hint={batch.status === 'curing' ? 'Sellable once cured' : 'Ready to sell'}
          />
          <Stat
            label="Reserved"
            value={bars(batch.reserved)}
            hint="Promised to orders"
            tone={batch.reserved ? 'honey' : 'default'}
          />
          <Stat label="On hand" value={bars(batch.onHand)} hint="On the shelf now" />
          <Stat label="Ready date" value={formatDate(batch.readyDate)} hint={daysLeftText(batch.daysLeft)} />
        </div>
        {batch.status === 'curing' ? (
          <Card>
            <CardBody>
              <ProgressBar value={batch.progress} label="Cure" valueText={cureText(batch)} tone="honey" />
            </CardBody>
          </Card>
        ) : null}
        <Card>
          <CardHeader title="About this batch" />
          <CardBody>
            <dl className="grid gap-x-6 gap-y-3 text-sm sm:grid-cols-2 lg:grid-cols-3">
              {facts.map(([k, v]) => (
                <div key={k}>
                  <dt className="text-ink-700">{k}</dt>
                  <dd className="font-medium text-ink-900">{v}</dd>
                </div>
              ))}
            </dl>
            {batch.notes ? (
              <div className="mt-4 text-sm">
                <p className="text-ink-700">Notes</p>
                <p className="whitespace-pre-line text-ink-900">{batch.notes}</p>
              </div>
            ) : null}
          </CardBody>
        </Card>
        <section aria-labelledby="lots-heading" className="flex flex-col gap-3">
          <h2 id="lots-heading" className="text-lg font-medium text-ink-900">
            Ingredient lots used
          </h2>
          <DataTable
            label="Ingredient lots used"
            columns={lotColumns}
            data={batch.lots}
            getRowId={(l) => String(l.id)}
          />
        </section>
        <section aria-labelledby="moves-heading" className="flex flex-col gap-3">
          <h2 id="moves-heading" className="text-lg font-medium text-ink-900">
            Stock moves
          </h2>
          <DataTable
            label="Stock moves"
            columns={moveColumns}
            data={batch.moves}
            getRowId={(m) => String(m.id)}
          />
        </section>
        <section aria-labelledby="shops-heading" className="flex flex-col gap-3">
          <h2 id="shops-heading" className="text-lg font-medium text-ink-900">
            Shops its bars went to
          </h2>
          {batch.shipments.length ? (
            <DataTable
              label="Shipments from this batch"
              columns={shipColumns}
              data={batch.shipments}
              getRowId={(s) => `${s.orderId}`}
            />
          ) : (
            <EmptyState
              title="No bars of this batch have shipped yet."
              message="Shops appear here as orders with these bars ship."
            />
          )}
        </section>
      </div>
      <StockMoveDialog batch={batch} open={moving} onClose={() => setMoving(false)} />
      {owner ? <BatchNotesDialog batch={batch} open={editing} onClose={() => setEditing(false)} /> : null}
    </>
  )
}
