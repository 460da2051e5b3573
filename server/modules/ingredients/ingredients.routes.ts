import { Router } from 'express'
import {
  CreateIngredientSchema,
  IdParamsSchema,
  IngredientListQuerySchema,
  UpdateIngredientSchema,
} from '@shared/schemas/ingredients'
import { requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/ingredients/ingredients.controller'

export function ingredientsRoutes() {
  const r = Router()
  r.use(requireRight('ingredients.manage'))
  r.get('/', validate({ query: IngredientListQuerySchema }), c.list)
  r.post('/', validate({ body: CreateIngredientSchema }), c.create)
  r.get('/:id', validate({ params: IdParamsSchema }), c.get)
  r.patch('/:id', validate({ params: IdParamsSchema, body: UpdateIngredientSchema }), c.update)
  r.post('/:id/archive', validate({ params: IdParamsSchema }), c.archive)
  r.post('/:id/restore', validate({ params: IdParamsSchema }), c.restore)
  return r
}
