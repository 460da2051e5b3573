import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type {
  CreateIngredientInput,
  IngredientDetail,
  IngredientKind,
  IngredientRow,
  UpdateIngredientInput,
} from '@shared/schemas/ingredients'
import { api, qs } from '@/lib/api-client'

export type IngredientFilter = { kind?: IngredientKind; includeArchived?: boolean }

export const ingredientKeys = {
  all: ['ingredients'] as const,
  lists: () => [...ingredientKeys.all, 'list'] as const,
  list: (filter: IngredientFilter) => [...ingredientKeys.lists(), filter] as const,
  detail: (id: number) => [...ingredientKeys.all, 'detail', id] as const,
}

export const useIngredients = (filter: IngredientFilter = {}) =>
  useQuery({
    queryKey: ingredientKeys.list(filter),
    queryFn: async () =>
      api<{ items: IngredientRow[]; costRule: string }>(
        `/ingredients${qs({ kind: filter.kind, includeArchived: filter.includeArchived || undefined })}`,
      ),
    placeholderData: keepPreviousData,
  })

export const useIngredient = (id: number) =>
  useQuery({
    queryKey: ingredientKeys.detail(id),
    queryFn: () => api<IngredientDetail>(`/ingredients/${id}`),
  })

export function useCreateIngredient() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: CreateIngredientInput) =>
      api<{ ingredient: IngredientRow }>('/ingredients', { method: 'POST', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ingredientKeys.all }),
  })
}

export function useUpdateIngredient() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: ({ id, ...patch }: UpdateIngredientInput & { id: number }) =>
      api<{ ingredient: IngredientRow }>(`/ingredients/${id}`, { method: 'PATCH', body: patch }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ingredientKeys.all }),
  })
}

/** Archive or restore; the error shows in the confirm dialog. */
export function useSetIngredientArchived() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: ({ id, archived }: { id: number; archived: boolean }) =>
      api<{ ingredient: IngredientRow }>(`/ingredients/${id}/${archived ? 'archive' : 'restore'}`, {
        method: 'POST',
      }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ingredientKeys.all }),
  })
}
