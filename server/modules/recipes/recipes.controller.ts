import type { Request, Response } from 'express'
import { can } from '@shared/permissions'
import {
  CostSheetQuerySchema,
  RecipeIdParamsSchema,
  RecipeInputSchema,
  RecipeListQuerySchema,
} from '@shared/schemas/recipes'
import { currentUser } from '@server/middlewares/require-role'
import { body, params, query } from '@server/middlewares/validate'
import { costSheetForRecipe } from '@server/modules/recipes/recipe-cost.service'
import { ingredientOptions } from '@server/modules/recipes/recipe.queries'
import * as recipes from '@server/modules/recipes/recipes.service'

export async function list(req: Request, res: Response) {
  const { archived } = query(req, RecipeListQuerySchema)
  const withCosts = can(currentUser(req).role, 'costs.view')
  res.json({ items: await recipes.listRecipes({ archived, withCosts }) })
}

export async function ingredients(_req: Request, res: Response) {
  res.json({ items: await ingredientOptions() })
}

export async function get(req: Request, res: Response) {
  res.json({ recipe: await recipes.getRecipe(params(req, RecipeIdParamsSchema).id) })
}

export async function create(req: Request, res: Response) {
  const recipe = await recipes.createRecipe(body(req, RecipeInputSchema), currentUser(req).id)
  res.status(201).json({ recipe })
}

export async function update(req: Request, res: Response) {
  const { id } = params(req, RecipeIdParamsSchema)
  res.json({ recipe: await recipes.updateRecipe(id, body(req, RecipeInputSchema), currentUser(req).id) })
}

export async function archive(req: Request, res: Response) {
  const { id } = params(req, RecipeIdParamsSchema)
  res.json({ recipe: await recipes.setArchived(id, true, currentUser(req).id) })
}

export async function restore(req: Request, res: Response) {
  const { id } = params(req, RecipeIdParamsSchema)
  res.json({ recipe: await recipes.setArchived(id, false, currentUser(req).id) })
}

export async function costSheet(req: Request, res: Response) {
  const { id } = params(req, RecipeIdParamsSchema)
  const { oilWeightG, priceOverride } = query(req, CostSheetQuerySchema)
  res.json({ costSheet: await costSheetForRecipe(id, { oilWeightG, priceOverride }) })
}
