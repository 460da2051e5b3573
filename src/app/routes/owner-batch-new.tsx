import { useNavigate, useSearchParams } from 'react-router-dom'
import { formatDate } from '@shared/domain/dates/dates'
import { LinkButton } from '@/components/ui/button'
import { EmptyState } from '@/components/ui/empty-state'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { toast } from '@/components/ui/toast'
import { paths } from '@/config/paths'
import { usePourableProducts } from '@/features/batches/api/batches'
import { BatchForm } from '@/features/batches/components/batch-form'
import { usePlannedPour } from '@/features/planning/api/plan'
import { useStudioCurrency } from '@/features/studio/api/studio'

export function Component() {
  const products = usePourableProducts()
  const currency = useStudioCurrency()
  const navigate = useNavigate()
  const [search] = useSearchParams()
  const planId = Number(search.get('plan'))
  const planned = usePlannedPour(Number.isSafeInteger(planId) && planId > 0 ? planId : null)
  const open = planned.data?.status === 'planned' ? planned.data : null
  return (
    <>
      <PageHeader
        back={{ to: paths.owner.batches, label: 'All batches' }}
        title="Record a batch"
        description="Once poured: the lots it used come off the shelves, it gets its lot code, and it starts to cure."
      />
      {planned.data && !open ? (
        <p
          className="mb-4 rounded-card bg-honey-50 px-4 py-3 text-sm text-honey-700 ring-1 ring-honey-500/30"
          role="status"
        >
          That planned pour was already {planned.data.status}; this is a batch of its own.
        </p>
      ) : null}
      {planned.isError ? (
        <p
          className="mb-4 rounded-card bg-honey-50 px-4 py-3 text-sm text-honey-700 ring-1 ring-honey-500/30"
          role="status"
        >
          That planned pour was not found; this is a batch of its own.
        </p>
      ) : null}
      {products.isPending || planned.isLoading ? (
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
          plan={
            open
              ? {
                  id: open.id,
                  productId: open.productId,
                  oilWeightG: open.oilWeightG,
                  description: `Pouring the planned batch of ${open.productName}: ${open.moulds} ${open.moulds === 1 ? 'mould' : 'moulds'}, planned for ${formatDate(open.pourDate)}.`,
                }
              : null
          }
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
