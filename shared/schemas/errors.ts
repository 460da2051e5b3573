import { z } from 'zod'

/** One problem with one field of a request; `field` is a dotted path such as `lines.0.cases`. */
export const ErrorDetailSchema = z.object({ field: z.string(), message: z.string() })
export type ErrorDetail = z.infer<typeof ErrorDetailSchema>

/** The contract's error body: `{ error: { code, message, details? } }`. */
export const ErrorBodySchema = z.object({
  error: z.object({ code: z.string(), message: z.string(), details: z.unknown().optional() }),
})
export type ErrorBody = z.infer<typeof ErrorBodySchema>

/** zod issues → field details (every problem at once). */
export function issuesToDetails(
  issues: readonly { path: readonly PropertyKey[]; message: string }[],
): ErrorDetail[] {
  return issues.map((i) => ({ field: i.path.map(String).join('.') || '(body)', message: i.message }))
}
