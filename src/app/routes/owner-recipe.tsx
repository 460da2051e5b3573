import { useState } from 'react'
import { useParams } from 'react-router-dom'
import { Badge } from '@/components/ui/badge'
import { Button, LinkButton } from '@/components/ui/button'
import { ConfirmDialog } from '@/components/ui/dialog'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { Tabs } from '@/components/ui/tabs'
import { toast } from '@/components/ui/toast'
import { paths } from '@/config/paths'
import { NotFound } from '@/app/routes/not-found'
import { BatchSheetPanel } from '@/features/batch-sheet/components/batch-sheet-panel'
import { useRecipe, useSetRecipeArchived } from '@/features/recipes/api/recipes'
import { CostSheetPanel } from '@/features/recipes/components/cost-sheet-panel'
import { RecipeSummary } from '@/features/recipes/components/recipe-summary'
import { ApiError } from '@/lib/api-client'

export function Component() {
  const id = Number(useParams().recipeId)
  const recipe = useRecipe(id)
  const archive = useSetRecipeArchived(id)
  const [confirming, setConfirming] = useState(false)

  if (!Number.isInteger(id) || id <= 0 || (recipe.error instanceof ApiError && recipe.error.status === 404)) {
    return <NotFound />
  }
  if (!recipe.data) return <LoadingBlock label="Loading the recipe…" />
  const r = recipe.data

  return (
    <>
      <PageHeader
        back={{ to: paths.owner.recipes, label: 'Recipes' }}
        title={
          <span className="inline-flex flex-wrap items-center gap-3">
            {r.name}
            {r.archivedAt ? <Badge>Archived</Badge> : null}
          </span>
        }
        description="The batch sheet says what to weigh; the cost sheet what a bar costs at today's purchase prices."
        actions={
          r.archivedAt ? (
            <Button
              variant="secondary"
              loading={archive.isPending}
              onClick={() =>
                archive.mutate(false, { onSuccess: () => toast.success(`${r.name} is back in use.`) })
              }
            >
              Restore
            </Button>
          ) : (
            <>
              <LinkButton to={paths.owner.recipeEdit(r.id)}>Edit recipe</LinkButton>
              <Button variant="secondary" onClick={() => setConfirming(true)}>
                Archive
              </Button>
            </>
          )
        }
      />
      <div className="flex flex-col gap-6">
        <RecipeSummary recipe={r} />
        <Tabs
          label="Recipe sheets"
          items={[
            {
              id: 'batch',
              label: 'Batch sheet',
              content: <BatchSheetPanel recipeId={r.id} mouldOilWeightG={r.mouldOilWeightG} />,
            },
            { id: 'cost', label: 'Cost sheet', content: <CostSheetPanel recipe={r} /> },
          ]}
        />
      </div>
      <ConfirmDialog
        open={confirming}
        onClose={() => setConfirming(false)}
        title={`Archive ${r.name}?`}
        message="It leaves the recipe list and cannot be changed until it is restored. Batches already poured keep their own copy of it."
        confirmLabel="Archive"
        onConfirm={async () => {
          await archive.mutateAsync(true)
          toast.success(`${r.name} is archived.`)
        }}
      />
    </>
  )
}
