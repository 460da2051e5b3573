import { Router } from 'express'
import type { Request, Response } from 'express'
import { UnsentMailParamsSchema } from '@shared/schemas/mail'
import { currentUser, requireRight } from '@server/middlewares/require-role'
import { params, validate } from '@server/middlewares/validate'
import { dismissUnsentMail, listUnsentMail, sendUnsentMail } from '@server/modules/mail/unsent-mail'

/** Mounted at /api/unsent-mail (owner): the e-mails the relay refused, to send again or dismiss. */
export function unsentMailRoutes() {
  const r = Router()
  const manage = requireRight('settings.manage')
  const byId = validate({ params: UnsentMailParamsSchema })
  r.get('/', manage, async (_req: Request, res: Response) => {
    res.json({ items: await listUnsentMail() })
  })
  r.post('/:id/send', manage, byId, async (req: Request, res: Response) => {
    res.json(await sendUnsentMail(params(req, UnsentMailParamsSchema).id, currentUser(req).id))
  })
  r.post('/:id/dismiss', manage, byId, async (req: Request, res: Response) => {
    await dismissUnsentMail(params(req, UnsentMailParamsSchema).id, currentUser(req).id)
    res.status(204).end()
  })
  return r
}
