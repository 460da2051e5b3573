import { Router } from 'express'
import { BatchSheetRequestSchema, RecipeSheetQuerySchema } from '@shared/schemas/batch-sheet'
import { RecipeIdParamsSchema } from '@shared/schemas/recipes'
import { requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/batch-sheet/batch-sheet.controller'

/** Mounted at /api: the contract's POST /batch-sheet and a recipe's sheet as JSON and PDF. */
export function batchSheetRoutes() {
  const r = Router()
  const manage = requireRight('recipes.manage')
  const recipeSheet = validate({ params: RecipeIdParamsSchema, query: RecipeSheetQuerySchema })
  r.post('/batch-sheet', manage, validate({ body: BatchSheetRequestSchema }), c.forOils)
  r.get('/recipes/:id/batch-sheet', manage, recipeSheet, c.forRecipe)
  r.get('/recipes/:id/batch-sheet.pdf', manage, recipeSheet, c.forRecipePdf)
  return r
}
