import { Router } from 'express'
import type { Request, Response } from 'express'
import { PlanningSettingsSchema } from '@shared/schemas/planning'
import { StudioProfileSchema } from '@shared/schemas/settings-form'
import { currentUser, requireAuth, requireRight } from '@server/middlewares/require-role'
import { body, validate } from '@server/middlewares/validate'
import { audit } from '@server/modules/audit/audit.service'
import { getSettings, updateSettings } from '@server/modules/settings/settings.service'

/** The studio's public profile and currency: every signed-in person sees whom they deal with, in what money. */
export function studioRoutes() {
  const r = Router()
  r.get('/', requireAuth, async (_req: Request, res: Response) => {
    const { studio, currency } = await getSettings()
    res.json({ studio, currency })
  })
  return r
}

export function settingsRoutes() {
  const r = Router()
  r.use(requireRight('settings.manage'))
  r.get('/', async (_req: Request, res: Response) => {
    res.json({ settings: await getSettings() })
  })
  r.put('/studio', validate({ body: StudioProfileSchema }), async (req: Request, res: Response) => {
    const studio = body(req, StudioProfileSchema)
    const settings = await updateSettings({ studio: { ...studio, address: studio.address.filter(Boolean) } })
    await audit({ userId: currentUser(req).id, action: 'settings.studio', entity: 'settings' })
    res.json({ settings })
  })
  r.put('/planning', validate({ body: PlanningSettingsSchema }), async (req: Request, res: Response) => {
    const input = body(req, PlanningSettingsSchema)
    const settings = await updateSettings(input)
    await audit({ userId: currentUser(req).id, action: 'settings.planning', entity: 'settings', data: input })
    res.json({ settings })
  })
  return r
}
