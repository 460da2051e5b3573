import { Router } from 'express'
import { ipKeyGenerator, rateLimit } from 'express-rate-limit'
import { ApplicationSchema } from '@shared/schemas/shops'
import { AppError } from '@server/lib/app-error'
import * as c from '@server/modules/applications/applications.controller'
import { receiveCertificate, validateWithCertificate } from '@server/modules/shops/certificate-file'

export type ApplicationLimits = {
  /** Applications accepted per IP address per hour (5 unless told otherwise). */
  perHour?: number
  /** Attempts of any outcome per IP address per hour, so a robot cannot keep sending 5 MB files. */
  attemptsPerHour?: number
}

const HOUR = 60 * 60 * 1000

function limiter(limit: number, skipFailedRequests: boolean) {
  return rateLimit({
    windowMs: HOUR,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    skipFailedRequests,
    keyGenerator: (req) => ipKeyGenerator(req.ip ?? '0.0.0.0'),
    handler: (_req, _res, next) =>
      next(
        new AppError(
          429,
          'too_many_requests',
          'Too many applications from your address. Try again in an hour, or write to the studio.',
        ),
      ),
  })
}

/** The public wholesale application; built per app, so each app (and each test) has limiters of its own. */
export function applicationsRoutes(limits: ApplicationLimits = {}) {
  const r = Router()
  r.post(
    '/',
    limiter(limits.attemptsPerHour ?? 30, false),
    limiter(limits.perHour ?? 5, true),
    receiveCertificate,
    c.honeypot,
    validateWithCertificate(ApplicationSchema, { required: true }),
    c.submit,
  )
  return r
}
