import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { FormError } from '@/components/ui/form-error'
import { usePricing } from '@/features/pricing/api/pricing'
import { PricingTable } from '@/features/pricing/components/pricing-table'
import { TiersEditor } from '@/features/pricing/components/tiers-editor'

export function Component() {
  const pricing = usePricing()
  return (
    <>
      <PageHeader
        title="Pricing"
        description="Wholesale prices per bar for every product and tier, checked against today’s cost per bar and each tier’s target margin."
      />
      {pricing.isPending ? (
        <LoadingBlock />
      ) : !pricing.data ? (
        <FormError message={pricing.error?.message ?? 'The prices could not be loaded.'} />
      ) : (
        <div className="flex flex-col gap-8">
          <PricingTable data={pricing.data} />
          <TiersEditor tiers={pricing.data.tiers} />
        </div>
      )}
    </>
  )
}
