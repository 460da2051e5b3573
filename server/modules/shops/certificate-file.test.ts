import { createHash } from 'node:crypto'
import { deflateSync } from 'node:zlib'
import { describe, expect, it } from 'vitest'
import {
  attachmentHeader,
  checkCertificate,
  pdfHasJavaScript,
  sanitiseFilename,
  sniffCertificateType,
} from '@server/modules/shops/certificate-file'

const hex = (h: string) => Buffer.from(h.replace(/\s/g, ''), 'hex')

describe('sniffCertificateType', () => {
  it.each<[Buffer, string | null, string]>([
    // bytes, expected, source
    [Buffer.from('%PDF-1.7\n'), 'application/pdf', 'ISO 32000-1 §7.5.2 file header "%PDF-" (from memory)'],
    [
      hex('ffd8ffe0 0010 4a464946'),
      'image/jpeg',
      'ITU-T T.81 SOI marker FFD8 then a marker FF (from memory)',
    ],
    [hex('ffd8ffe1 0010 45786966'), 'image/jpeg', 'EXIF JPEG: SOI then APP1 (from memory)'],
    [hex('89504e47 0d0a1a0a 0000000d'), 'image/png', 'PNG signature, ISO/IEC 15948 §5.2 (from memory)'],
    [hex('89504e47 0d0a0000'), null, 'a truncated PNG signature is not a PNG'],
    [Buffer.from(' %PDF-1.4'), null, 'our rule: the header must start the file'],
    [Buffer.from('GIF89a'), null, 'GIF is not one of our three types'],
    [Buffer.from('<html>'), null, 'HTML is refused'],
    [Buffer.alloc(0), null, 'empty'],
  ])('%s → %s (%s)', (bytes, expected) => {
    expect(sniffCertificateType(bytes)).toBe(expected)
  })
})

describe('pdfHasJavaScript', () => {
  const pdf = (body: string) => Buffer.from(`%PDF-1.4\n${body}\n%%EOF`, 'latin1')
  it.each([
    ['<</S/JavaScript/JS(x)>>', true],
    ['<</OpenAction<</S /JavaScript>>>>', true],
    ['<</JS 7 0 R>>', true],
    ['<</AA<</O<</JS(x)>>>>>>', true],
    ['<</J#53(x)>>', true],
    ['<</#4A#61vaScript 1>>', true],
    ['<</JSON 1>>', false],
    ['<</JSX 1/JavaScripts 2>>', false],
    ['(a string that says /JavaScript is mentioned)', true], // strict: a literal string mentioning it is refused too
    ['<</Type/Page>>', false],
  ])('%s → %s (ISO 32000-1 §7.3.5 names, from memory)', (body, expected) => {
    expect(pdfHasJavaScript(pdf(body))).toBe(expected)
  })

  it('looks inside Flate-compressed streams', () => {
    const hidden = deflateSync(Buffer.from('1 0 obj<</S/JavaScript/JS(x)>>endobj'))
    const file = Buffer.concat([
      Buffer.from('%PDF-1.5\n2 0 obj<</Filter/FlateDecode>>\nstream\n'),
      hidden,
      Buffer.from('\nendstream\nendobj\n'),
    ])
    expect(pdfHasJavaScript(file)).toBe(true)
    const harmless = deflateSync(Buffer.from('BT /F1 12 Tf (Resale certificate) Tj ET'))
    const ok = Buffer.concat([
      Buffer.from('%PDF-1.5\n2 0 obj<</Filter/FlateDecode>>\nstream\n'),
      harmless,
      Buffer.from('\nendstream\nendobj\n'),
    ])
    expect(pdfHasJavaScript(ok)).toBe(false)
  })
})

describe('sanitiseFilename', () => {
  it.each([
    ['cert.pdf', 'application/pdf', 'cert.pdf'],
    ['../../x/cert.pdf', 'application/pdf', 'cert.pdf'],
    ['C:\\a\\b\\cert.PDF', 'application/pdf', 'cert.pdf'],
    ['scan.pdf', 'image/png', 'scan.png'],
    ['photo.JPEG', 'image/jpeg', 'photo.jpg'],
    ['noext', 'image/jpeg', 'noext.jpg'],
    ['..', 'application/pdf', 'resale-certificate.pdf'],
    ['.pdf', 'application/pdf', 'resale-certificate.pdf'],
    ['a\u0000b\u001fc\u007f.pdf', 'application/pdf', 'abc.pdf'],
    ['\u202eevil\u2066.pdf', 'application/pdf', 'evil.pdf'],
    ['a  \t b.pdf', 'application/pdf', 'a b.pdf'],
    ['what?*:<>|".pdf', 'application/pdf', 'what.pdf'],
    [`${'x'.repeat(300)}.pdf`, 'application/pdf', `${'x'.repeat(196)}.pdf`],
  ] as const)('%j as %s → %j', (name, type, expected) => {
    expect(sanitiseFilename(name, type)).toBe(expected)
  })
})

describe('checkCertificate', () => {
  it('reports a missing file only when one is required', () => {
    expect(checkCertificate(undefined, false)).toEqual({ upload: null, problems: [] })
    expect(checkCertificate(undefined, true).problems[0]!.field).toBe('certificate')
  })

  it('keeps the size and the SHA-256 of exactly the bytes received', () => {
    const bytes = Buffer.from('%PDF-1.4\n%%EOF\n')
    const r = checkCertificate({ originalname: 'a.pdf', buffer: bytes }, true)
    expect(r.upload!.sha256).toBe(createHash('sha256').update(bytes).digest('hex'))
    expect(r.upload!.sha256).not.toBe(createHash('sha256').update('a.pdf').digest('hex'))
    expect(r.upload!.sizeBytes).toBe(bytes.length)
  })
})

describe('attachmentHeader', () => {
  it.each([
    ['cert.pdf', `attachment; filename="cert.pdf"; filename*=UTF-8''cert.pdf`],
    [
      'résalé (1).pdf',
      `attachment; filename="r_sal_ (1).pdf"; filename*=UTF-8''r%C3%A9sal%C3%A9%20%281%29.pdf`,
    ],
  ])('%j → %s (RFC 6266 §4.3, RFC 8187 §3.2, from memory)', (name, expected) => {
    expect(attachmentHeader(name)).toBe(expected)
  })
})
