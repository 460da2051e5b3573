import { useMemo } from 'react'
import type { ReactNode } from 'react'
import { formatDate } from '@shared/domain/dates/dates'
import type { PackingQueueItem } from '@shared/schemas/packing'
import { Badge } from '@/components/ui/badge'
import { Button, LinkButton } from '@/components/ui/button'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { toast } from '@/components/ui/toast'
import { useClaimOrder } from '@/features/packing/api/packing'

const col = dataTableColumnHelper<PackingQueueItem>()

type Props = {
  items: PackingQueueItem[]
  me: { id: number; role: 'owner' | 'packer' }
  orderHref: (id: number) => string
  /** Names the table for assistive technology. */
  label: string
  /** With a selection, each row gets a tick that adds it to the pick list. */
  selection?: { selected: ReadonlySet<number>; onToggle: (id: number, on: boolean) => void }
  toolbar?: ReactNode
  emptyMessage?: string
}

function cases(item: PackingQueueItem) {
  return `${item.cases} ${item.cases === 1 ? 'case' : 'cases'}`
}

/** The bench's queue: oldest first, who packs what, a claim button, and a tick to add an order to the pick list. */
export function QueueTable({ items, me, orderHref, label, selection, toolbar, emptyMessage }: Props) {
  const claim = useClaimOrder()

  const columns = useMemo(
    () =>
      col.columns([
        ...(selection
          ? [
              col.display({
                id: 'select',
                header: 'Pick',
                cell: (c) => {
                  const o = c.row.original
                  return (
                    <input
                      type="checkbox"
                      className="size-5 cursor-pointer accent-olive-700 sm:size-4"
                      checked={selection.selected.has(o.orderId)}
                      onChange={(e) => selection.onToggle(o.orderId, e.target.checked)}
                      aria-label={`Add ${o.number} to the pick list`}
                    />
                  )
                },
              }),
            ]
          : []),
        col.accessor('number', {
          header: 'Order',
          meta: { rowLink: true },
          cell: (c) => (
            <span>
              <span className="block">{c.getValue()}</span>
              <span className="block text-xs font-normal text-ink-600">
                {c.row.original.poNumber ? `PO ${c.row.original.poNumber}` : 'No PO'}
              </span>
              {c.row.original.awaitingPayment ? (
                <Badge tone="clay" className="mt-1">
                  Payment awaited
                </Badge>
              ) : null}
            </span>
          ),
        }),
        col.accessor('shopName', { header: 'Account', meta: { wrap: true } }),
        col.accessor((o) => o.placedAt.slice(0, 10), {
          id: 'placed',
          header: 'Placed',
          cell: (c) => (
            <span>
              <span className="block">{formatDate(c.getValue())}</span>
              {c.row.original.requestedShipDate ? (
                <span className="block text-xs text-ink-600">
                  ship by {formatDate(c.row.original.requestedShipDate)}
                </span>
              ) : null}
            </span>
          ),
        }),
        col.accessor('bars', {
          header: 'To pull',
          meta: { align: 'end' },
          cell: (c) => (
            <span>
              <span className="block">{cases(c.row.original)}</span>
              <span className="block text-xs text-ink-600">{c.getValue()} bars</span>
            </span>
          ),
        }),
        col.accessor((o) => o.packer?.name ?? '', {
          id: 'packer',
          header: 'Packer',
          cell: (c) => {
            const o = c.row.original
            if (!o.packer)
              return o.readyToPack ? (
                <Badge>Not claimed</Badge>
              ) : (
                <Badge tone="honey">Waiting for stock</Badge>
              )
            return (
              <Badge tone={o.packer.id === me.id ? 'green' : 'sky'}>
                {o.packer.id === me.id ? 'You' : o.packer.name}
              </Badge>
            )
          },
        }),
        col.display({
          id: 'actions',
          header: 'Actions',
          cell: (c) => {
            const o = c.row.original
            if (o.status === 'packed') {
              // A prepay order waiting for its payment cannot ship yet: the link only opens it.
              const verb = o.awaitingPayment ? 'View' : 'Ship'
              return (
                <LinkButton
                  to={orderHref(o.orderId)}
                  size="sm"
                  variant="secondary"
                  aria-label={`${verb} ${o.number}`}
                >
                  {verb}
                </LinkButton>
              )
            }
            const mine = o.packer?.id === me.id
            const busy = claim.isPending && claim.variables?.id === o.orderId
            if (o.status === 'packing' && (mine || me.role !== 'owner')) {
              return (
                <LinkButton
                  to={orderHref(o.orderId)}
                  size="sm"
                  variant="secondary"
                  aria-label={`${mine ? 'Continue' : 'View'} ${o.number}`}
                >
                  {mine ? 'Continue' : 'View'}
                </LinkButton>
              )
            }
            const takeOver = o.status === 'packing'
            return (
              <Button
                size="sm"
                variant={takeOver ? 'ghost' : 'primary'}
                loading={busy}
                disabled={!o.readyToPack}
                aria-label={`${takeOver ? 'Take over' : 'Claim'} ${o.number}`}
                onClick={() =>
                  claim.mutate(
                    { id: o.orderId, takeOver },
                    { onSuccess: () => toast.success(`${o.number} is yours to pack.`) },
                  )
                }
              >
                {takeOver ? 'Take over' : 'Claim'}
              </Button>
            )
          },
        }),
      ]),
    [selection, me, orderHref, claim],
  )

  return (
    <DataTable
      label={label}
      columns={columns}
      data={items}
      getRowId={(o) => String(o.orderId)}
      rowHref={(o) => orderHref(o.orderId)}
      toolbar={toolbar}
      emptyMessage={emptyMessage}
    />
  )
}
