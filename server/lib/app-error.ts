import type { ErrorDetail } from '@shared/schemas/errors'

/** The one error type a route may throw; the error middleware turns it into the contract's shape. */
export class AppError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly details?: unknown,
  ) {
    super(message)
    this.name = 'AppError'
  }

  static invalid(message: string, details?: ErrorDetail[]) {
    return new AppError(400, 'invalid_input', message, details)
  }
  static field(field: string, message: string, status = 400, code = 'invalid_input') {
    return new AppError(status, code, message, [{ field, message }])
  }
  static unauthorized(message = 'Please sign in.') {
    return new AppError(401, 'unauthorized', message)
  }
  static forbidden(message = 'You are not allowed to do that.') {
    return new AppError(403, 'forbidden', message)
  }
  static notFound(what = 'That record') {
    return new AppError(404, 'not_found', `${what} was not found.`)
  }
  static conflict(code: string, message: string, details?: unknown) {
    return new AppError(409, code, message, details)
  }
  static unprocessable(code: string, message: string, details?: unknown) {
    return new AppError(422, code, message, details)
  }
}
