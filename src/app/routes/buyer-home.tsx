import { LinkButton } from '@/components/ui/button'
import { Card, CardBody } from '@/components/ui/card'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { paths } from '@/config/paths'
import { useMe } from '@/features/auth/api/me'
import { MyCertificateCard } from '@/features/shop-account/components/my-certificate-card'
import { ShopDetails } from '@/features/shop-account/components/shop-details'
import { useMyShop } from '@/features/shop-account/api/my-shop'
import { StudioCard } from '@/features/studio/components/studio-card'

export function Component() {
  const me = useMe()
  const shop = useMyShop()
  return (
    <>
      <PageHeader
        title={shop.data ? shop.data.tradingName : 'Your shop'}
        description={`Welcome, ${me.data?.name ?? ''}. Your wholesale account with the studio.`}
        actions={
          <>
            <LinkButton variant="secondary" to={paths.buyer.orders}>
              Your orders
            </LinkButton>
            <LinkButton to={paths.buyer.catalogue}>Browse the catalogue</LinkButton>
          </>
        }
      />
      <div className="grid gap-6 lg:grid-cols-3">
        <div className="lg:col-span-2">
          {shop.isPending ? (
            <Card>
              <CardBody>
                <LoadingBlock />
              </CardBody>
            </Card>
          ) : shop.data ? (
            <div className="flex flex-col gap-6">
              <ShopDetails shop={shop.data} />
              <MyCertificateCard shop={shop.data} />
            </div>
          ) : null}
        </div>
        <StudioCard title="Your studio contact" />
      </div>
    </>
  )
}
