import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type {
  ProductCreateInput,
  ProductRow,
  ProductUpdateInput,
  RecipeOption,
} from '@shared/schemas/products'
import { api } from '@/lib/api-client'

export const productKeys = {
  all: ['products'] as const,
  list: () => [...productKeys.all, 'list'] as const,
  detail: (id: number) => [...productKeys.all, 'detail', id] as const,
  declaration: (id: number) => [...productKeys.all, 'declaration', id] as const,
  recipeOptions: () => [...productKeys.all, 'recipe-options'] as const,
}

export const productsQuery = () =>
  queryOptions({
    queryKey: productKeys.list(),
    queryFn: async () => (await api<{ items: ProductRow[] }>('/products')).items,
    // Costs follow purchases and recipes, edited on other screens: look again on every visit.
    refetchOnMount: 'always',
  })
export const useProducts = () => useQuery(productsQuery())

export const productQuery = (id: number) =>
  queryOptions({
    queryKey: productKeys.detail(id),
    queryFn: async () => (await api<{ product: ProductRow }>(`/products/${id}`)).product,
  })
export const useProduct = (id: number | null) => useQuery({ ...productQuery(id ?? 0), enabled: id !== null })

export const useRecipeOptions = () =>
  useQuery({
    queryKey: productKeys.recipeOptions(),
    queryFn: async () => (await api<{ items: RecipeOption[] }>('/products/recipe-options')).items,
  })

export function useCreateProduct() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: ProductCreateInput) =>
      api<{ product: ProductRow }>('/products', { method: 'POST', body: input }),
    onSuccess: ({ product }) => {
      qc.setQueryData(productKeys.detail(product.id), product)
      return qc.invalidateQueries({ queryKey: productKeys.list() })
    },
  })
}

export function useUpdateProduct(id: number) {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (patch: ProductUpdateInput) =>
      api<{ product: ProductRow }>(`/products/${id}`, { method: 'PATCH', body: patch }),
    onSuccess: ({ product }) => {
      qc.setQueryData(productKeys.detail(id), product)
      return qc.invalidateQueries({ queryKey: productKeys.all })
    },
  })
}
