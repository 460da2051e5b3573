import type { Request, Response } from 'express'
import { ApplicationSchema, HONEYPOT_FIELD } from '@shared/schemas/shops'
import { logger } from '@server/lib/logger'
import { body } from '@server/middlewares/validate'
import { receiptOf, submitApplication } from '@server/modules/applications/applications.service'
import { certificateOf } from '@server/modules/shops/certificate-file'

/** A robot that filled the hidden field is told it worked, and nothing is written. */
export function honeypot(req: Request, res: Response, next: () => void) {
  const trap: unknown = req.body?.[HONEYPOT_FIELD]
  if (typeof trap === 'string' && trap.trim() !== '') {
    logger.info('wholesale application dropped: honeypot filled', { ip: req.ip })
    res.status(201).json({ application: receiptOf(req.body as Record<string, unknown>) })
    return
  }
  next()
}

export async function submit(req: Request, res: Response) {
  const application = await submitApplication(body(req, ApplicationSchema), certificateOf(req))
  res.status(201).json({ application })
}
