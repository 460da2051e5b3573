import { describe, expect, it } from 'vitest'
import { safeFilename, sniffImageType } from '@server/modules/products/photo-file'

const bytes = (...parts: (number[] | string)[]) =>
  Uint8Array.from(parts.flatMap((p) => (typeof p === 'string' ? [...Buffer.from(p, 'latin1')] : p)))

describe('sniffImageType', () => {
  it.each([
    // Magic numbers: JPEG SOI marker FF D8 FF (ITU-T T.81 / JFIF); PNG 8-byte signature (PNG spec,
    // ISO/IEC 15948 §5.2); WebP is a RIFF file whose form type is "WEBP" (RFC 9649 §2.5).
    ['JPEG (JFIF)', bytes([0xff, 0xd8, 0xff, 0xe0], 'JFIF'), 'image/jpeg'],
    ['JPEG (Exif)', bytes([0xff, 0xd8, 0xff, 0xe1], 'Exif'), 'image/jpeg'],
    ['PNG', bytes([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13], 'IHDR'), 'image/png'],
    ['WebP', bytes('RIFF', [0x24, 0, 0, 0], 'WEBPVP8 '), 'image/webp'],
    ['a WAV file (RIFF, but not WEBP)', bytes('RIFF', [0x24, 0, 0, 0], 'WAVEfmt '), null],
    ['a PNG signature cut short', bytes([0x89, 0x50, 0x4e, 0x47]), null],
    ['GIF', bytes('GIF89a'), null],
    ['an SVG (text that a browser would run)', bytes('<svg xmlns="http://www.w3.org/2000/svg"/>'), null],
    ['plain text', bytes('hello'), null],
    ['nothing', bytes(), null],
  ])('%s → %s', (_label, input, expected) => {
    expect(sniffImageType(input)).toBe(expected)
  })
})

describe('safeFilename', () => {
  it.each([
    ['bar photo.png', 'image/png', 'bar-photo.png'],
    ['../../etc/passwd', 'image/jpeg', 'passwd.jpg'],
    ['"evil"\r\nname;.exe.png', 'image/png', 'evil-name-.exe.png'],
    ['Crème brûlée.JPG', 'image/jpeg', 'Creme-brulee.jpg'],
    ['.hidden', 'image/webp', 'lav.webp'],
    [undefined, 'image/png', 'lav.png'],
    ['photo.txt', 'image/jpeg', 'photo.jpg'],
  ] as const)('%s (%s) → %s (product rule: ASCII, sniffed extension)', (name, type, expected) => {
    expect(safeFilename(name, type, 'lav')).toBe(expected)
  })

  it('keeps names short', () => {
    expect(safeFilename(`${'a'.repeat(300)}.png`, 'image/png', 'x').length).toBeLessThanOrEqual(80)
  })
})
