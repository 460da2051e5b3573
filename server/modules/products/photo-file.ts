import type { PhotoType } from '@shared/schemas/products'

export const PHOTO_EXTENSION: Record<PhotoType, string> = {
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/webp': 'webp',
}

/**
 * The image type from the file's first bytes (its magic number), never from its name or the
 * browser's word for it: JPEG starts FF D8 FF, PNG with its 8-byte signature, WebP as a RIFF
 * container whose form type is "WEBP". Anything else is null.
 */
export function sniffImageType(bytes: Uint8Array): PhotoType | null {
  const starts = (sig: readonly number[], at = 0) =>
    bytes.length >= at + sig.length && sig.every((b, i) => bytes[at + i] === b)
  if (starts([0xff, 0xd8, 0xff])) return 'image/jpeg'
  if (starts([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'image/png'
  if (starts([0x52, 0x49, 0x46, 0x46]) && starts([0x57, 0x45, 0x42, 0x50], 8)) return 'image/webp'
  return null
}

/**
 * A file name safe in a Content-Disposition header and on any disk: ASCII letters, digits, dot,
 * dash and underscore only, no leading dots, at most 80 characters, ending in the extension of
 * the type the bytes really are.
 */
export function safeFilename(original: string | undefined, type: PhotoType, fallback: string): string {
  const stem = (original ?? '')
    .split(/[\\/]/)
    .pop()!
    .replace(/\.[^.]*$/, '')
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^A-Za-z0-9._-]+/g, '-')
    .replace(/-{2,}/g, '-')
    .replace(/^[.-]+|[.-]+$/g, '')
    .slice(0, 70)
  return `${stem || fallback}.${PHOTO_EXTENSION[type]}`
}
