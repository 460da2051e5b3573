import { LinkButton } from '@/components/ui/button'
import { EmptyState } from '@/components/ui/empty-state'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { paths } from '@/config/paths'
import { useCart } from '@/features/cart/api/cart'
import { AddToCart } from '@/features/cart/components/add-to-cart'
import { useCatalogue } from '@/features/catalogue/api/catalogue'
import { CatalogueBrowser } from '@/features/catalogue/components/catalogue-browser'
import { ProductTile } from '@/features/products/components/product-tile'

export function Component() {
  const catalogue = useCatalogue()
  const cart = useCart()
  const inCart = new Map((cart.data?.lines ?? []).map((l) => [l.productId, l]))
  const cases = cart.data?.cases ?? 0
  return (
    <>
      <PageHeader
        title="Catalogue"
        description="Your prices per bar at your account’s tier. Orders are by the whole case, from bars that have finished curing."
        actions={
          <LinkButton to={paths.buyer.cart} variant={cases > 0 ? 'primary' : 'secondary'}>
            Cart{cases > 0 ? ` (${cases} ${cases === 1 ? 'case' : 'cases'})` : ''}
          </LinkButton>
        }
      />
      {catalogue.isPending ? (
        <LoadingBlock label="Loading the catalogue…" />
      ) : catalogue.isError ? (
        <EmptyState title="The catalogue did not load" message={catalogue.error.message} />
      ) : (
        <CatalogueBrowser
          items={catalogue.data}
          currency={cart.data?.currency ?? 'USD'}
          renderTile={(item, size) => (
            <ProductTile sku={item.sku} name={item.name} photoUrl={item.photoUrl} size={size} />
          )}
          renderAction={(item) => {
            const line = inCart.get(item.productId)
            return (
              <AddToCart
                key={`${item.productId}:${line?.cases ?? 0}:${line?.preorder ?? ''}`}
                item={item}
                line={line}
              />
            )
          }}
        />
      )}
    </>
  )
}
