import { useState } from 'react'
import { Checkbox } from '@/components/ui/field'
import { LinkButton } from '@/components/ui/button'
import { EmptyState } from '@/components/ui/empty-state'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { paths } from '@/config/paths'
import { useRecipes } from '@/features/recipes/api/recipes'
import { RecipesTable } from '@/features/recipes/components/recipes-table'
import { useSettings } from '@/features/studio/api/studio'

export function Component() {
  const [archived, setArchived] = useState(false)
  const recipes = useRecipes(archived)
  const settings = useSettings()
  const newRecipe = <LinkButton to={paths.owner.recipeNew}>New recipe</LinkButton>
  return (
    <>
      <PageHeader
        title="Recipes"
        description="What goes into each bar: oils, lye and water, fragrance, additives and packaging. Open one for its batch sheet and what a bar costs."
        actions={newRecipe}
      />
      <div className="mb-4">
        <Checkbox
          label="Show archived recipes"
          checked={archived}
          onChange={(e) => setArchived(e.target.checked)}
        />
      </div>
      {recipes.isPending ? (
        <LoadingBlock label="Loading recipes…" />
      ) : !archived && (recipes.data ?? []).length === 0 ? (
        <EmptyState
          title="No recipes yet"
          message="Write down your first recipe: its oils must add up to 100 %."
          action={newRecipe}
        />
      ) : (
        <RecipesTable
          recipes={recipes.data ?? []}
          currency={settings.data?.currency ?? 'USD'}
          emptyMessage={archived ? 'No archived recipes.' : 'No recipes yet.'}
        />
      )}
    </>
  )
}
