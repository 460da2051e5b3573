import type { Request, RequestHandler } from 'express'
import type { SessionUser } from '@shared/schemas/auth'
import { rememberCheckedCookie, userOfCheckedCookie } from '@server/modules/auth/session-cache'

/**
 * A shortcut through the session for the few reads that carry most of the load (the buyers'
 * catalogue). The first such request of a cookie goes the whole way: express-session checks the
 * cookie's signature and reads the session, passport loads the user, and `remember` notes the
 * Cookie header. A later request with the same header, while that session and user are still
 * remembered by this process (auth/session-cache.ts), gets its user from there and skips the
 * session and passport middleware, which `unlessKnown` wraps. It has no req.session, so only
 * read-only routes that need nothing but req.user may be listed.
 */
export function knownSession(paths: readonly string[]) {
  const listed = (req: Request) => req.method === 'GET' && paths.includes(req.path)
  const known = new WeakSet<Request>()

  const shortcut: RequestHandler = (req, _res, next) => {
    if (listed(req)) {
      const user = userOfCheckedCookie<SessionUser>(req.headers.cookie)
      if (user) {
        req.user = user
        known.add(req)
      }
    }
    next()
  }
  const remember: RequestHandler = (req, _res, next) => {
    if (req.user && !known.has(req) && listed(req)) rememberCheckedCookie(req.headers.cookie, req.sessionID)
    next()
  }
  const unlessKnown =
    (middleware: RequestHandler): RequestHandler =>
    (req, res, next) =>
      known.has(req) ? next() : middleware(req, res, next)

  return { shortcut, remember, unlessKnown }
}
