import { Router } from 'express'
import { requireRight } from '@server/middlewares/require-role'
import * as c from '@server/modules/catalogue/catalogue.controller'

export function catalogueRoutes() {
  const r = Router()
  r.get('/', requireRight('catalogue.view'), c.list)
  return r
}
