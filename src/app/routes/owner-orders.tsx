import { buttonClasses } from '@/components/ui/button'
import { EmptyState } from '@/components/ui/empty-state'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { paths } from '@/config/paths'
import { ordersCsvHref, useOrders } from '@/features/orders/api/orders'
import { OrderFiltersBar } from '@/features/orders/components/order-filters'
import { OrdersTable } from '@/features/orders/components/orders-table'
import { Pager } from '@/features/orders/components/pager'
import { useOrderFilters } from '@/features/orders/components/use-order-filters'
import { useShops } from '@/features/studio/api/studio'

export function Component() {
  const [filters, setFilters] = useOrderFilters()
  const orders = useOrders(filters)
  const shops = useShops()
  const shopOptions = (shops.data ?? []).map((s) => ({ id: s.id, name: s.tradingName }))
  return (
    <>
      <PageHeader
        title="Orders"
        description="Every shop’s orders, newest first. Confirm new ones, change lines before packing, cancel when needed."
        actions={
          <a href={ordersCsvHref(filters)} download className={buttonClasses('secondary')}>
            Download CSV
          </a>
        }
      />
      {orders.isPending ? (
        <LoadingBlock label="Loading orders…" />
      ) : orders.isError ? (
        <EmptyState title="The orders did not load" message={orders.error.message} />
      ) : (
        <div className="flex flex-col gap-4">
          <OrdersTable
            orders={orders.data.items}
            hrefFor={(o) => paths.owner.order(o.id)}
            showShop
            toolbar={<OrderFiltersBar value={filters} onChange={setFilters} shops={shopOptions} />}
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
