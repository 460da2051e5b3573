import type { SessionData, Store } from 'express-session'

// Every signed-in request reads its session (connect-pg-simple: one query) and its user (one more,
// auth.service.ts loadSessionUser). Under a busy catalogue those two round trips cost more than
// the answer itself, so both are kept in memory by this process, written through to PostgreSQL:
// - a session is remembered when it is read or saved, forgotten when it is destroyed, and
//   whenever the sessions of its user are deleted (sign-out everywhere, deactivation, a new
//   password), at once and again when that transaction commits;
// - a read that raced with a forget is not kept (the generation it started from is gone);
// - nothing is trusted for more than MAX_AGE_MS: a change made outside this process (a second
//   process, a hand-made SQL delete) shows within that time. The product runs as one process.
// This module imports nothing of the app, so any module may call it without an import cycle.

const MAX_AGE_MS = 60_000
const MAX_ENTRIES = 20_000

type Entry<T> = { value: T; until: number; userId: number | null }

class Remembered<K, T> {
  private readonly entries = new Map<K, Entry<T>>()
  generation = 0

  get(key: K): T | undefined {
    return this.entry(key)?.value
  }

  entry(key: K): Entry<T> | undefined {
    const e = this.entries.get(key)
    if (!e) return undefined
    if (e.until <= Date.now()) {
      this.entries.delete(key)
      return undefined
    }
    return e
  }

  /** Keeps `value` unless a forget happened since `generation` was read. */
  set(key: K, value: T, userId: number | null, generation: number, until = Date.now() + MAX_AGE_MS) {
    if (generation !== this.generation) return
    if (this.entries.size >= MAX_ENTRIES) this.entries.delete(this.entries.keys().next().value as K)
    this.entries.set(key, { value, userId, until: Math.min(until, Date.now() + MAX_AGE_MS) })
  }

  forget(match: (key: K, e: Entry<T>) => boolean) {
    this.generation++
    for (const [k, e] of this.entries) if (match(k, e)) this.entries.delete(k)
  }

  clear() {
    this.generation++
    this.entries.clear()
  }
}

// Sessions are kept as their JSON: express-session changes the object it is handed.
const sessions = new Remembered<string, string>()

function userOf(sess: SessionData): number | null {
  const id = Number((sess as { passport?: { user?: unknown } }).passport?.user)
  return Number.isInteger(id) ? id : null
}

function expiryOf(sess: SessionData): number | null {
  const expires = sess.cookie?.expires
  return expires ? new Date(expires).getTime() : null
}

/** The same store, with reads answered from memory while the session is known here. */
export function rememberingStore<S extends Store>(store: S): S {
  const get = store.get.bind(store)
  const set = store.set.bind(store)
  const destroy = store.destroy.bind(store)
  store.get = (sid, cb) => {
    const json = sessions.get(sid)
    if (json !== undefined) return cb(null, JSON.parse(json) as SessionData)
    const generation = sessions.generation
    get(sid, (err, sess) => {
      const until = sess ? expiryOf(sess) : null
      if (!err && sess && until) sessions.set(sid, JSON.stringify(sess), userOf(sess), generation, until)
      cb(err, sess)
    })
  }
  store.set = (sid, sess, cb) => {
    sessions.forget((k) => k === sid)
    const generation = sessions.generation
    set(sid, sess, (err?: unknown) => {
      const until = expiryOf(sess)
      if (!err && until) sessions.set(sid, JSON.stringify(sess), userOf(sess), generation, until)
      cb?.(err)
    })
  }
  store.destroy = (sid, cb) => {
    sessions.forget((k) => k === sid)
    destroy(sid, cb)
  }
  return store
}

/** Forgets the sessions of a user (their rows are being deleted), now and when `afterCommit` runs. */
export function forgetSessionsOf(userId: number, transaction?: { afterCommit(fn: () => void): void }) {
  const drop = () => {
    sessions.forget((_k, e) => e.userId === userId)
    users.forget((k) => k === userId)
  }
  drop()
  transaction?.afterCommit(drop)
}

// The signed-in user's row as a request needs it (auth.service.ts loadSessionUser).
const users = new Remembered<number, unknown>()

/** The user `load()` gives, remembered until the user changes (forgetUser) or MAX_AGE_MS. */
export async function rememberedUser<T>(id: number, load: () => Promise<T | null>): Promise<T | null> {
  const hit = users.get(id)
  if (hit !== undefined) return hit as T
  const generation = users.generation
  const user = await load()
  if (user) users.set(id, user, id, generation)
  return user
}

/** Forgets a user's remembered row (it is changing), now and when `afterCommit` runs. */
export function forgetUser(userId: number, transaction?: { afterCommit(fn: () => void): void }) {
  const drop = () => users.forget((k) => k === userId)
  drop()
  transaction?.afterCommit(drop)
}

// Cookie headers whose session cookie express-session has checked (signature and all) and found
// signed in, each with the session id it named. A header seen again names the same session, so
// while that session and its user are still remembered above, nothing needs checking again. An
// entry never outlives what it points to: the session's forgetting (sign-out, a new password,
// deactivation) or its user's ends the shortcut, and the next request takes the whole way again.
// One header per session (its latest): a signed-in person who varies the other cookies of the
// header replaces their entry rather than filling memory.
const checkedCookies = new Map<string, string>()
const headerOfSession = new Map<string, string>()
const MAX_COOKIE_HEADER = 2048

/** Notes that `cookieHeader` was found to be the signed-in session `sid`. */
export function rememberCheckedCookie(cookieHeader: string | undefined, sid: string) {
  if (!cookieHeader || cookieHeader.length > MAX_COOKIE_HEADER || checkedCookies.get(cookieHeader) === sid)
    return
  const previous = headerOfSession.get(sid)
  if (previous !== undefined) checkedCookies.delete(previous)
  if (checkedCookies.size >= MAX_ENTRIES) {
    const [oldest, itsSid] = checkedCookies.entries().next().value as [string, string]
    checkedCookies.delete(oldest)
    headerOfSession.delete(itsSid)
  }
  checkedCookies.set(cookieHeader, sid)
  headerOfSession.set(sid, cookieHeader)
}

/** The signed-in user of a cookie header checked before, while its session and user are remembered. */
export function userOfCheckedCookie<T>(cookieHeader: string | undefined): T | undefined {
  if (!cookieHeader) return undefined
  const sid = checkedCookies.get(cookieHeader)
  if (sid === undefined) return undefined
  const session = sessions.entry(sid)
  if (session?.userId == null) return undefined
  return users.get(session.userId) as T | undefined
}

/** How many cookie headers are noted as checked (one per remembered session at most). */
export const checkedCookieCount = () => checkedCookies.size

/** Forgets everything (tests that change rows behind the app's back). */
export function forgetAllSessions() {
  sessions.clear()
  users.clear()
  checkedCookies.clear()
  headerOfSession.clear()
}
