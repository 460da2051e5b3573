/**
 * The remembering session store (session-cache.ts): reads come from memory while a session is
 * known, every write goes through to the store underneath, and nothing outlives a forget, the
 * session's own expiry or a minute.
 */
import { Store } from 'express-session'
import type { SessionData } from 'express-session'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import {
  forgetAllSessions,
  forgetSessionsOf,
  forgetUser,
  rememberedUser,
  rememberingStore,
} from '@server/modules/auth/session-cache'

/** A store in a Map that counts its reads, standing in for the PostgreSQL one. */
class CountingStore extends Store {
  rows = new Map<string, string>()
  reads = 0
  override get(sid: string, cb: (err: unknown, s?: SessionData | null) => void) {
    this.reads++
    const row = this.rows.get(sid)
    setImmediate(() => cb(null, row ? (JSON.parse(row) as SessionData) : null))
  }
  override set(sid: string, s: SessionData, cb?: (err?: unknown) => void) {
    this.rows.set(sid, JSON.stringify(s))
    setImmediate(() => cb?.())
  }
  override destroy(sid: string, cb?: (err?: unknown) => void) {
    this.rows.delete(sid)
    setImmediate(() => cb?.())
  }
}

const sessionOf = (userId: number, expiresInMs = 3_600_000) =>
  ({
    cookie: { originalMaxAge: expiresInMs, expires: new Date(Date.now() + expiresInMs) },
    passport: { user: userId },
  }) as unknown as SessionData

const read = (store: Store, sid: string) =>
  new Promise<SessionData | null | undefined>((resolve, reject) =>
    store.get(sid, (err, s) => (err ? reject(err as Error) : resolve(s))),
  )
const write = (store: Store, sid: string, s: SessionData) =>
  new Promise<void>((resolve, reject) => store.set(sid, s, (err) => (err ? reject(err as Error) : resolve())))
const destroy = (store: Store, sid: string) =>
  new Promise<void>((resolve, reject) =>
    store.destroy(sid, (err) => (err ? reject(err as Error) : resolve())),
  )

let inner: CountingStore
let store: CountingStore

beforeEach(() => {
  forgetAllSessions()
  inner = new CountingStore()
  store = rememberingStore(inner)
})
afterEach(() => {
  vi.useRealTimers()
})

describe('the remembering session store', () => {
  it('writes through and answers later reads from memory, each read a copy of its own', async () => {
    await write(store, 'a', sessionOf(7))
    expect(inner.rows.has('a')).toBe(true)
    const first = await read(store, 'a')
    const second = await read(store, 'a')
    expect(inner.reads).toBe(0)
    expect(first).toEqual(second)
    expect(first).not.toBe(second)
    ;(first as unknown as { csrfToken: string }).csrfToken = 'changed by one request'
    expect((await read(store, 'a')) as unknown as { csrfToken?: string }).not.toHaveProperty('csrfToken')
  })

  it('reads an unknown session from the store once, then from memory', async () => {
    inner.rows.set('b', JSON.stringify(sessionOf(8)))
    await read(store, 'b')
    await read(store, 'b')
    expect(inner.reads).toBe(1)
    expect(await read(store, 'missing')).toBeNull()
    expect(await read(store, 'missing')).toBeNull()
    expect(inner.reads).toBe(3) // an unknown id is never remembered as missing
  })

  it('forgets a destroyed session at once', async () => {
    await write(store, 'c', sessionOf(9))
    await destroy(store, 'c')
    expect(await read(store, 'c')).toBeNull()
  })

  it('forgets every session of a user whose sessions are deleted, and keeps the others', async () => {
    await write(store, 'd1', sessionOf(10))
    await write(store, 'd2', sessionOf(10))
    await write(store, 'e', sessionOf(11))
    inner.rows.delete('d1') // the DELETE … WHERE user = 10 of a sign-out everywhere
    inner.rows.delete('d2')
    forgetSessionsOf(10)
    expect(await read(store, 'd1')).toBeNull()
    expect(await read(store, 'd2')).toBeNull()
    expect(await read(store, 'e')).not.toBeNull()
  })

  it('forgets them again when the deleting transaction commits', async () => {
    let commit = () => {}
    await write(store, 'f', sessionOf(12))
    forgetSessionsOf(12, { afterCommit: (fn) => (commit = fn) })
    // Before the commit a request still reads the row, and memory takes it again…
    expect(await read(store, 'f')).not.toBeNull()
    inner.rows.delete('f')
    commit() // …which the commit forgets.
    expect(await read(store, 'f')).toBeNull()
  })

  it('does not keep a read that raced with a forget', async () => {
    inner.rows.set('g', JSON.stringify(sessionOf(13)))
    const racing = read(store, 'g') // reads the row, answers on the next turn
    inner.rows.delete('g')
    forgetSessionsOf(13)
    expect(await racing).not.toBeNull()
    expect(await read(store, 'g')).toBeNull()
  })

  it('trusts nothing past the session’s own expiry, nor past a minute', async () => {
    vi.useFakeTimers({ toFake: ['Date'] })
    await write(store, 'h', sessionOf(14, 10_000))
    vi.setSystemTime(Date.now() + 10_001)
    inner.rows.delete('h') // the store's own expiry check, as PostgreSQL's query has
    expect(await read(store, 'h')).toBeNull()
    await write(store, 'i', sessionOf(15))
    inner.rows.set('i', JSON.stringify({ ...sessionOf(15), changedElsewhere: true }))
    vi.setSystemTime(Date.now() + 59_000)
    expect(await read(store, 'i')).not.toHaveProperty('changedElsewhere')
    vi.setSystemTime(Date.now() + 2_000)
    expect(await read(store, 'i')).toHaveProperty('changedElsewhere', true)
  })
})

describe('the remembered signed-in user', () => {
  it('loads a user once, again after forgetUser, and never remembers one that is not there', async () => {
    const load = vi.fn(async () => ({ id: 20, name: 'Someone' }))
    await rememberedUser(20, load)
    await rememberedUser(20, load)
    expect(load).toHaveBeenCalledTimes(1)
    forgetUser(20)
    await rememberedUser(20, load)
    expect(load).toHaveBeenCalledTimes(2)
    const none = vi.fn(async () => null)
    expect(await rememberedUser(21, none)).toBeNull()
    expect(await rememberedUser(21, none)).toBeNull()
    expect(none).toHaveBeenCalledTimes(2)
  })

  it('forgets the user with their sessions, and when a change commits', async () => {
    let commit = () => {}
    const load = vi.fn(async () => ({ id: 22 }))
    await rememberedUser(22, load)
    forgetUser(22, { afterCommit: (fn) => (commit = fn) })
    await rememberedUser(22, load) // read before the commit…
    commit() // …forgotten by it
    await rememberedUser(22, load)
    expect(load).toHaveBeenCalledTimes(3)
    forgetSessionsOf(22)
    await rememberedUser(22, load)
    expect(load).toHaveBeenCalledTimes(4)
  })
})
