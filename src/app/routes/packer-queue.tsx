import { useCallback, useMemo, useState } from 'react'
import { buttonClasses } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { EmptyState } from '@/components/ui/empty-state'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { Stat } from '@/components/ui/stat'
import { paths } from '@/config/paths'
import { useMe } from '@/features/auth/api/me'
import { pickListPdfHref, usePackingQueue, usePickList } from '@/features/packing/api/packing'
import { PickListView } from '@/features/packing/components/pick-list-view'
import { QueueTable } from '@/features/packing/components/queue-table'
import { cn } from '@/lib/cn'

/** The packer's home (and the owner's packing page): the queue, the pick list, what waits for the carrier. */
export function Component() {
  const me = useMe()
  const queue = usePackingQueue()
  const [picked, setPicked] = useState<Set<number>>(new Set())
  const role = me.data?.role === 'owner' ? 'owner' : 'packer'
  const orderHref = role === 'owner' ? paths.owner.packingOrder : paths.packer.order

  const items = useMemo(() => queue.data?.items ?? [], [queue.data])
  const waiting = useMemo(() => queue.data?.awaitingShipment ?? [], [queue.data])
  // Only orders still on the queue stay picked (one shipped meanwhile drops out).
  const selected = useMemo(
    () => new Set([...picked].filter((id) => items.some((i) => i.orderId === id))),
    [picked, items],
  )
  const ids = useMemo(() => [...selected].sort((a, b) => a - b), [selected])
  const pickList = usePickList(ids)
  const toggle = useCallback((id: number, on: boolean) => {
    setPicked((prev) => {
      const next = new Set(prev)
      if (on) next.add(id)
      else next.delete(id)
      return next
    })
  }, [])

  const selection = useMemo(() => ({ selected, onToggle: toggle }), [selected, toggle])

  const toPack = items.filter((i) => i.status === 'confirmed').length
  const packing = items.filter((i) => i.status === 'packing')
  const mine = packing.filter((i) => i.packer?.id === me.data?.id).length

  // Links rather than buttons: the PDF opens in a tab of its own to print, or downloads.
  const none = ids.length === 0
  const pdfLink = (label: string, variant: 'primary' | 'secondary', download: boolean) => (
    <a
      href={none ? undefined : pickListPdfHref(ids)}
      {...(download ? { download: true } : { target: '_blank', rel: 'noopener' })}
      aria-disabled={none || undefined}
      onClick={(e) => none && e.preventDefault()}
      className={cn(buttonClasses(variant, 'md'), none && 'pointer-events-none')}
    >
      {label}
    </a>
  )
  const printButton = (
    <>
      {pdfLink(`Print pick list${ids.length ? ` (${ids.length})` : ''}`, 'primary', false)}
      {pdfLink('Download pick list (PDF)', 'secondary', true)}
    </>
  )

  return (
    <>
      <PageHeader
        title="Packing"
        description="Confirmed orders, oldest first. Claim one to pack it, or tick several and print one pick list for the walk along the racks."
      />
      {queue.isPending || !me.data ? (
        <LoadingBlock label="Loading the packing queue…" />
      ) : (
        <div className="flex flex-col gap-6">
          <div className="grid gap-4 sm:grid-cols-3">
            <Stat
              label="To pack"
              value={toPack}
              hint="Confirmed, not yet claimed"
              tone={toPack ? 'honey' : 'default'}
            />
            <Stat
              label="Being packed"
              value={packing.length}
              hint={mine ? `${mine} by you` : 'None by you'}
            />
            <Stat label="Waiting for the carrier" value={waiting.length} hint="Packed, not yet shipped" />
          </div>

          {items.length === 0 ? (
            <EmptyState
              title="Nothing to pack"
              message="Every confirmed order is packed. New ones appear here as the studio confirms them."
            />
          ) : (
            <QueueTable
              items={items}
              me={{ id: me.data.id, role }}
              orderHref={orderHref}
              label="Orders to pack"
              selection={selection}
              toolbar={
                <div className="flex flex-wrap items-center gap-3">
                  {printButton}
                  <span className="text-sm text-ink-700">
                    {ids.length === 0
                      ? 'Tick orders in the Pick column to make a pick list.'
                      : `${ids.length} ${ids.length === 1 ? 'order' : 'orders'} picked.`}
                  </span>
                </div>
              }
            />
          )}

          {ids.length > 0 ? (
            <Card>
              <CardHeader
                title="Pick list"
                description="Walk the shelves in this order and pull each lot named, so the lot codes on the slips match the bars."
              />
              <CardBody>
                {pickList.data ? (
                  <PickListView list={pickList.data} />
                ) : (
                  <LoadingBlock label="Making the pick list…" />
                )}
              </CardBody>
            </Card>
          ) : null}

          <section aria-labelledby="waiting-heading" className="flex flex-col gap-3">
            <h2 id="waiting-heading" className="text-lg font-medium text-ink-900">
              Packed, waiting for the carrier <span className="text-ink-600">({waiting.length})</span>
            </h2>
            {waiting.length === 0 ? (
              <p className="text-sm text-ink-700">Nothing waits to ship.</p>
            ) : (
              <QueueTable
                items={waiting}
                me={{ id: me.data.id, role }}
                orderHref={orderHref}
                label="Packed orders waiting for the carrier"
              />
            )}
          </section>
        </div>
      )}
    </>
  )
}
