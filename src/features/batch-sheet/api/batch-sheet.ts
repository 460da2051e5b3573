import { keepPreviousData, useQuery } from '@tanstack/react-query'
import type { RecipeBatchSheet } from '@shared/schemas/batch-sheet'
import { api } from '@/lib/api-client'

export type SheetSize = { oilWeightG?: number; bars?: number }

export const batchSheetKeys = {
  all: ['batch-sheet'] as const,
  recipe: (id: number, size: SheetSize) => [...batchSheetKeys.all, 'recipe', id, size] as const,
}

function query(size: SheetSize) {
  const s = new URLSearchParams()
  if (size.bars != null) s.set('bars', String(size.bars))
  else if (size.oilWeightG != null) s.set('oilWeightG', String(size.oilWeightG))
  const q = s.toString()
  return q ? `?${q}` : ''
}

/** The PDF's address, for a plain download link (the browser fetches it with the session cookie). */
export const batchSheetPdfHref = (id: number, size: SheetSize) =>
  `/api/recipes/${id}/batch-sheet.pdf${query(size)}`

export const useRecipeBatchSheet = (id: number, size: SheetSize) =>
  useQuery({
    queryKey: batchSheetKeys.recipe(id, size),
    queryFn: async () =>
      (await api<{ sheet: RecipeBatchSheet }>(`/recipes/${id}/batch-sheet${query(size)}`)).sheet,
    placeholderData: keepPreviousData,
    // Always fresh: the recipe or an ingredient's limits may have changed on another screen.
    staleTime: 0,
    refetchOnMount: 'always',
    meta: { handlesError: true },
  })
