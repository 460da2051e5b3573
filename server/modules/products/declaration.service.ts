import { computeRecipeBatchSheet } from '@shared/domain/batch-sheet/batch-sheet'
import { buildDeclaration, saponifiedInci } from '@shared/domain/declaration/declaration'
import type { DeclarationItem } from '@shared/domain/declaration/declaration'
import { DomainError } from '@shared/domain/errors'
import { gramsTo } from '@shared/domain/units/units'
import type { ProductDeclaration } from '@shared/schemas/products'
import type { Recipe } from '@shared/schemas/recipes'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { Product } from '@server/modules/products/product.model'
import { recipeSnapshot } from '@server/modules/recipes/recipe-cost.service'
import { toBatchRecipe } from '@server/modules/recipes/recipe.queries'

export const WATER_INCI = 'Aqua'
export const LYE_INCI = 'Sodium Hydroxide'

/**
 * The draft ingredient list of a recipe, from its batch sheet for one mould, heaviest first.
 *
 * What is listed, and why:
 * - Weights are those at the time of addition, and the list runs in descending order of them
 *   (21 CFR 701.3(a): "descending order of predominance"; EU 1223/2009 Art. 19(1)(g): "in
 *   descending order of weight at the time they are added"). Entries at or under 1 % come after
 *   the rest (buildDeclaration).
 * - A saponified oil is declared by its saponified INCI name (Sodium Olivate for olive oil, from
 *   saponifiedInci) at the weight of the oil added. The sodium hydroxide that reacts with it is
 *   part of that soap: the saponified name already declares the oil and the alkali together, so
 *   NaOH is not listed again. Where no saponified name is known, the oil keeps its own INCI and
 *   the share of the NaOH that reacts with it (in proportion to grams × SAP value) is declared as
 *   Sodium Hydroxide, since that oil's name alone does not say it was saponified; a note asks the
 *   studio to confirm the name with its supplier.
 * - Water is declared as Aqua at the weight added, although much of it leaves during the cure:
 *   the rule is the weight at the time of addition.
 * - Every fragrance, essential oils included, is one "Fragrance" entry (21 CFR 701.3(a) lets
 *   fragrance be declared as such; the EU word, Parfum, is the declaration module's other label).
 * - Packaging is not an ingredient and is left out.
 * The draft is an aid: the studio confirms the text; 21 CFR 701.20 (a true soap is not a
 * cosmetic), local labelling rules and licensed advice decide what the label must say.
 */
export function draftFromRecipe(recipe: Recipe): { items: DeclarationItem[]; notes: string[] } {
  const sheet = computeRecipeBatchSheet(toBatchRecipe(recipe), recipe.mouldOilWeightG)
  const oils = new Map(recipe.oils.map((o) => [o.ingredientId, o]))
  const additives = new Map(recipe.additives.map((a) => [a.ingredientId, a]))
  const fragrances = new Map(recipe.fragrances.map((f) => [f.ingredientId, f]))
  const items: DeclarationItem[] = []
  const notes: string[] = []
  let sapWeightAll = 0
  let sapWeightUnnamed = 0

  for (const line of sheet.lines) {
    if (line.role === 'oil') {
      const oil = oils.get(line.ingredientId!)!
      const sapWeight = line.grams * oil.sapNaoh
      sapWeightAll += sapWeight
      const saponified = (oil.inci ? saponifiedInci(oil.inci) : null) ?? saponifiedInci(oil.name)
      if (saponified) {
        items.push({ label: saponified, grams: line.grams, kind: 'saponified' })
      } else {
        sapWeightUnnamed += sapWeight
        items.push({ label: oil.inci ?? oil.name, grams: line.grams, kind: 'ingredient' })
        notes.push(
          `${oil.name}: no saponified INCI name is known, so it is listed as ${oil.inci ?? oil.name} with ` +
            `${LYE_INCI}. Check the saponified name with the supplier's INCI list (CosIng).`,
        )
      }
    } else if (line.role === 'water') {
      items.push({ label: WATER_INCI, grams: line.grams, kind: 'ingredient' })
    } else if (line.role === 'fragrance') {
      const f = fragrances.get(line.ingredientId!)
      items.push({ label: f?.inci ?? f?.name ?? line.name, grams: line.grams, kind: 'fragrance' })
    } else if (line.role === 'additive') {
      const a = additives.get(line.ingredientId!)
      if (a && !a.inci) notes.push(`${a.name} has no INCI name on file, so it is listed by its own name.`)
      items.push({ label: a?.inci ?? a?.name ?? line.name, grams: line.grams, kind: 'ingredient' })
    }
  }
  if (sapWeightUnnamed > 0 && sapWeightAll > 0) {
    items.push({
      label: LYE_INCI,
      grams: (sheet.naohG * sapWeightUnnamed) / sapWeightAll,
      kind: 'ingredient',
    })
  }
  if (recipe.fragrances.length > 0) {
    notes.push(
      'Fragrance is one entry. For the EU the word is Parfum, and listed allergens over 0.01 % in a ' +
        'rinse-off product must be named (1223/2009); take them from the fragrance supplier’s documents.',
    )
  }
  return { items, notes }
}

export async function getDeclaration(productId: number): Promise<ProductDeclaration> {
  const product = await Product.findByPk(productId)
  if (!product) throw AppError.notFound('That product')
  const recipe = await recipeSnapshot(product.recipeId)
  if (!recipe) throw AppError.notFound('That product’s recipe')
  let draft: { text: string; entries: ProductDeclaration['draft']['entries'] }
  let notes: string[]
  try {
    const built = draftFromRecipe(recipe)
    const declaration = buildDeclaration(built.items)
    draft = { text: declaration.text, entries: declaration.entries }
    notes = built.notes
  } catch (err) {
    // A recipe that cannot make a batch sheet (oils not adding up to 100 %) has no list to draft.
    if (err instanceof DomainError) {
      throw AppError.unprocessable(
        'declaration_unavailable',
        `The recipe “${recipe.name}” cannot be turned into an ingredient list: ${err.message}`,
      )
    }
    throw err
  }
  return {
    productId,
    recipeName: recipe.name,
    oilWeightG: recipe.mouldOilWeightG,
    netWeightG: product.netWeightG,
    netWeightOz: gramsTo(product.netWeightG, 'oz'),
    draft,
    notes,
    confirmed:
      product.declaration && product.declarationConfirmedAt
        ? { text: product.declaration, confirmedAt: product.declarationConfirmedAt.toISOString() }
        : null,
  }
}

/** The studio's own final wording, as it goes on the label, with the moment it was confirmed. */
export async function confirmDeclaration(productId: number, text: string, byUserId: number) {
  await sequelize.transaction(async (t) => {
    const product = await Product.findByPk(productId, { transaction: t, lock: t.LOCK.UPDATE })
    if (!product) throw AppError.notFound('That product')
    await product.update({ declaration: text, declarationConfirmedAt: new Date() }, { transaction: t })
    await audit(
      {
        userId: byUserId,
        action: 'product.declaration',
        entity: 'product',
        entityId: productId,
        data: { text },
      },
      t,
    )
  })
  return getDeclaration(productId)
}
