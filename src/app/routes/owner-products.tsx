import { LinkButton } from '@/components/ui/button'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { paths } from '@/config/paths'
import { useProducts } from '@/features/products/api/products'
import { ProductsTable } from '@/features/products/components/products-table'
import { useStudioCurrency } from '@/features/studio/api/studio'

export function Component() {
  const products = useProducts()
  const currency = useStudioCurrency()
  return (
    <>
      <PageHeader
        title="Products"
        description="The bars you sell by the case: each made from a recipe, with its case pack, weights and MSRP. Cost per bar is at today’s lot prices."
        actions={
          <>
            <LinkButton variant="secondary" to={paths.owner.pricing}>
              Pricing
            </LinkButton>
            <LinkButton to={paths.owner.productNew}>New product</LinkButton>
          </>
        }
      />
      {products.isPending ? (
        <LoadingBlock />
      ) : (
        <ProductsTable products={products.data ?? []} currency={currency} />
      )}
    </>
  )
}
