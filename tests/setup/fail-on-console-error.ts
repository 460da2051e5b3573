import { afterEach, vi } from 'vitest'

// An unexpected console.error is a failure: it usually hides a swallowed error.
let errors: unknown[][] = []
const original = console.error
console.error = (...args: unknown[]) => {
  errors.push(args)
  original(...args)
}

afterEach(() => {
  const seen = errors
  errors = []
  if (seen.length > 0) {
    throw new Error(`console.error was called ${seen.length} time(s): ${String(seen[0]?.[0]).slice(0, 300)}`)
  }
})

/** For a test that expects an error to be logged. */
export function allowConsoleError<T>(fn: () => Promise<T>): Promise<T> {
  const spy = vi.spyOn(console, 'error').mockImplementation(() => {})
  return fn().finally(() => spy.mockRestore())
}
