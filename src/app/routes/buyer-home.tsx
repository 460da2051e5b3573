import { Card, CardBody } from '@/components/ui/card'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { useMe } from '@/features/auth/api/me'
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
            <ShopDetails shop={shop.data} />
          ) : null}
        </div>
        <StudioCard title="Your studio contact" />
      </div>
    </>
  )
}
