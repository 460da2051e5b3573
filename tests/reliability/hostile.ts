/**
 * Hostile request bodies for fast-check: values of the wrong type, huge and strange strings,
 * negative, fractional and enormous numbers, SQL and script fragments, and bodies shaped like a
 * route's own schema (read from the zod schema validate() holds) with such values at the leaves,
 * so the hostile values also reach the code behind the first check.
 */
import fc from 'fast-check'
import type { z } from 'zod'

const FRAGMENTS = [
  "' OR '1'='1",
  "'; DROP TABLE orders; --",
  '1; DELETE FROM stock_moves',
  "Robert'); DROP TABLE shops;--",
  '<script>alert(1)</script>',
  '"><img src=x onerror=alert(1)>',
  'javascript:alert(1)',
  '../../../../etc/passwd',
  '..\\..\\windows\\win.ini',
  '\u0000',
  'nul\u0000byte',
  '\u202e\u0645\u0631\u062d\u0628\u0627 RTL override',
  '𝔘𝔫𝔦𝔠𝔬𝔡𝔢 ☃ 🧼🧼 e\u0301',
  '\ud800',
  '=HYPERLINK("http://x.test","click")',
  '${7*7}{{7*7}}',
  '__proto__',
  'constructor',
  '0x7fffffff',
  '-1',
  '1e309',
  'NaN',
  '2026-02-30',
  '9999-12-31',
  '0000-00-00',
  ' ',
  '',
]

const NUMBERS = [
  -1,
  0,
  -0,
  0.5,
  -0.0001,
  1.000001,
  2 ** 31,
  -(2 ** 31) - 1,
  2 ** 53 + 2,
  Number.MAX_SAFE_INTEGER,
  1e308,
  -1e308,
  1e-12,
]

export const hostileString = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom(...FRAGMENTS) },
  { weight: 2, arbitrary: fc.string({ maxLength: 40, unit: 'binary' }) },
  { weight: 1, arbitrary: fc.string({ maxLength: 20, unit: 'grapheme' }) },
  {
    weight: 1,
    arbitrary: fc.constantFrom(10_000, 100_000).map((n) => 'x'.repeat(n)),
  },
)

export const hostileNumber = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom(...NUMBERS) },
  { weight: 1, arbitrary: fc.integer({ min: -1_000_000, max: 1_000_000 }) },
  { weight: 1, arbitrary: fc.double({ noNaN: true, noDefaultInfinity: true }) },
)

export const hostileLeaf: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: hostileString },
  { weight: 4, arbitrary: hostileNumber },
  { weight: 1, arbitrary: fc.boolean() },
  { weight: 1, arbitrary: fc.constant(null) },
  { weight: 1, arbitrary: fc.constant([]) },
  { weight: 1, arbitrary: fc.constant({}) },
  { weight: 1, arbitrary: fc.array(hostileString, { maxLength: 3 }) },
)

type Def = {
  type: string
  shape?: Record<string, z.ZodType>
  element?: z.ZodType
  innerType?: z.ZodType
  in?: z.ZodType
  options?: z.ZodType[]
  entries?: Record<string, string | number>
  values?: unknown[]
}
const defOf = (s: z.ZodType) => (s as unknown as { _zod: { def: Def } })._zod.def

/** A body shaped like the schema, hostile at its leaves (and now and then hostile as a whole). */
export function shapedLike(schema: z.ZodType, depth = 0): fc.Arbitrary<unknown> {
  const def = defOf(schema)
  let structured: fc.Arbitrary<unknown> | null = null
  switch (def.type) {
    case 'object': {
      const entries = Object.entries(def.shape ?? {})
      if (entries.length > 0)
        structured = fc.record(
          Object.fromEntries(
            entries.map(([k, v]) => [k, depth > 4 ? hostileLeaf : shapedLike(v, depth + 1)]),
          ),
          { requiredKeys: [] },
        )
      break
    }
    case 'array':
      if (def.element) structured = fc.array(shapedLike(def.element, depth + 1), { maxLength: 4 })
      break
    case 'union':
      if (def.options?.length) structured = fc.oneof(...def.options.map((o) => shapedLike(o, depth + 1)))
      break
    case 'enum':
      // Real choices now and then, so the rest of the body is judged too.
      if (def.entries) structured = fc.constantFrom(...Object.values(def.entries))
      break
    case 'literal':
      if (def.values?.length) structured = fc.constantFrom(...def.values)
      break
    case 'optional':
    case 'nullable':
    case 'default':
    case 'prefault':
    case 'catch':
    case 'readonly':
    case 'nonoptional':
      if (def.innerType) return shapedLike(def.innerType, depth)
      break
    case 'pipe':
      if (def.in) return shapedLike(def.in, depth)
      break
  }
  if (!structured) return hostileLeaf
  return fc.oneof({ weight: 5, arbitrary: structured }, { weight: 1, arbitrary: hostileLeaf })
}

/** Any JSON value fast-check can think of, and bodies shaped like the route's schema. */
export function hostileBody(schema: z.ZodType | undefined): fc.Arbitrary<unknown> {
  const anything = fc.anything({ maxDepth: 3, withNullPrototype: false, withBigInt: false, withDate: false })
  if (!schema) return fc.oneof(anything, fc.dictionary(hostileString, hostileLeaf, { maxKeys: 4 }))
  return fc.oneof({ weight: 1, arbitrary: anything }, { weight: 3, arbitrary: shapedLike(schema) })
}

/** Bodies that are not JSON objects at all, sent raw with the given content type. */
export const RAW_BODIES: { what: string; type: string; body: string }[] = [
  { what: 'malformed JSON', type: 'application/json', body: '{"lines": [1, 2' },
  { what: 'JSON null', type: 'application/json', body: 'null' },
  { what: 'a JSON string', type: 'application/json', body: '"just text"' },
  { what: 'plain text', type: 'text/plain', body: "'; DROP TABLE orders; --" },
  {
    what: 'a form',
    type: 'application/x-www-form-urlencoded',
    body: 'a[b][c]=1&a[__proto__][x]=2&lines[0][cases]=-1',
  },
  {
    what: 'a body over the limit',
    type: 'application/json',
    body: JSON.stringify({ note: 'x'.repeat(300_000) }),
  },
]
