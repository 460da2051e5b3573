import type { NextFunction, Request, Response } from 'express'
import type { createPassport } from '@server/modules/auth/passport'
import {
  ChangePasswordSchema,
  LoginSchema,
  PasswordResetRequestSchema,
  SetPasswordSchema,
} from '@shared/schemas/auth'
import type { SessionUser } from '@shared/schemas/auth'
import { AppError } from '@server/lib/app-error'
import { csrfToken } from '@server/middlewares/csrf'
import { currentUser } from '@server/middlewares/require-role'
import { body } from '@server/middlewares/validate'
import * as auth from '@server/modules/auth/auth.service'

export function getCsrf(req: Request, res: Response) {
  res.json({ csrfToken: csrfToken(req) })
}

export function me(req: Request, res: Response) {
  if (!req.user) throw AppError.unauthorized()
  res.json({ user: req.user })
}

export function login(passport: ReturnType<typeof createPassport>) {
  return (req: Request, res: Response, next: NextFunction) => {
    req.body = body(req, LoginSchema) // passport-local reads the normalised e-mail from req.body
    passport.authenticate('local', (err: unknown, user: SessionUser | false) => {
      if (err) return next(err)
      if (!user)
        return next(
          new AppError(
            401,
            'invalid_credentials',
            'That e-mail and password do not match an active account.',
          ),
        )
      // Passport gives the session a new id at sign-in (no fixation); keepSessionInfo carries the
      // CSRF token over, so the page's token stays valid.
      req.login(user, { session: true, keepSessionInfo: true }, (e) => {
        if (e) return next(e)
        res.json({ user, csrfToken: csrfToken(req) })
      })
    })(req, res, next)
  }
}

export function logout(req: Request, res: Response, next: NextFunction) {
  req.logout((e1) => {
    if (e1) return next(e1)
    req.session.destroy((e2) => {
      if (e2) return next(e2)
      res.clearCookie('lc.sid', { path: '/' })
      res.status(204).end()
    })
  })
}

export async function requestReset(req: Request, res: Response) {
  const { email } = body(req, PasswordResetRequestSchema)
  await auth.requestPasswordReset(email)
  res.status(204).end()
}

export async function describeToken(req: Request, res: Response) {
  const token = String(req.params.token ?? '')
  res.json(await auth.describeToken(token))
}

export async function setPassword(req: Request, res: Response) {
  const { token, password } = body(req, SetPasswordSchema)
  await auth.setPasswordWithToken(token, password)
  res.status(204).end()
}

export async function changePassword(req: Request, res: Response) {
  const { currentPassword, newPassword } = body(req, ChangePasswordSchema)
  await auth.changePassword(currentUser(req).id, currentPassword, newPassword, req.sessionID)
  res.status(204).end()
}
