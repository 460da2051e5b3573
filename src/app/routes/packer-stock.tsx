import { PageHeader } from '@/components/ui/page-header'
import { paths } from '@/config/paths'
import { CuringScreen } from '@/features/batches/components/curing-screen'

export function Component() {
  return (
    <>
      <PageHeader
        title="Stock"
        description="Bars on the racks by batch. Write off bars that are damaged, sweating or spotted, or given away as samples, and correct a count after a recount."
      />
      <CuringScreen showCosts={false} batchHref={paths.packer.batch} />
    </>
  )
}
