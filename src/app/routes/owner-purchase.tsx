import { useState } from 'react'
import { useParams } from 'react-router-dom'
import { useQueryClient } from '@tanstack/react-query'
import { formatDate } from '@shared/domain/dates/dates'
import { Button, LinkButton } from '@/components/ui/button'
import { EmptyState } from '@/components/ui/empty-state'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { paths } from '@/config/paths'
import { ingredientKeys, useIngredients } from '@/features/ingredients/api/ingredients'
import { usePurchase } from '@/features/purchases/api/purchases'
import { PurchaseDialog } from '@/features/purchases/components/purchase-dialog'
import { PurchaseSummary } from '@/features/purchases/components/purchase-summary'
import { useSettings } from '@/features/studio/api/studio'
import { ApiError } from '@/lib/api-client'

export function Component() {
  const id = Number(useParams().purchaseId)
  const purchase = usePurchase(id)
  const active = useIngredients()
  const currency = useSettings().data?.currency ?? 'USD'
  const qc = useQueryClient()
  const [editing, setEditing] = useState(false)
  const back = { to: paths.owner.purchases, label: 'All purchases' }

  if (purchase.isPending) return <LoadingBlock />
  if (!purchase.data) {
    const missing =
      purchase.error instanceof ApiError && (purchase.error.status === 404 || purchase.error.status === 400)
    return (
      <>
        <PageHeader title={missing ? 'No such purchase' : 'This purchase could not be loaded'} back={back} />
        <EmptyState
          title={missing ? 'There is no purchase with this number.' : 'Please try again in a moment.'}
          action={<LinkButton to={paths.owner.purchases}>Back to purchases</LinkButton>}
        />
      </>
    )
  }
  const p = purchase.data

  return (
    <>
      <PageHeader
        title={`${p.ingredientName}, ${p.supplierLotCode ?? `purchase #${p.id}`}`}
        description={`Received ${formatDate(p.receivedOn)} from ${p.supplier}.`}
        back={back}
        actions={
          <>
            <LinkButton variant="secondary" to={paths.owner.ingredient(p.ingredientId)}>
              {p.ingredientName}
            </LinkButton>
            <Button
              onClick={() => setEditing(true)}
              disabled={p.inUse}
              aria-describedby={p.inUse ? 'purchase-locked' : undefined}
            >
              Correct it
            </Button>
          </>
        }
      />
      {p.inUse ? (
        <p id="purchase-locked" className="-mt-3 mb-5 text-sm text-ink-700">
          Part of this purchase has gone into batches, so its figures stay as they are.
        </p>
      ) : null}
      <PurchaseSummary purchase={p} currency={currency} />
      <PurchaseDialog
        open={editing}
        onClose={() => setEditing(false)}
        ingredients={active.data?.items ?? []}
        purchase={p}
        currency={currency}
        onSaved={() => qc.invalidateQueries({ queryKey: ingredientKeys.all })}
      />
    </>
  )
}
