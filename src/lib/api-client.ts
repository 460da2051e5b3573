import type { ErrorDetail } from '@shared/schemas/errors'

/** An error answered by the API in the contract's shape. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message)
    this.name = 'ApiError'
  }

  /** Field problems, when the API named the fields at fault. */
  get fieldErrors(): ErrorDetail[] {
    return Array.isArray(this.details)
      ? (this.details as unknown[]).filter(
          (d): d is ErrorDetail => typeof d === 'object' && d !== null && 'field' in d && 'message' in d,
        )
      : []
  }
}

let csrfToken: string | null = null
let onUnauthorized: (() => void) | null = null

/** The app shell registers what a 401 means (back to sign-in). */
export function setUnauthorizedHandler(fn: (() => void) | null) {
  onUnauthorized = fn
}

export function setCsrfToken(token: string | null) {
  csrfToken = token
}

async function fetchCsrf(): Promise<string> {
  const r = await fetch('/api/auth/csrf', { credentials: 'same-origin' })
  const body = (await r.json()) as { csrfToken: string }
  csrfToken = body.csrfToken
  return csrfToken
}

type Options = {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE'
  body?: unknown
  headers?: Record<string, string>
  signal?: AbortSignal
  /** A 401 here is an expected answer (the "who am I" probe, the sign-in form), not a lost session. */
  allowUnauthorized?: boolean
}

/** The one fetch client: JSON in and out, CSRF header on writes, errors as ApiError. */
export async function api<T>(path: string, opts: Options = {}, retried = false): Promise<T> {
  const method = opts.method ?? 'GET'
  const headers: Record<string, string> = { Accept: 'application/json', ...opts.headers }
  let body: BodyInit | undefined
  if (opts.body instanceof FormData) body = opts.body
  else if (opts.body !== undefined) {
    headers['Content-Type'] = 'application/json'
    body = JSON.stringify(opts.body)
  }
  if (method !== 'GET') headers['X-CSRF-Token'] = csrfToken ?? (await fetchCsrf())
  const res = await fetch(`/api${path}`, { method, headers, body, credentials: 'same-origin', signal: opts.signal })
  if (res.status === 204) return undefined as T
  const type = res.headers.get('content-type') ?? ''
  const data: unknown = type.includes('json') ? await res.json().catch(() => null) : null
  if (res.ok) return data as T
  const err = (data as { error?: { code?: string; message?: string; details?: unknown } } | null)?.error
  if (res.status === 403 && err?.code === 'csrf' && !retried) {
    csrfToken = null
    return api<T>(path, opts, true)
  }
  if (res.status === 401 && !opts.allowUnauthorized) onUnauthorized?.()
  throw new ApiError(
    res.status,
    err?.code ?? 'http_error',
    err?.message ?? `The server answered ${res.status}. Please try again.`,
    err?.details,
  )
}

/** Builds a query string from the defined values. */
export function qs(params: Record<string, string | number | boolean | null | undefined>): string {
  const s = new URLSearchParams()
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== null && v !== '') s.set(k, String(v))
  const text = s.toString()
  return text ? `?${text}` : ''
}
