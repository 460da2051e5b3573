import { Router } from 'express'
import type { Request, Response } from 'express'
import { CreatePlannedPourSchema, PlannedPourIdParamsSchema, PlanQuerySchema } from '@shared/schemas/planning'
import { AppError } from '@server/lib/app-error'
import { currentUser, requireRight } from '@server/middlewares/require-role'
import { body, params, query, validate } from '@server/middlewares/validate'
import {
  buildPourPlan,
  createPlannedPour,
  dropPlannedPour,
  getPlannedPour,
} from '@server/modules/planning/planning.service'

/** Mounted at /api/planning (owner only). */
export function planningRoutes() {
  const r = Router()
  r.use(requireRight('planning.manage'))
  r.get('/plan', validate({ query: PlanQuerySchema }), async (req: Request, res: Response) => {
    res.json({ plan: await buildPourPlan(query(req, PlanQuerySchema)) })
  })
  r.post('/pours', validate({ body: CreatePlannedPourSchema }), async (req: Request, res: Response) => {
    const plannedPour = await createPlannedPour(body(req, CreatePlannedPourSchema), currentUser(req).id)
    res.status(201).json({ plannedPour })
  })
  r.get(
    '/pours/:id',
    validate({ params: PlannedPourIdParamsSchema }),
    async (req: Request, res: Response) => {
      const plannedPour = await getPlannedPour(params(req, PlannedPourIdParamsSchema).id)
      if (!plannedPour) throw AppError.notFound('That planned pour')
      res.json({ plannedPour })
    },
  )
  r.delete(
    '/pours/:id',
    validate({ params: PlannedPourIdParamsSchema }),
    async (req: Request, res: Response) => {
      const plannedPour = await dropPlannedPour(
        params(req, PlannedPourIdParamsSchema).id,
        currentUser(req).id,
      )
      res.json({ plannedPour })
    },
  )
  return r
}
