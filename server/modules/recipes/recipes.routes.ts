import { Router } from 'express'
import type { RequestHandler } from 'express'
import {
  CostSheetQuerySchema,
  RecipeIdParamsSchema,
  RecipeInputSchema,
  RecipeListQuerySchema,
} from '@shared/schemas/recipes'
import { requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/recipes/recipes.controller'

/**
 * `priceOverride[12]=0.45` read from the raw query string: the extended parser turns small
 * numeric keys into a compacted array (`[ '0.45' ]`), which would lose the ingredient id.
 */
const priceOverrideFromUrl: RequestHandler = (req, _res, next) => {
  const search = new URLSearchParams(req.originalUrl.split('?')[1] ?? '')
  const overrides: Record<string, string> = {}
  let found = false
  for (const [key, value] of search) {
    const m = /^priceOverride\[([^\]]*)\]$/.exec(key)
    if (m) {
      overrides[m[1]!] = value
      found = true
    }
  }
  if (found) {
    // Express 5 serves req.query from a getter; an own property shadows it for what follows.
    Object.defineProperty(req, 'query', {
      value: { ...req.query, priceOverride: overrides },
      writable: true,
      configurable: true,
      enumerable: true,
    })
  }
  next()
}

// Rights are checked per route, not with r.use(): the batch-sheet module serves
// /recipes/:id/batch-sheet under the same prefix and must be reachable past this router.
export function recipesRoutes() {
  const r = Router()
  const manage = requireRight('recipes.manage')
  const byId = validate({ params: RecipeIdParamsSchema })
  r.get('/', manage, validate({ query: RecipeListQuerySchema }), c.list)
  r.post('/', manage, validate({ body: RecipeInputSchema }), c.create)
  r.get('/ingredient-options', manage, c.ingredients)
  r.get('/:id', manage, byId, c.get)
  r.put('/:id', manage, validate({ params: RecipeIdParamsSchema, body: RecipeInputSchema }), c.update)
  r.post('/:id/archive', manage, byId, c.archive)
  r.post('/:id/restore', manage, byId, c.restore)
  r.get(
    '/:id/cost-sheet',
    requireRight('costs.view'),
    priceOverrideFromUrl,
    validate({ params: RecipeIdParamsSchema, query: CostSheetQuerySchema }),
    c.costSheet,
  )
  return r
}
