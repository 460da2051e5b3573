export type ClassValue = string | false | null | undefined | 0

/**
 * Joins class names, skipping falsy parts, so conditions can sit inline:
 * `cn('px-3', active && 'bg-olive-50', className)`. It does not resolve conflicting
 * utilities: a caller's `className` is for additions (margins, widths), not overrides.
 */
export function cn(...parts: ClassValue[]): string {
  let out = ''
  for (const part of parts) {
    if (!part) continue
    out = out ? `${out} ${part}` : part
  }
  return out
}
