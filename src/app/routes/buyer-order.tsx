import { useState } from 'react'
import { useQueryClient } from '@tanstack/react-query'
import { useNavigate, useParams } from 'react-router-dom'
import { isCancellableBy } from '@shared/domain/orders/order-status'
import { Button, LinkButton } from '@/components/ui/button'
import { EmptyState } from '@/components/ui/empty-state'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { toast } from '@/components/ui/toast'
import { paths } from '@/config/paths'
import { cartKeys } from '@/features/cart/api/cart'
import { useOrder, useReorder } from '@/features/orders/api/orders'
import { CancelOrderDialog } from '@/features/orders/components/cancel-order-dialog'
import { OrderDetail } from '@/features/orders/components/order-detail'
import { OrderStatusBadge } from '@/features/orders/components/order-status-badge'
import { ApiError } from '@/lib/api-client'

export function Component() {
  const id = Number(useParams().orderId)
  const order = useOrder(id)
  const reorder = useReorder(id)
  const qc = useQueryClient()
  const navigate = useNavigate()
  const [cancelling, setCancelling] = useState(false)

  if (order.isPending) return <LoadingBlock label="Loading the order…" />
  if (order.isError) {
    const missing =
      order.error instanceof ApiError && (order.error.status === 404 || order.error.status === 400)
    return (
      <EmptyState
        title={missing ? 'There is no such order for your shop' : 'The order did not load'}
        message={missing ? 'It may have been mistyped.' : order.error.message}
        action={<LinkButton to={paths.buyer.orders}>All your orders</LinkButton>}
      />
    )
  }
  const o = order.data
  const again = () =>
    reorder.mutate(undefined, {
      onSuccess: (result) => {
        qc.setQueryData(cartKeys.detail(), result.cart)
        const notes = [
          ...result.short.map((s) => `${s.name}: only ${s.readyCases} of ${s.cases} cases ready now`),
          ...result.skipped.map((s) => `${s.name} is no longer available`),
        ]
        if (notes.length > 0) toast.info(`The lines are in your cart. ${notes.join('; ')}.`)
        else toast.success('The lines are in your cart at today’s prices.')
        navigate(paths.buyer.cart)
      },
    })

  return (
    <>
      <PageHeader
        back={{ to: paths.buyer.orders, label: 'All orders' }}
        title={
          <span className="flex flex-wrap items-center gap-3">
            Order {o.number} <OrderStatusBadge status={o.status} />
          </span>
        }
        description={o.poNumber ? `Your PO ${o.poNumber}` : undefined}
        actions={
          <>
            <Button variant="secondary" onClick={again} loading={reorder.isPending}>
              Order the same again
            </Button>
            {isCancellableBy(o.status, 'buyer') ? (
              <Button variant="danger" onClick={() => setCancelling(true)}>
                Cancel order
              </Button>
            ) : null}
          </>
        }
      />
      {o.status === 'placed' ? (
        <p className="mb-4 text-sm text-ink-700">
          The studio has not confirmed it yet: until then you can still cancel it.
        </p>
      ) : null}
      <OrderDetail order={o} />
      <CancelOrderDialog order={o} open={cancelling} onClose={() => setCancelling(false)} />
    </>
  )
}
