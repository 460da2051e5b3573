import { useNavigate, useParams } from 'react-router-dom'
import { Badge } from '@/components/ui/badge'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { EmptyState } from '@/components/ui/empty-state'
import { LinkButton } from '@/components/ui/button'
import { Money } from '@/components/ui/money'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { toast } from '@/components/ui/toast'
import { paths } from '@/config/paths'
import {
  useCreateProduct,
  useProduct,
  useRecipeOptions,
  useUpdateProduct,
} from '@/features/products/api/products'
import { DeclarationCard } from '@/features/products/components/declaration-card'
import { ProductForm } from '@/features/products/components/product-form'
import { ProductPhotoCard } from '@/features/products/components/product-photo-card'
import { useSettings } from '@/features/studio/api/studio'

const back = { to: paths.owner.products, label: 'All products' }

function NewProduct() {
  const recipes = useRecipeOptions()
  const settings = useSettings()
  const create = useCreateProduct()
  const navigate = useNavigate()
  return (
    <>
      <PageHeader
        title="New product"
        description="A bar for the catalogue. Add its photo and confirm its ingredient list once it is saved."
        back={back}
      />
      <Card>
        <CardBody>
          {recipes.isPending || settings.isPending ? (
            <LoadingBlock />
          ) : (recipes.data ?? []).length === 0 ? (
            <EmptyState
              title="No recipes yet"
              message="A product is made from a recipe: write the recipe first."
            />
          ) : (
            <ProductForm
              product={null}
              recipes={recipes.data ?? []}
              currency={settings.data?.currency ?? 'USD'}
              saving={create.isPending}
              onSave={async (values) => {
                const { product } = await create.mutateAsync(values)
                toast.success(`${product.sku} created.`)
                navigate(paths.owner.product(product.id), { replace: true })
              }}
            />
          )}
        </CardBody>
      </Card>
    </>
  )
}

function EditProduct({ id }: { id: number }) {
  const product = useProduct(id)
  const recipes = useRecipeOptions()
  const settings = useSettings()
  const update = useUpdateProduct(id)
  if (product.isPending || recipes.isPending || settings.isPending) return <LoadingBlock />
  if (!product.data) {
    return (
      <>
        <PageHeader title="Product not found" back={back} />
        <EmptyState
          title="There is no such product"
          action={<LinkButton to={paths.owner.products}>All products</LinkButton>}
        />
      </>
    )
  }
  const p = product.data
  const currency = settings.data?.currency ?? 'USD'
  return (
    <>
      <PageHeader
        title={p.name}
        description={
          <span className="flex flex-wrap items-center gap-2">
            <span className="font-medium text-ink-900">{p.sku}</span>
            <Badge tone={p.active ? 'green' : 'neutral'}>{p.active ? 'On sale' : 'Off sale'}</Badge>
            <span>
              Cost per bar{' '}
              {p.costPerBarCents == null ? (
                'not known yet'
              ) : (
                <Money cents={p.costPerBarCents} currency={currency} />
              )}
              {p.missingCosts.length > 0 ? ` (without ${p.missingCosts.join(', ')})` : ''}
            </span>
          </span>
        }
        back={back}
        actions={
          <LinkButton variant="secondary" to={paths.owner.pricing}>
            Prices ({p.priceBreakCount} {p.priceBreakCount === 1 ? 'break' : 'breaks'})
          </LinkButton>
        }
      />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_18rem]">
        <div className="flex min-w-0 flex-col gap-6">
          <Card>
            <CardHeader title="Details" />
            <CardBody>
              <ProductForm
                key={p.updatedAt}
                product={p}
                recipes={recipes.data ?? []}
                currency={currency}
                saving={update.isPending}
                onSave={async (values) => {
                  await update.mutateAsync(values)
                  toast.success('Product saved.')
                }}
              />
            </CardBody>
          </Card>
          <DeclarationCard productId={p.id} />
        </div>
        <div className="order-first lg:order-none">
          <ProductPhotoCard product={p} />
        </div>
      </div>
    </>
  )
}

export function Component() {
  const { productId } = useParams()
  if (productId === undefined) return <NewProduct />
  const id = Number(productId)
  if (!Number.isSafeInteger(id) || id <= 0) {
    return (
      <>
        <PageHeader title="Product not found" back={back} />
        <EmptyState title="There is no such product" />
      </>
    )
  }
  return <EditProduct key={id} id={id} />
}
