import { useState } from 'react'
import { useParams } from 'react-router-dom'
import { useQueryClient } from '@tanstack/react-query'
import { INGREDIENT_KIND_LABELS } from '@shared/schemas/ingredients'
import { Button, LinkButton } from '@/components/ui/button'
import { ConfirmDialog } from '@/components/ui/dialog'
import { EmptyState } from '@/components/ui/empty-state'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { toast } from '@/components/ui/toast'
import { paths } from '@/config/paths'
import {
  ingredientKeys,
  useIngredient,
  useIngredients,
  useSetIngredientArchived,
} from '@/features/ingredients/api/ingredients'
import { CostRule } from '@/features/ingredients/components/cost-rule'
import { IngredientDialog } from '@/features/ingredients/components/ingredient-dialog'
import { IngredientLotsTable } from '@/features/ingredients/components/ingredient-lots-table'
import { IngredientSummary } from '@/features/ingredients/components/ingredient-summary'
import { LyeCautions } from '@/features/ingredients/components/lye-cautions'
import { purchaseKeys } from '@/features/purchases/api/purchases'
import { PurchaseDialog } from '@/features/purchases/components/purchase-dialog'
import { useSettings } from '@/features/studio/api/studio'
import { ApiError } from '@/lib/api-client'

export function Component() {
  const id = Number(useParams().ingredientId)
  const detail = useIngredient(id)
  const active = useIngredients()
  const currency = useSettings().data?.currency ?? 'USD'
  const setArchived = useSetIngredientArchived()
  const qc = useQueryClient()
  const [editing, setEditing] = useState(false)
  const [buying, setBuying] = useState(false)
  const [archiving, setArchiving] = useState(false)
  const back = { to: paths.owner.ingredients, label: 'All ingredients' }

  if (detail.isPending) return <LoadingBlock />
  if (!detail.data) {
    const missing =
      detail.error instanceof ApiError && (detail.error.status === 404 || detail.error.status === 400)
    return (
      <>
        <PageHeader
          title={missing ? 'No such ingredient' : 'This ingredient could not be loaded'}
          back={back}
        />
        <EmptyState
          title={missing ? 'There is no ingredient with this number.' : 'Please try again in a moment.'}
          action={<LinkButton to={paths.owner.ingredients}>Back to ingredients</LinkButton>}
        />
      </>
    )
  }
  const { ingredient, lots, costRule } = detail.data

  return (
    <>
      <PageHeader
        title={ingredient.name}
        description={[INGREDIENT_KIND_LABELS[ingredient.kind], ingredient.inci].filter(Boolean).join(' · ')}
        back={back}
        actions={
          <>
            <Button variant="secondary" onClick={() => setArchiving(true)}>
              {ingredient.archived ? 'Restore' : 'Archive'}
            </Button>
            <Button variant="secondary" onClick={() => setEditing(true)}>
              Edit
            </Button>
            {!ingredient.archived ? <Button onClick={() => setBuying(true)}>Record a purchase</Button> : null}
          </>
        }
      />
      <div className="flex flex-col gap-6">
        <IngredientSummary ingredient={ingredient} currency={currency} />
        {ingredient.kind === 'lye' ? <LyeCautions /> : null}
        <CostRule rule={costRule} ingredient={ingredient} lots={lots} currency={currency} />
        <section aria-labelledby="ingredient-lots" className="flex flex-col gap-3">
          <h2 id="ingredient-lots" className="text-lg font-medium text-ink-900">
            Purchases, newest first
          </h2>
          <IngredientLotsTable lots={lots} currency={currency} />
        </section>
      </div>
      <IngredientDialog open={editing} ingredient={ingredient} onClose={() => setEditing(false)} />
      <PurchaseDialog
        open={buying}
        onClose={() => setBuying(false)}
        ingredients={active.data?.items ?? [ingredient]}
        suppliers={[...new Set(lots.map((l) => l.supplier))]}
        ingredientId={ingredient.id}
        currency={currency}
        onSaved={() => qc.invalidateQueries({ queryKey: ingredientKeys.all })}
      />
      <ConfirmDialog
        open={archiving}
        onClose={() => setArchiving(false)}
        title={ingredient.archived ? `Restore ${ingredient.name}?` : `Archive ${ingredient.name}?`}
        message={
          ingredient.archived
            ? 'It comes back to the lists and can be bought and used in recipes again.'
            : 'It leaves the lists and pickers. Its purchases, stock and history stay, and you can restore it later.'
        }
        confirmLabel={ingredient.archived ? 'Restore' : 'Archive'}
        onConfirm={async () => {
          const { ingredient: saved } = await setArchived.mutateAsync({
            id: ingredient.id,
            archived: !ingredient.archived,
          })
          await qc.invalidateQueries({ queryKey: purchaseKeys.all })
          toast.success(saved.archived ? `${saved.name} is archived.` : `${saved.name} is restored.`)
        }}
      />
    </>
  )
}
