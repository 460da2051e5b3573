import { useNavigate, useParams } from 'react-router-dom'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { EmptyState } from '@/components/ui/empty-state'
import { LinkButton } from '@/components/ui/button'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { paths } from '@/config/paths'
import { NotFound } from '@/app/routes/not-found'
import { useIngredientOptions, useRecipe, useSaveRecipe } from '@/features/recipes/api/recipes'
import { RecipeForm } from '@/features/recipes/components/recipe-form'
import { ApiError } from '@/lib/api-client'

/** New recipe (no id in the path) or an existing one being edited. */
export function Component() {
  const param = useParams().recipeId
  const id = param == null ? null : Number(param)
  const navigate = useNavigate()
  const recipe = useRecipe(id ?? 0)
  const options = useIngredientOptions()
  const save = useSaveRecipe(id)

  if (
    id != null &&
    (!Number.isInteger(id) || id <= 0 || (recipe.error instanceof ApiError && recipe.error.status === 404))
  ) {
    return <NotFound />
  }
  const back =
    id == null
      ? { to: paths.owner.recipes, label: 'Recipes' }
      : { to: paths.owner.recipe(id), label: 'Back to the recipe' }
  const title = id == null ? 'New recipe' : `Edit ${recipe.data?.name ?? 'recipe'}`

  let body
  if (options.isPending || (id != null && recipe.isPending)) body = <LoadingBlock label="Loading…" />
  else if (options.isError) body = <FormError message={options.error.message} />
  else if (recipe.data?.archivedAt) {
    body = (
      <EmptyState
        title="This recipe is archived"
        message="Restore it from its page before changing it."
        action={<LinkButton to={paths.owner.recipe(id!)}>Open the recipe</LinkButton>}
      />
    )
  } else if (options.data.filter((o) => o.kind === 'oil').length === 0) {
    body = (
      <EmptyState
        title="No oils to choose from"
        message="Add the oils and butters you use on the Ingredients page first: a recipe is made of them."
      />
    )
  } else {
    body = (
      <RecipeForm
        recipe={id == null ? null : (recipe.data ?? null)}
        options={options.data}
        saving={save.isPending}
        onCancel={() => void navigate(back.to)}
        onSave={async (input) => {
          const { recipe: saved } = await save.mutateAsync(input)
          toast.success(id == null ? `${saved.name} is saved.` : `${saved.name} is updated.`)
          void navigate(paths.owner.recipe(saved.id))
        }}
      />
    )
  }

  return (
    <>
      <PageHeader
        title={title}
        back={back}
        description="Oils as a share of the oil weight (together 100 %), lye and water, fragrance, additives and packaging, and how a mould is cut."
      />
      {body}
    </>
  )
}
