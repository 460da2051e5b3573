import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { Recipe, RecipeIngredientOption, RecipeInput, RecipeListItem } from '@shared/schemas/recipes'
import { api } from '@/lib/api-client'

export const recipeKeys = {
  all: ['recipes'] as const,
  lists: () => [...recipeKeys.all, 'list'] as const,
  list: (archived: boolean) => [...recipeKeys.lists(), { archived }] as const,
  detail: (id: number) => [...recipeKeys.all, 'detail', id] as const,
  costSheet: (id: number, q: object) => [...recipeKeys.all, 'cost-sheet', id, q] as const,
  ingredientOptions: () => [...recipeKeys.all, 'ingredient-options'] as const,
}

export const useRecipes = (archived = false) =>
  useQuery({
    queryKey: recipeKeys.list(archived),
    queryFn: async () =>
      (await api<{ items: RecipeListItem[] }>(`/recipes${archived ? '?archived=true' : ''}`)).items,
  })

export const useRecipe = (id: number) =>
  useQuery({
    queryKey: recipeKeys.detail(id),
    queryFn: async () => (await api<{ recipe: Recipe }>(`/recipes/${id}`)).recipe,
    enabled: Number.isInteger(id) && id > 0,
  })

export const useIngredientOptions = () =>
  useQuery({
    queryKey: recipeKeys.ingredientOptions(),
    queryFn: async () =>
      (await api<{ items: RecipeIngredientOption[] }>('/recipes/ingredient-options')).items,
  })

export function useSaveRecipe(id: number | null) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: RecipeInput) =>
      id == null
        ? api<{ recipe: Recipe }>('/recipes', { method: 'POST', body: input })
        : api<{ recipe: Recipe }>(`/recipes/${id}`, { method: 'PUT', body: input }),
    onSuccess: ({ recipe }) => {
      qc.setQueryData(recipeKeys.detail(recipe.id), recipe)
      // Lists and cost sheets change with it.
      return qc.invalidateQueries({ queryKey: recipeKeys.all })
    },
  })
}

export function useSetRecipeArchived(id: number) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (archived: boolean) =>
      api<{ recipe: Recipe }>(`/recipes/${id}/${archived ? 'archive' : 'restore'}`, { method: 'POST' }),
    onSuccess: ({ recipe }) => {
      qc.setQueryData(recipeKeys.detail(recipe.id), recipe)
      return qc.invalidateQueries({ queryKey: recipeKeys.lists() })
    },
  })
}
