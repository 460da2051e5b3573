import type { Transaction } from 'sequelize'
import { roundHalfUp } from '@shared/domain/money/money'
import { costPerBarForRecipes } from '@server/modules/recipes/recipe-cost.service'

export type ProductCost = { costPerBarCents: number | null; missingCosts: string[] }

export type CostedProduct = { id: number; recipeId: number; cutWeightG: number; recipeBarWeightG: number }

/**
 * Cost per bar of each product at current lot prices. The recipe's cost is for a bar of the
 * recipe's bar weight; a product cut to another weight from the same loaf (a guest bar, a kitchen
 * block) carries that cost in proportion to its cut weight, the physical-units way of sharing a
 * joint cost (common practice). Packaging and labour are shared the same way, an approximation the
 * batch's own frozen cost replaces once bars are poured.
 */
export async function productCosts(
  products: readonly CostedProduct[],
  transaction?: Transaction,
): Promise<Map<number, ProductCost>> {
  const byRecipe = await costPerBarForRecipes([...new Set(products.map((p) => p.recipeId))], transaction)
  const out = new Map<number, ProductCost>()
  for (const p of products) {
    const c = byRecipe.get(p.recipeId)
    if (!c || !(p.recipeBarWeightG > 0)) {
      out.set(p.id, { costPerBarCents: null, missingCosts: [] })
      continue
    }
    const cents =
      p.cutWeightG === p.recipeBarWeightG
        ? c.costPerBarCents
        : roundHalfUp((c.costPerBarCents * p.cutWeightG) / p.recipeBarWeightG)
    out.set(p.id, { costPerBarCents: cents, missingCosts: c.missingCosts })
  }
  return out
}
