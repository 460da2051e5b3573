import { computeRecipeBatchSheet } from '@shared/domain/batch-sheet/batch-sheet'
import type { BatchSheet } from '@shared/domain/batch-sheet/batch-sheet'
import type { Recipe } from '@shared/schemas/recipes'
import type { SuggestionLine } from '@shared/schemas/batches'
import { toBatchRecipe } from '@server/modules/recipes/recipe.queries'

// What one pour takes from the shelves: the batch sheet of the recipe (as frozen on the batch)
// for the chosen oil weight, plus packaging for every sellable bar. Weights are kept to 0.01 g
// (finer than any studio scale reads) so the ledger of lots never carries float dust.

export type Need = Pick<SuggestionLine, 'ingredientId' | 'name' | 'kind' | 'role' | 'unit' | 'needed'>

export type BatchNeeds = {
  sheet: BatchSheet
  needs: Need[]
  /** Lye or water the recipe names no ingredient for: weighed, but drawn from no lot. */
  untracked: { name: string; role: string; grams: number }[]
}

export const roundGrams = (g: number) => Math.round(g * 100) / 100
/** Lot quantities are numeric(14,4): anything finer is noise from float arithmetic. */
export const roundQty = (q: number) => Math.round(q * 10_000) / 10_000

export function batchNeeds(recipe: Recipe, oilWeightG: number, sellableBars: number): BatchNeeds {
  const sheet = computeRecipeBatchSheet(toBatchRecipe(recipe), oilWeightG)
  const byId = new Map<number, Need>()
  const untracked: BatchNeeds['untracked'] = []
  const kindOf = new Map<number, string>(
    [...recipe.oils, ...recipe.fragrances, ...recipe.additives].map((i) => [i.ingredientId, i.kind]),
  )
  const add = (need: Need) => {
    const seen = byId.get(need.ingredientId)
    if (seen) seen.needed += need.needed
    else byId.set(need.ingredientId, { ...need })
  }
  for (const line of sheet.lines) {
    let ingredient: { ingredientId: number; name: string; kind: string } | null
    if (line.role === 'lye') ingredient = recipe.lye
    else if (line.role === 'water') ingredient = recipe.water
    else
      ingredient = {
        ingredientId: line.ingredientId!,
        name: line.name,
        kind: kindOf.get(line.ingredientId!) ?? line.role,
      }
    if (!ingredient) {
      untracked.push({ name: line.name, role: line.role, grams: roundGrams(line.grams) })
      continue
    }
    add({
      ingredientId: ingredient.ingredientId,
      name: ingredient.name,
      kind: ingredient.kind,
      role: line.role,
      unit: 'g',
      needed: line.grams,
    })
  }
  for (const p of recipe.packaging) {
    add({
      ingredientId: p.ingredientId,
      name: p.name,
      kind: p.kind,
      role: 'packaging',
      unit: 'each',
      // A box is a whole box: a fraction per bar (one sleeve for two bars) still rounds up.
      needed: Math.ceil(p.qtyPerBar * sellableBars - 1e-9),
    })
  }
  const needs = [...byId.values()]
    .map((n) => ({ ...n, needed: n.unit === 'each' ? n.needed : roundGrams(n.needed) }))
    .filter((n) => n.needed > 0)
  return { sheet, needs, untracked }
}
