import { useQueryClient } from '@tanstack/react-query'
import { useNavigate } from 'react-router-dom'
import { LinkButton } from '@/components/ui/button'
import { EmptyState } from '@/components/ui/empty-state'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { toast } from '@/components/ui/toast'
import { paths } from '@/config/paths'
import { useCart } from '@/features/cart/api/cart'
import { CartView } from '@/features/cart/components/cart-view'
import { catalogueKeys } from '@/features/catalogue/api/catalogue'
import { orderKeys } from '@/features/orders/api/orders'
import { ProductTile } from '@/features/products/components/product-tile'

export function Component() {
  const cart = useCart()
  const qc = useQueryClient()
  const navigate = useNavigate()
  return (
    <>
      <PageHeader
        title="Cart"
        description="Kept for your shop on the studio’s side, so anyone of your shop can finish it. Prices are today’s, at the break each line’s cases reach."
        back={{ to: paths.buyer.catalogue, label: 'Catalogue' }}
      />
      {cart.isPending ? (
        <LoadingBlock label="Loading your cart…" />
      ) : cart.isError ? (
        <EmptyState title="The cart did not load" message={cart.error.message} />
      ) : cart.data.lines.length === 0 ? (
        <EmptyState
          title="Your cart is empty"
          message="Add cases from the catalogue; the cart shows your prices, the minimum and what is ready to ship."
          action={<LinkButton to={paths.buyer.catalogue}>Browse the catalogue</LinkButton>}
        />
      ) : (
        <CartView
          cart={cart.data}
          renderTile={(line) => <ProductTile sku={line.sku} name={line.name} photoUrl={line.photoUrl} />}
          onPlaced={(order) => {
            qc.setQueryData(orderKeys.detail(order.id), order)
            void qc.invalidateQueries({ queryKey: orderKeys.lists() })
            void qc.invalidateQueries({ queryKey: catalogueKeys.all })
            toast.success(`Order ${order.number} is placed. A confirmation is on its way by e-mail.`)
            navigate(paths.buyer.order(order.id))
          }}
        />
      )}
    </>
  )
}
