import { LinkButton } from '@/components/ui/button'
import { PageHeader } from '@/components/ui/page-header'
import { paths } from '@/config/paths'
import { CuringScreen } from '@/features/batches/components/curing-screen'
import { useStudioCurrency } from '@/features/studio/api/studio'

export function Component() {
  const currency = useStudioCurrency()
  const record = <LinkButton to={paths.owner.batchNew}>Record a batch</LinkButton>
  return (
    <>
      <PageHeader
        title="Batches"
        description="What is curing, what is ready to sell, and what has run out. A batch turns ready on its ready date by itself."
        actions={record}
      />
      <CuringScreen showCosts currency={currency} batchHref={paths.owner.batch} emptyAction={record} />
    </>
  )
}
