import { Router } from 'express'
import type { Request, Response } from 'express'
import { requireRight } from '@server/middlewares/require-role'
import { today } from '@server/modules/home/home.service'

/** Mounted at /api/home: the owner's day. */
export function homeRoutes() {
  const r = Router()
  r.get('/today', requireRight('reports.view'), async (_req: Request, res: Response) => {
    res.json({ today: await today() })
  })
  return r
}
