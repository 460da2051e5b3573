/**
 * An input that a domain computation cannot work with (a negative weight, a superfat out of its
 * sane range, a batch with no sellable bars). `field` names the input that is wrong, as a dotted
 * path into the function's argument (`superfatPct`, `oils.2.grams`), so a caller can put the
 * message beside the form field it came from.
 */
export class DomainError extends Error {
  constructor(
    public code: string,
    message: string,
    public field?: string,
  ) {
    super(message)
    this.name = 'DomainError'
  }
}

export interface NumericRange {
  readonly min: number
  readonly max: number
}

export function requireFinite(value: number, field: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new DomainError('invalid_number', `${field} must be a finite number`, field)
  }
  return value
}

export function requireNonNegative(value: number, field: string): number {
  requireFinite(value, field)
  if (value < 0) throw new DomainError('negative', `${field} must not be negative (got ${value})`, field)
  return value
}

export function requirePositive(value: number, field: string): number {
  requireFinite(value, field)
  if (value <= 0)
    throw new DomainError('not_positive', `${field} must be greater than 0 (got ${value})`, field)
  return value
}

/** Integer (safe for exact arithmetic) and at least `min`. */
export function requireInteger(value: number, field: string, min = Number.MIN_SAFE_INTEGER): number {
  if (!Number.isSafeInteger(value)) {
    throw new DomainError('not_integer', `${field} must be a whole number (got ${value})`, field)
  }
  if (value < min)
    throw new DomainError('out_of_range', `${field} must be at least ${min} (got ${value})`, field)
  return value
}

/** Inside [min, max], both ends included. */
export function requireInRange(value: number, range: NumericRange, field: string): number {
  requireFinite(value, field)
  if (value < range.min || value > range.max) {
    throw new DomainError(
      'out_of_range',
      `${field} must be between ${range.min} and ${range.max} (got ${value})`,
      field,
    )
  }
  return value
}
