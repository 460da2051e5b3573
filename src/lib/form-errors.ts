import type { FieldValues, Path, UseFormSetError } from 'react-hook-form'
import { ApiError } from '@/lib/api-client'

/**
 * Puts the API's field errors on the form's fields; returns the message for the form-level
 * banner when some error belongs to no visible field (or is not a field error at all).
 */
export function applyApiErrors<T extends FieldValues>(err: unknown, setError: UseFormSetError<T>, fields: readonly string[]): string | null {
  if (!(err instanceof ApiError)) return err instanceof Error ? err.message : 'Something went wrong.'
  let unplaced = err.fieldErrors.length === 0
  for (const d of err.fieldErrors) {
    if (fields.includes(d.field)) setError(d.field as Path<T>, { type: 'server', message: d.message })
    else unplaced = true
  }
  return unplaced ? err.message : null
}
