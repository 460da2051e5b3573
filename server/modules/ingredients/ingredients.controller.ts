import type { Request, Response } from 'express'
import {
  COST_RULE,
  CreateIngredientSchema,
  IdParamsSchema,
  IngredientListQuerySchema,
  UpdateIngredientSchema,
} from '@shared/schemas/ingredients'
import { currentUser } from '@server/middlewares/require-role'
import { body, params, query } from '@server/middlewares/validate'
import * as ingredients from '@server/modules/ingredients/ingredients.service'

export async function list(req: Request, res: Response) {
  res.json({
    items: await ingredients.listIngredients(query(req, IngredientListQuerySchema)),
    costRule: COST_RULE,
  })
}

export async function create(req: Request, res: Response) {
  const ingredient = await ingredients.createIngredient(
    body(req, CreateIngredientSchema),
    currentUser(req).id,
  )
  res.status(201).json({ ingredient })
}

export async function get(req: Request, res: Response) {
  res.json(await ingredients.getIngredient(params(req, IdParamsSchema).id))
}

export async function update(req: Request, res: Response) {
  const { id } = params(req, IdParamsSchema)
  res.json({
    ingredient: await ingredients.updateIngredient(
      id,
      body(req, UpdateIngredientSchema),
      currentUser(req).id,
    ),
  })
}

export async function archive(req: Request, res: Response) {
  res.json({
    ingredient: await ingredients.archiveIngredient(params(req, IdParamsSchema).id, currentUser(req).id),
  })
}

export async function restore(req: Request, res: Response) {
  res.json({
    ingredient: await ingredients.restoreIngredient(params(req, IdParamsSchema).id, currentUser(req).id),
  })
}
