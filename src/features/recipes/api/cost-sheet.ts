import { keepPreviousData, useQuery } from '@tanstack/react-query'
import type { CostSheet } from '@shared/schemas/recipes'
import { recipeKeys } from '@/features/recipes/api/recipes'
import { api } from '@/lib/api-client'

export type CostSheetParams = {
  oilWeightG?: number
  /** What-if: one ingredient's price in cents per gram (or per item). */
  override?: { ingredientId: number; centsPerUnit: number }
}

export function costSheetPath(id: number, p: CostSheetParams) {
  const s = new URLSearchParams()
  if (p.oilWeightG != null) s.set('oilWeightG', String(p.oilWeightG))
  if (p.override) s.set(`priceOverride[${p.override.ingredientId}]`, String(p.override.centsPerUnit))
  const q = s.toString()
  return `/recipes/${id}/cost-sheet${q ? `?${q}` : ''}`
}

export const useCostSheet = (id: number, params: CostSheetParams) =>
  useQuery({
    queryKey: recipeKeys.costSheet(id, params),
    queryFn: async () => (await api<{ costSheet: CostSheet }>(costSheetPath(id, params))).costSheet,
    placeholderData: keepPreviousData,
    // Errors (a what-if the server refuses) show beside the form, not as a toast.
    meta: { handlesError: true },
    retry: false,
  })
