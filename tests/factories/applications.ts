import { randomBytes } from 'node:crypto'
import { deflateSync } from 'node:zlib'
import type { ApiClient } from '@tests/factories/api-client'

/** A one-page PDF standing in for a scanned resale certificate. */
export function certificatePdf(extra = ''): Buffer {
  return Buffer.from(
    '%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[3 0 R]/Count 1>>endobj\n' +
      `3 0 obj<</Type/Page/Parent 2 0 R/MediaBox[0 0 612 792]>>endobj\n${extra}trailer<</Root 1 0 R>>\n%%EOF\n`,
    'latin1',
  )
}

/** A PDF whose script hides in a Flate-compressed object stream. */
export function pdfWithCompressedScript(): Buffer {
  const hidden = deflateSync(Buffer.from('4 0 obj<</S/JavaScript/JS(app.alert\\(1\\))>>endobj'))
  return Buffer.concat([
    Buffer.from(
      '%PDF-1.5\n5 0 obj<</Type/ObjStm/N 1/First 4/Filter/FlateDecode/Length ' +
        hidden.length +
        '>>\nstream\n',
    ),
    hidden,
    Buffer.from('\nendstream\nendobj\ntrailer<</Root 1 0 R>>\n%%EOF\n'),
  ])
}

/** A 1 × 1 pixel PNG. */
export const PNG_1PX = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==',
  'base64',
)

/** The first bytes of a JPEG (SOI and a JFIF APP0 segment), enough for the type check. */
export const JPEG_HEAD = Buffer.from('ffd8ffe000104a46494600010100000100010000ffd9', 'hex')

/** Invented applicant details, unique per call. */
export function applicantFields(overrides: Record<string, string> = {}) {
  const tag = randomBytes(3).toString('hex')
  return {
    legalName: `Thistle & Tallow Trading ${tag} LLC`,
    tradingName: `Thistle & Tallow ${tag}`,
    contactName: 'Wren Calloway',
    contactEmail: `wren.${tag}@thistletallow.test`,
    contactPhone: '(555) 010-7788',
    'billingAddress[line1]': '31 Cooper Lane',
    'billingAddress[city]': 'Ashgrove',
    'billingAddress[region]': 'NH',
    'billingAddress[postalCode]': '03101',
    'billingAddress[country]': 'US',
    shippingSameAsBilling: 'true',
    taxId: `NH-RS-${tag}`,
    storeType: 'Gift shop',
    website: 'thistletallow.test',
    ...overrides,
  }
}

type FileArg = {
  data: Buffer
  filename: string
  contentType?: string
  field?: string
  /** Sends the name as RFC 2231 `filename*` (percent-encoded UTF-8), which can carry any character. */
  encodedName?: boolean
} | null

/**
 * A multipart body built by hand, so the test controls every byte of the file's name (a client
 * library would strip folders or escape characters before the server ever saw them).
 */
export function multipart(fields: Record<string, string>, files: Exclude<FileArg, null>[]) {
  const boundary = `----lathercase${randomBytes(8).toString('hex')}`
  const parts: Buffer[] = []
  for (const [k, v] of Object.entries(fields)) {
    parts.push(
      Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${k}"\r\n\r\n${v}\r\n`, 'utf8'),
    )
  }
  for (const f of files) {
    parts.push(
      Buffer.from(
        `--${boundary}\r\nContent-Disposition: form-data; name="${f.field ?? 'certificate'}"; ${
          f.encodedName ? `filename*=UTF-8''${encodeURIComponent(f.filename)}` : `filename="${f.filename}"`
        }\r\n` + `Content-Type: ${f.contentType ?? 'application/pdf'}\r\n\r\n`,
        'utf8',
      ),
      f.data,
      Buffer.from('\r\n'),
    )
  }
  parts.push(Buffer.from(`--${boundary}--\r\n`))
  return { contentType: `multipart/form-data; boundary=${boundary}`, body: Buffer.concat(parts) }
}

/** Sends the application form as a browser would: multipart text fields and the certificate file. */
export async function apply(
  c: ApiClient,
  fields: Record<string, string>,
  file: FileArg = { data: certificatePdf(), filename: 'certificate.pdf' },
  opts: { method?: 'post' | 'put'; url?: string; extraFiles?: Exclude<FileArg, null>[] } = {},
) {
  const { contentType, body } = multipart(fields, [...(file ? [file] : []), ...(opts.extraFiles ?? [])])
  const token = await c.token()
  return c.agent[opts.method ?? 'post'](opts.url ?? '/api/applications')
    .set('X-CSRF-Token', token)
    .set('Content-Type', contentType)
    .send(body)
}
