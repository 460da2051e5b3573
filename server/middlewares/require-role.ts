import type { Request, RequestHandler } from 'express'
import { can } from '@shared/permissions'
import type { Right } from '@shared/permissions'
import type { SessionUser } from '@shared/schemas/auth'
import { AppError } from '@server/lib/app-error'

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
  }
}

/** 401 when signed out. */
export const requireAuth: RequestHandler = (req, _res, next) => {
  if (!req.user) return next(AppError.unauthorized())
  next()
}

/** 401 when signed out, 403 when the role lacks the right (rights in shared/permissions.ts). */
export function requireRight(right: Right): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) return next(AppError.unauthorized())
    if (!can(req.user.role, right)) return next(AppError.forbidden())
    next()
  }
}

/** The signed-in user; only after requireAuth/requireRight. */
export function currentUser(req: Request): SessionUser {
  if (!req.user) throw AppError.unauthorized()
  return req.user
}

/** A buyer's own shop id; another shop's records answer 404, never 403 (they must not learn it exists). */
export function buyerShopId(req: Request): number {
  const u = currentUser(req)
  if (u.role !== 'buyer' || u.shopId == null) throw AppError.forbidden()
  return u.shopId
}
