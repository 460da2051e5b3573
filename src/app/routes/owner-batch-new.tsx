import { useNavigate } from 'react-router-dom'
import { formatDate } from '@shared/domain/dates/dates'
import { LinkButton } from '@/components/ui/button'
import { EmptyState } from '@/components/ui/empty-state'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { toast } from '@/components/ui/toast'
import { paths } from '@/config/paths'
import { usePourableProducts } from '@/features/batches/api/batches'
import { BatchForm } from '@/features/batches/components/batch-form'
import { useStudioCurrency } from '@/features/studio/api/studio'

export function Component() {
  const products = usePourableProducts()
  const currency = useStudioCurrency()
  const navigate = useNavigate()
  return (
    <>
      <PageHeader
        back={{ to: paths.owner.batches, label: 'All batches' }}
        title="Record a batch"
        description="Once poured: the lots it used come off the shelves, it gets its lot code, and it starts to cure."
      />
      {products.isPending ? (
        <LoadingBlock />
      ) : (products.data ?? []).length === 0 ? (
        <EmptyState
          title="No product to pour yet."
          message="A batch is poured for a product made from a recipe."
          action={<LinkButton to={paths.owner.products}>Products</LinkButton>}
        />
      ) : (
        <BatchForm
          products={products.data ?? []}
          currency={currency}
          onRecorded={(b) => {
            toast.success(
              `Batch ${b.lotCode} recorded: ${b.sellableBars} bars, ready on ${formatDate(b.readyDate)}.`,
            )
            navigate(paths.owner.batch(b.id))
          }}
        />
      )}
    </>
  )
}
