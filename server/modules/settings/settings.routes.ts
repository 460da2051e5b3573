import { Router } from 'express'
import type { Request, Response } from 'express'
import { StudioProfileSchema } from '@shared/schemas/settings-form'
import { currentUser, requireRight } from '@server/middlewares/require-role'
import { body, validate } from '@server/middlewares/validate'
import { audit } from '@server/modules/audit/audit.service'
import { getSettings, updateSettings } from '@server/modules/settings/settings.service'

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
  return r
}
