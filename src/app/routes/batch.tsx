import { useParams } from 'react-router-dom'
import { EmptyState } from '@/components/ui/empty-state'
import { LinkButton } from '@/components/ui/button'
import { LoadingBlock } from '@/components/ui/spinner'
import { paths } from '@/config/paths'
import { useMe } from '@/features/auth/api/me'
import { useBatch } from '@/features/batches/api/batch'
import { BatchDetails } from '@/features/batches/components/batch-details'
import { useStudioCurrency } from '@/features/studio/api/studio'
import { ApiError } from '@/lib/api-client'

/** One batch, for the owner (with costs and purchase links) and the packer (without). */
export function Component() {
  const { batchId } = useParams()
  const id = Number(batchId)
  const me = useMe()
  const batch = useBatch(id)
  const currency = useStudioCurrency()
  const owner = me.data?.role === 'owner'
  const back = owner
    ? { to: paths.owner.batches, label: 'All batches' }
    : { to: paths.packer.stock, label: 'Stock' }
  if (batch.isPending) return <LoadingBlock label="Loading the batch…" />
  if (!batch.data) {
    const missing =
      batch.error instanceof ApiError && (batch.error.status === 404 || batch.error.status === 400)
    return (
      <EmptyState
        title={missing ? 'There is no such batch.' : 'The batch could not be loaded.'}
        action={<LinkButton to={back.to}>{back.label}</LinkButton>}
      />
    )
  }
  return (
    <BatchDetails
      batch={batch.data}
      back={back}
      owner={owner}
      currency={currency}
      purchaseHref={owner ? paths.owner.purchase : undefined}
    />
  )
}
