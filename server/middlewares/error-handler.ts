import type { ErrorRequestHandler, RequestHandler } from 'express'
import { env } from '@server/config/env'
import { AppError } from '@server/lib/app-error'
import { logger } from '@server/lib/logger'
import { DomainError } from '@shared/domain/errors'

export const notFound: RequestHandler = (req, _res, next) => {
  next(new AppError(404, 'not_found', `No API route ${req.method} ${req.path}.`))
}

type HttpishError = { status?: number; statusCode?: number; type?: string; code?: string; field?: string }

/** The one error shape: `{ error: { code, message, details? } }`. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  let e: AppError
  const h = err as HttpishError
  if (err instanceof AppError) e = err
  else if (err instanceof DomainError) {
    e = new AppError(
      400,
      err.code,
      err.message,
      err.field ? [{ field: err.field, message: err.message }] : undefined,
    )
  } else if (h.type === 'entity.parse.failed') {
    e = new AppError(400, 'invalid_input', 'The request body is not valid JSON.')
  } else if (h.type === 'entity.too.large' || h.code === 'LIMIT_FILE_SIZE') {
    // multer names the file's form field: say it, as every other refusal does.
    const message = h.field ? 'The file is larger than this form takes.' : 'The request is too large.'
    e = new AppError(413, 'payload_too_large', message, h.field ? [{ field: h.field, message }] : undefined)
  } else if (h.type === 'encoding.unsupported' || h.type === 'charset.unsupported') {
    e = new AppError(415, 'unsupported_media_type', 'The request body encoding is not supported.')
  } else if (typeof h.code === 'string' && h.code.startsWith('LIMIT_')) {
    e = new AppError(
      400,
      'invalid_upload',
      (err as Error).message,
      h.field ? [{ field: h.field, message: (err as Error).message }] : undefined,
    )
  } else {
    const status = h.status ?? h.statusCode
    if (status && status >= 400 && status < 500) {
      e = new AppError(status, 'bad_request', (err as Error).message || 'Bad request.')
    } else {
      logger.error('unhandled error', {
        method: req.method,
        path: req.path,
        error: err instanceof Error ? err.stack : String(err),
      })
      e = new AppError(500, 'internal', 'Something went wrong on our side. Please try again.')
      if (env.NODE_ENV !== 'production' && err instanceof Error)
        e = new AppError(500, 'internal', err.message)
    }
  }
  if (res.headersSent) return
  res
    .status(e.status)
    .json({ error: { code: e.code, message: e.message, ...(e.details ? { details: e.details } : {}) } })
}
