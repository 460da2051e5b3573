import { z } from 'zod'

/** PostgreSQL's `integer`, the type of every id column. */
export const MAX_RECORD_ID = 2_147_483_647

/**
 * A record's id as a path names it: digits only, no sign, no leading zero, within PostgreSQL's
 * integer. Anything else is refused rather than read as some number (`0x10`, `1e3`, `16.0`, `+16`
 * and ` 16` would all be 16 or 1000 to a plain numeric coercion, so one record had many addresses).
 */
export function recordId(message = 'Not a record number.') {
  return z
    .union([z.number(), z.string().regex(/^[1-9][0-9]{0,9}$/, message)], { error: message })
    .pipe(z.coerce.number<string | number>().int(message).positive(message).max(MAX_RECORD_ID, message))
}
