import { Router } from 'express'
import type { createPassport } from '@server/modules/auth/passport'
import { ipKeyGenerator, rateLimit } from 'express-rate-limit'
import {
  ChangePasswordSchema,
  LoginSchema,
  PasswordResetRequestSchema,
  SetPasswordSchema,
} from '@shared/schemas/auth'
import { env } from '@server/config/env'
import { AppError } from '@server/lib/app-error'
import { requireAuth } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/auth/auth.controller'

function limiter(opts: {
  windowMs: number
  limit: number
  key: 'ip' | 'ip+email'
  skipSuccessful?: boolean
  message: string
}) {
  return rateLimit({
    windowMs: opts.windowMs,
    limit: opts.limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    skipSuccessfulRequests: opts.skipSuccessful ?? false,
    keyGenerator: (req) => {
      const ip = ipKeyGenerator(req.ip ?? '0.0.0.0')
      const email =
        typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase().slice(0, 254) : ''
      return opts.key === 'ip' ? ip : `${ip}|${email}`
    },
    handler: (_req, _res, next) => next(new AppError(429, 'too_many_requests', opts.message)),
  })
}

/** Built per app: each app (and each test) gets limiters of its own. */
export function authRoutes(passport: ReturnType<typeof createPassport>) {
  const r = Router()
  const loginLimiter = limiter({
    windowMs: 15 * 60 * 1000,
    limit: env.LOGIN_MAX_FAILURES,
    key: 'ip+email',
    skipSuccessful: true,
    message: 'Too many failed sign-in attempts. Wait 15 minutes or reset your password.',
  })
  const resetLimiter = limiter({
    windowMs: 60 * 60 * 1000,
    limit: 5,
    key: 'ip+email',
    message: 'Too many reset requests for this address. Try again in an hour.',
  })
  r.get('/csrf', c.getCsrf)
  r.get('/me', c.me)
  r.post('/login', loginLimiter, validate({ body: LoginSchema }), c.login(passport))
  r.post('/logout', c.logout)
  r.post('/password-reset', resetLimiter, validate({ body: PasswordResetRequestSchema }), c.requestReset)
  r.get('/tokens/:token', c.describeToken)
  r.post('/set-password', validate({ body: SetPasswordSchema }), c.setPassword)
  r.put('/password', requireAuth, validate({ body: ChangePasswordSchema }), c.changePassword)
  return r
}
