import { describe, expect, it } from 'vitest'
import { DEMO_INGREDIENTS, DEMO_RECIPES } from '../../seeders/demo/catalogue'
import { RecipeInputSchema } from '@shared/schemas/recipes'

const byName = new Map(DEMO_INGREDIENTS.map((i) => [i.name, i]))

describe('demo recipes', () => {
  it.each(DEMO_RECIPES)('$name passes the recipe schema (oils add up to 100 %)', (r) => {
    const ids = new Map(DEMO_INGREDIENTS.map((i, n) => [i.name, n + 1]))
    const parsed = RecipeInputSchema.safeParse({
      ...r,
      waterMode: 'concentration',
      oils: r.oils.map(([name, pct]) => ({ ingredientId: ids.get(name), pct })),
      fragrances: r.fragrances.map(([name, pct]) => ({ ingredientId: ids.get(name), pct })),
      additives: r.additives.map(([name, gPerKg]) => ({ ingredientId: ids.get(name), gPerKg })),
      packaging: r.packaging.map(([name, qtyPerBar]) => ({ ingredientId: ids.get(name), qtyPerBar })),
    })
    expect(parsed.error?.issues ?? []).toEqual([])
  })

  it.each(DEMO_RECIPES.flatMap((r) => r.fragrances.map(([name, pct]) => ({ recipe: r.name, name, pct }))))(
    '$recipe: $name at $pct % is within its maximum usage (the demo supplier certificate)',
    ({ name, pct }) => {
      const f = byName.get(name)
      expect(f?.kind).toBe('fragrance')
      expect(pct).toBeLessThanOrEqual(f!.maxUsagePct!)
    },
  )

  it.each(
    DEMO_RECIPES.flatMap((r) => [
      ...r.oils.map(([name]) => ({ recipe: r.name, name, kinds: ['oil'] })),
      ...r.additives.map(([name]) => ({ recipe: r.name, name, kinds: ['additive', 'colourant'] })),
      ...r.packaging.map(([name]) => ({ recipe: r.name, name, kinds: ['packaging'] })),
    ]),
  )('$recipe: $name is a demo ingredient of the right kind', ({ name, kinds }) => {
    expect(kinds).toContain(byName.get(name)?.kind)
  })
})
