import { useState } from 'react'
import { useParams } from 'react-router-dom'
import { canTransition, isCancellableBy } from '@shared/domain/orders/order-status'
import { Button, LinkButton, buttonClasses } from '@/components/ui/button'
import { EmptyState } from '@/components/ui/empty-state'
import { Notice } from '@/components/ui/notice'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { toast } from '@/components/ui/toast'
import { paths } from '@/config/paths'
import { useConfirmOrder, useOrder } from '@/features/orders/api/orders'
import { packingSlipHref } from '@/features/packing/api/packing'
import { CancelOrderDialog } from '@/features/orders/components/cancel-order-dialog'
import { EditLinesDialog } from '@/features/orders/components/edit-lines-dialog'
import { OrderDetail } from '@/features/orders/components/order-detail'
import { OrderStatusBadge } from '@/features/orders/components/order-status-badge'
import { ApiError } from '@/lib/api-client'

/** Lines may change while nobody has started packing. */
const EDITABLE = ['placed', 'confirmed']
/** From confirmation on, the order is on the packing bench (and has a packing slip). */
const ON_BENCH = ['confirmed', 'packing', 'packed', 'shipped']

export function Component() {
  const id = Number(useParams().orderId)
  const order = useOrder(id)
  const confirm = useConfirmOrder(id)
  const [cancelling, setCancelling] = useState(false)
  const [editing, setEditing] = useState(false)

  if (order.isPending) return <LoadingBlock label="Loading the order…" />
  if (order.isError) {
    const missing =
      order.error instanceof ApiError && (order.error.status === 404 || order.error.status === 400)
    return (
      <EmptyState
        title={missing ? 'There is no such order' : 'The order did not load'}
        message={missing ? undefined : order.error.message}
        action={<LinkButton to={paths.owner.orders}>All orders</LinkButton>}
      />
    )
  }
  const o = order.data
  const onBench = ON_BENCH.includes(o.status)
  return (
    <>
      <PageHeader
        back={{ to: paths.owner.orders, label: 'All orders' }}
        title={
          <span className="flex flex-wrap items-center gap-3">
            Order {o.number} <OrderStatusBadge status={o.status} />
          </span>
        }
        description={`${o.shopName}${o.poNumber ? ` · PO ${o.poNumber}` : ''}`}
        actions={
          <>
            {EDITABLE.includes(o.status) ? (
              <Button variant="secondary" onClick={() => setEditing(true)}>
                Change lines
              </Button>
            ) : null}
            {isCancellableBy(o.status, 'owner') ? (
              <Button variant="danger" onClick={() => setCancelling(true)}>
                Cancel order
              </Button>
            ) : null}
            {canTransition(o.status, 'confirmed', 'owner') ? (
              <Button
                loading={confirm.isPending}
                onClick={() =>
                  confirm.mutate(undefined, {
                    onSuccess: () => toast.success(`Order ${o.number} is confirmed; the shop is told.`),
                  })
                }
              >
                Confirm order
              </Button>
            ) : null}
          </>
        }
      />
      {onBench || o.invoice ? (
        <nav aria-label="Packing and invoice" className="mb-6 flex flex-wrap gap-2">
          {onBench ? (
            <>
              <LinkButton to={paths.owner.packingOrder(o.id)} variant="secondary" size="sm">
                Packing view
              </LinkButton>
              <a
                href={packingSlipHref(o.id)}
                target="_blank"
                rel="noopener"
                className={buttonClasses('secondary', 'sm')}
              >
                Packing slip (PDF)
              </a>
            </>
          ) : null}
          {o.invoice ? (
            <LinkButton to={paths.owner.invoice(o.invoice.id)} variant="secondary" size="sm">
              {o.invoice.void ? `Void invoice ${o.invoice.number}` : `Invoice ${o.invoice.number}`}
            </LinkButton>
          ) : null}
        </nav>
      ) : null}
      {o.awaitingPayment && o.status !== 'shipped' && o.status !== 'cancelled' ? (
        <Notice
          title="Payment awaited"
          className="mb-6"
          action={
            o.invoice ? (
              <LinkButton to={paths.owner.invoice(o.invoice.id)} variant="secondary" size="sm">
                Open invoice {o.invoice.number}
              </LinkButton>
            ) : null
          }
        >
          {o.shopName} is on prepay terms and invoice {o.invoice?.number} is not yet paid in full. The order
          can be packed; it cannot ship until the payment is recorded.
        </Notice>
      ) : null}
      <OrderDetail order={o} showLots />
      <CancelOrderDialog order={o} open={cancelling} onClose={() => setCancelling(false)} />
      {editing ? (
        <EditLinesDialog
          key={o.lines.map((l) => `${l.id}:${l.cases}`).join(',')}
          order={o}
          open={editing}
          onClose={() => setEditing(false)}
        />
      ) : null}
    </>
  )
}
