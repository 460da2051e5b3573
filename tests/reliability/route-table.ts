/**
 * The server's own route table: every method + path the Express app answers under /api, read
 * from its router stacks (Express 5 / router 2 keep each layer's `rawPath`), with the body
 * schema that `validate()` left on the route's handlers.
 */
import type { Express } from 'express'
import type { z } from 'zod'

type Layer = {
  rawPath?: unknown
  route?: { path: string; methods: Record<string, boolean>; stack: Layer[] }
  handle: { stack?: Layer[]; schemas?: { body?: z.ZodType; query?: z.ZodType; params?: z.ZodType } }
}

export type RouteInfo = {
  /** `POST /api/orders/:id/cancel`: the key the access matrix uses. */
  key: string
  method: string
  path: string
  bodySchema?: z.ZodType
  querySchema?: z.ZodType
}

export function routeTable(app: Express): RouteInfo[] {
  const out: RouteInfo[] = []
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        const path = (prefix + layer.route.path).replace(/(.)\/$/, '$1')
        const schemas = layer.route.stack.map((l) => l.handle.schemas).find(Boolean)
        for (const m of Object.keys(layer.route.methods)) {
          const method = m.toUpperCase()
          out.push({
            key: `${method} ${path}`,
            method,
            path,
            bodySchema: schemas?.body,
            querySchema: schemas?.query,
          })
        }
      } else if (layer.handle.stack) {
        const p = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : ''
        walk(layer.handle.stack, prefix + p)
      }
    }
  }
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '')
  return out.filter((r) => r.path.startsWith('/api/'))
}

export const WRITE_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])
