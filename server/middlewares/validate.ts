import type { Request, RequestHandler } from 'express'
import { z } from 'zod'
import { issuesToDetails } from '@shared/schemas/errors'
import { AppError } from '@server/lib/app-error'

/** Any zod schema: the full zod's or zod/mini's (shared/schemas/auth.ts), both built on zod's core. */
type AnySchema = z.core.$ZodType
type Schemas = { body?: AnySchema; query?: AnySchema; params?: AnySchema }

declare module 'express-serve-static-core' {
  interface Request {
    /** Parsed and validated values from `validate()`; controllers read these, never the raw ones. */
    valid: { body?: unknown; query?: unknown; params?: unknown }
  }
}

const NUL_MESSAGE = 'Remove the NUL character (\\u0000): it cannot be stored.'
const SURROGATE_MESSAGE = 'Remove the broken character (a lone UTF-16 surrogate): it cannot be stored.'
/** Half of a UTF-16 pair without its other half: not a character, and PostgreSQL's json refuses it. */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/

/**
 * One detail per string holding a NUL character or a lone UTF-16 surrogate, at its field's path.
 * PostgreSQL's text and jsonb cannot store either (the query fails), so no field may carry one,
 * whatever its schema says.
 */
export function nulCharacterDetails(
  value: unknown,
  path: string[] = [],
): { field: string; message: string }[] {
  if (typeof value === 'string') {
    if (value.includes('\u0000')) return [{ field: path.join('.'), message: NUL_MESSAGE }]
    return LONE_SURROGATE.test(value) ? [{ field: path.join('.'), message: SURROGATE_MESSAGE }] : []
  }
  if (Array.isArray(value)) return value.flatMap((v, i) => nulCharacterDetails(v, [...path, String(i)]))
  if (value && typeof value === 'object')
    return Object.entries(value).flatMap(([k, v]) => nulCharacterDetails(v, [...path, k]))
  return []
}

/**
 * Checks body, query and params against their schemas, reports every problem at once
 * (400 invalid_input with one detail per field), and hands the parsed values on in `req.valid`.
 */
export function validate(schemas: Schemas): RequestHandler {
  const handler: RequestHandler = (req, _res, next) => {
    const details: { field: string; message: string }[] = []
    const valid: Request['valid'] = {}
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part]
      if (!schema) continue
      const raw = part === 'body' ? (req.body ?? {}) : req[part]
      const nul = nulCharacterDetails(raw)
      if (nul.length > 0) {
        details.push(...nul.map((d) => ({ ...d, field: part === 'body' ? d.field : `${part}.${d.field}` })))
        continue
      }
      const r = z.safeParse(schema, raw)
      if (r.success) valid[part] = r.data
      else
        details.push(
          ...issuesToDetails(r.error.issues).map((d) => ({
            field: part === 'body' ? d.field : `${part}.${d.field}`,
            message: d.message,
          })),
        )
    }
    if (details.length > 0) {
      const first = details[0]!
      next(
        AppError.invalid(
          details.length === 1 ? `${first.field}: ${first.message}` : 'Some fields need attention.',
          details,
        ),
      )
      return
    }
    req.valid = valid
    next()
  }
  // The schemas stay readable on the handler, so tests can derive inputs from the route table.
  return Object.assign(handler, { schemas })
}

/** Typed access to what validate() parsed. */
export function body<S extends AnySchema>(req: Request, _schema: S): z.output<S> {
  return req.valid.body as z.output<S>
}
export function query<S extends AnySchema>(req: Request, _schema: S): z.output<S> {
  return req.valid.query as z.output<S>
}
export function params<S extends AnySchema>(req: Request, _schema: S): z.output<S> {
  return req.valid.params as z.output<S>
}
