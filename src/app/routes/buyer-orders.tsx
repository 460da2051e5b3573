import { LinkButton, buttonClasses } from '@/components/ui/button'
import { EmptyState } from '@/components/ui/empty-state'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { paths } from '@/config/paths'
import { ordersCsvHref, useOrders } from '@/features/orders/api/orders'
import { OrderFiltersBar } from '@/features/orders/components/order-filters'
import { OrdersTable } from '@/features/orders/components/orders-table'
import { Pager } from '@/features/orders/components/pager'
import { useOrderFilters } from '@/features/orders/components/use-order-filters'

export function Component() {
  const [filters, setFilters] = useOrderFilters()
  const orders = useOrders(filters)
  const filtered = Boolean(filters.status || filters.from || filters.to || filters.q)
  return (
    <>
      <PageHeader
        title="Orders"
        description="Every order of your shop, newest first. Open one to see its lines, cancel it while it awaits the studio, or order the same again."
        actions={
          <>
            <a href={ordersCsvHref(filters)} download className={buttonClasses('secondary')}>
              Download CSV
            </a>
            <LinkButton to={paths.buyer.catalogue}>New order</LinkButton>
          </>
        }
      />
      {orders.isPending ? (
        <LoadingBlock label="Loading your orders…" />
      ) : orders.isError ? (
        <EmptyState title="Your orders did not load" message={orders.error.message} />
      ) : orders.data.total === 0 && !filtered ? (
        <EmptyState
          title="No orders yet"
          message="Your first order starts in the catalogue."
          action={<LinkButton to={paths.buyer.catalogue}>Browse the catalogue</LinkButton>}
        />
      ) : (
        <div className="flex flex-col gap-4">
          <OrdersTable
            orders={orders.data.items}
            hrefFor={(o) => paths.buyer.order(o.id)}
            toolbar={<OrderFiltersBar value={filters} onChange={setFilters} />}
            emptyMessage="No order matches these filters."
          />
          <Pager
            page={orders.data.page}
            pageSize={orders.data.pageSize}
            total={orders.data.total}
            onPage={(page) => setFilters({ ...filters, page })}
          />
        </div>
      )}
    </>
  )
}
