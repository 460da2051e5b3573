import { randomBytes, timingSafeEqual } from 'node:crypto'
import type { Request, RequestHandler } from 'express'
import { AppError } from '@server/lib/app-error'

declare module 'express-session' {
  interface SessionData {
    csrfToken?: string
  }
}

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS'])

/** The session's token, made on first use. */
export function csrfToken(req: Request): string {
  if (!req.session.csrfToken) req.session.csrfToken = randomBytes(24).toString('base64url')
  return req.session.csrfToken
}

function same(a: string, b: string) {
  const x = Buffer.from(a)
  const y = Buffer.from(b)
  return x.length === y.length && timingSafeEqual(x, y)
}

/**
 * Synchroniser token: every POST/PUT/PATCH/DELETE under /api carries the session's token in
 * X-CSRF-Token. Paths in `exempt` (signed webhooks) authenticate themselves instead.
 */
export function csrfProtection(exempt: string[] = []): RequestHandler {
  return (req, _res, next) => {
    if (SAFE.has(req.method) || exempt.some((p) => req.path.startsWith(p))) return next()
    const sent = req.get('x-csrf-token')
    const expected = req.session?.csrfToken
    if (!sent || !expected || !same(sent, expected)) {
      return next(
        new AppError(
          403,
          'csrf',
          'The form has expired or did not come from this site. Reload the page and try again.',
        ),
      )
    }
    next()
  }
}
