import { createHash } from 'node:crypto'
import { promisify } from 'node:util'
import { gzip, gzipSync } from 'node:zlib'
import type { Transaction } from 'sequelize'

// The buyer's catalogue is the same for every shop of a tier on a given studio day, and it is the
// hottest read of the product, so it is kept per tier and day as the JSON body it answers with.
// Whatever changes what it shows calls invalidateCatalogue: every ledger move (recordStockMove:
// pours, reservations, releases, shipments, write-offs), price breaks, and products (details,
// photo, on sale or not) and a shop's tier. Inside a transaction the cache is dropped when it commits, and a body
// computed while a change was committing is not kept (the version it started from is gone).
// One server process holds one cache; several processes behind a balancer would need a shared one.
// This module imports nothing of the app, so any module may call it without an import cycle.

/**
 * A body, its ETag (hashed once when the body is made, not on every answer) and its gzip encoding
 * (compressed once too: 300 products make about 115 KB of JSON and 7 KB gzipped, and
 * compressing on every answer would cost more than everything else the route does).
 */
export type CachedBody = { json: string; etag: string; gzip: Buffer }

const gzipAsync = promisify(gzip)
const etagOf = (json: string) => `W/"${createHash('sha1').update(json).digest('base64url')}"`

/** A body ready to cache: its ETag and gzip made once (the compression off the event loop). */
export async function cacheableBody(json: string): Promise<CachedBody> {
  return { json, etag: etagOf(json), gzip: await gzipAsync(json, { level: 6 }) }
}

/** The same for a small constant body, made when the module loads. */
export function constantBody(json: string): CachedBody {
  return { json, etag: etagOf(json), gzip: gzipSync(json) }
}

let version = 0
const bodies = new Map<string, CachedBody & { version: number }>()
// Which tier each shop buys at (null: none yet); dropped with the bodies, so a tier change made
// through the shops service (which calls invalidateCatalogue) shows at once.
const shopTiers = new Map<number, { version: number; tierId: number | null }>()

/** Drops every cached catalogue, at once or, inside a transaction, when it commits. */
export function invalidateCatalogue(transaction?: Transaction | null) {
  const drop = () => {
    version++
    bodies.clear()
    shopTiers.clear()
  }
  if (transaction) transaction.afterCommit(drop)
  else drop()
}

/** The cached body under `key`, or `make()`'s, kept only if nothing changed while it was made. */
export async function cachedCatalogue(key: string, make: () => Promise<string>): Promise<CachedBody> {
  const hit = bodies.get(key)
  if (hit && hit.version === version) return hit
  const started = version
  const body = await cacheableBody(await make())
  if (version === started) bodies.set(key, { version: started, ...body })
  return body
}

/** The shop's tier, from `load()` once per change. */
export async function cachedShopTier(
  shopId: number,
  load: () => Promise<number | null>,
): Promise<number | null> {
  const hit = shopTiers.get(shopId)
  if (hit && hit.version === version) return hit.tierId
  const started = version
  const tierId = await load()
  if (version === started) shopTiers.set(shopId, { version: started, tierId })
  return tierId
}
