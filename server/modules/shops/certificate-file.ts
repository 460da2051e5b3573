import { createHash } from 'node:crypto'
import { inflateSync } from 'node:zlib'
import type { Request, RequestHandler } from 'express'
import multer from 'multer'
import type { z } from 'zod'
import { CERTIFICATE_FIELD, CERTIFICATE_MAX_BYTES } from '@shared/schemas/shops'
import type { CertificateContentType } from '@shared/schemas/shops'
import { issuesToDetails } from '@shared/schemas/errors'
import type { ErrorDetail } from '@shared/schemas/errors'
import { AppError } from '@server/lib/app-error'
import { nulCharacterDetails } from '@server/middlewares/validate'

/** A checked certificate, ready to be stored in `uploads`. */
export type CertificateUpload = {
  filename: string
  contentType: CertificateContentType
  sizeBytes: number
  sha256: string
  data: Buffer
}

const EXTENSION: Record<CertificateContentType, string> = {
  'application/pdf': '.pdf',
  'image/jpeg': '.jpg',
  'image/png': '.png',
}

const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])

/** The type from the file's first bytes (its magic number); the name and the client's type are ignored. */
export function sniffCertificateType(data: Buffer): CertificateContentType | null {
  if (data.subarray(0, 5).toString('latin1') === '%PDF-') return 'application/pdf'
  if (data.length >= 3 && data[0] === 0xff && data[1] === 0xd8 && data[2] === 0xff) return 'image/jpeg'
  if (data.subarray(0, 8).equals(PNG_SIGNATURE)) return 'image/png'
  return null
}

// PDF delimiters and white space end a name; anything else belongs to it (ISO 32000-1, 7.2.2 and 7.3.5).
const NAME = /\/[^\s()<>[\]{}/%]*/g
const SCRIPT_NAME = /\/(?:JavaScript|JS)(?![^\s()<>[\]{}/%])/

function hasScriptName(text: string): boolean {
  // A name may spell its letters as #xx (ISO 32000-1, 7.3.5): /J#53 is /JS.
  const decoded = text.replace(NAME, (name) =>
    name.replace(/#([0-9a-fA-F]{2})/g, (_m, hex: string) => String.fromCharCode(parseInt(hex, 16))),
  )
  return SCRIPT_NAME.test(decoded)
}

const MAX_INFLATED = 20 * 1024 * 1024

/**
 * True when a PDF names JavaScript (`/JavaScript` or `/JS`) anywhere: in its plain objects or in a
 * Flate-compressed stream (object streams hide dictionaries there). Streams that do not inflate are
 * left as they are; the inflated total is capped so a small file cannot expand without bound.
 */
export function pdfHasJavaScript(data: Buffer): boolean {
  const text = data.toString('latin1')
  if (hasScriptName(text)) return true
  let budget = MAX_INFLATED
  const streams = /stream\r?\n/g
  for (let m = streams.exec(text); m; m = streams.exec(text)) {
    const start = m.index + m[0].length
    const end = text.indexOf('endstream', start)
    if (end < 0) break
    streams.lastIndex = end + 'endstream'.length
    if (budget <= 0) return true // too much compressed content to inspect: refuse rather than guess
    try {
      const inflated = inflateSync(data.subarray(start, end), { maxOutputLength: budget })
      budget -= inflated.length
      if (hasScriptName(inflated.toString('latin1'))) return true
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'ERR_BUFFER_TOO_LARGE') return true
      // Not Flate data (an image, say): nothing to read in it.
    }
  }
  return false
}

/**
 * The name to keep: no folders (either slash), no control characters, no leading dots, at most 200
 * characters, and an extension that matches the sniffed type (a PNG sent as "cert.pdf" is kept as
 * "cert.png", so a download opens in the right program).
 */
export function sanitiseFilename(original: string, type: CertificateContentType): string {
  const base = original.split(/[/\\]/).pop() ?? ''
  const cleaned = base
    // eslint-disable-next-line no-control-regex
    .replace(/[\u0000-\u001f\u007f-\u009f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g, '')
    .replace(/["<>:|?*]/g, '')
    .replace(/\s+/g, ' ')
    .trim()
  const dot = cleaned.lastIndexOf('.')
  const stem =
    (dot >= 0 ? cleaned.slice(0, dot) : cleaned).replace(/^[.\s]+/, '').trim() || 'resale-certificate'
  const ext = EXTENSION[type]
  return `${stem.slice(0, 200 - ext.length)}${ext}`
}

/** Checks a received file; problems come back as field details (the file is never trusted). */
export function checkCertificate(
  file: { originalname: string; buffer: Buffer } | undefined,
  required: boolean,
): { upload: CertificateUpload | null; problems: ErrorDetail[] } {
  const field = CERTIFICATE_FIELD
  if (!file) {
    return {
      upload: null,
      problems: required ? [{ field, message: 'Attach the resale certificate (PDF, JPEG or PNG).' }] : [],
    }
  }
  if (file.buffer.length === 0) return { upload: null, problems: [{ field, message: 'The file is empty.' }] }
  const contentType = sniffCertificateType(file.buffer)
  if (!contentType) {
    return {
      upload: null,
      problems: [{ field, message: 'The certificate must be a PDF, JPEG or PNG file.' }],
    }
  }
  if (contentType === 'application/pdf' && pdfHasJavaScript(file.buffer)) {
    return {
      upload: null,
      problems: [{ field, message: 'This PDF contains JavaScript. Print it to a new PDF or send a scan.' }],
    }
  }
  return {
    upload: {
      filename: sanitiseFilename(file.originalname, contentType),
      contentType,
      sizeBytes: file.buffer.length,
      sha256: createHash('sha256').update(file.buffer).digest('hex'),
      data: file.buffer,
    },
    problems: [],
  }
}

const upload = multer({
  storage: multer.memoryStorage(),
  // Browsers send file names as raw UTF-8.
  defParamCharset: 'utf8',
  limits: { fileSize: CERTIFICATE_MAX_BYTES, files: 1, fields: 60, fieldSize: 10_000, parts: 70 },
}).single(CERTIFICATE_FIELD)

/** Reads a multipart body with at most one `certificate` file; over 5 MB → 413 with the field. */
export const receiveCertificate: RequestHandler = (req, res, next) => {
  upload(req, res, (err: unknown) => {
    if (!err) return next()
    const e = err as { code?: string; field?: string; message?: string }
    if (e.code === 'LIMIT_FILE_SIZE') {
      const message = 'The certificate is larger than 5 MB. Send a smaller scan or a PDF.'
      return next(new AppError(413, 'payload_too_large', message, [{ field: CERTIFICATE_FIELD, message }]))
    }
    if (e.code === 'LIMIT_UNEXPECTED_FILE' || e.code === 'LIMIT_FILE_COUNT') {
      return next(
        AppError.field(e.field || CERTIFICATE_FIELD, `Send one file, in the field "${CERTIFICATE_FIELD}".`),
      )
    }
    if (typeof e.code === 'string' && e.code.startsWith('LIMIT_')) {
      return next(AppError.invalid(`The form is too large: ${e.message ?? 'too many fields'}.`))
    }
    // The multipart parser's own complaints (a malformed header, a body cut short) are the client's.
    if (!(err instanceof AppError) && err instanceof Error) {
      return next(AppError.invalid('The form data could not be read. Send it again from the form.'))
    }
    next(err)
  })
}

declare module 'express-serve-static-core' {
  interface Request {
    /** The checked certificate after `validateWithCertificate`; null when none was sent and none was required. */
    certificate?: CertificateUpload | null
  }
}

/**
 * validate() for a multipart body: the text fields against their schema and the file, every
 * problem at once. The parsed fields land in `req.valid.body`, the file in `req.certificate`.
 */
export function validateWithCertificate(schema: z.ZodType, opts: { required: boolean }): RequestHandler {
  return (req, _res, next) => {
    const nul = nulCharacterDetails(req.body ?? {})
    const parsed = schema.safeParse(req.body ?? {})
    const details = nul.length > 0 ? nul : parsed.success ? [] : issuesToDetails(parsed.error.issues)
    const { upload: file, problems } = checkCertificate(req.file, opts.required)
    details.push(...problems)
    if (details.length > 0) {
      const first = details[0]!
      return next(
        AppError.invalid(
          details.length === 1 ? `${first.field}: ${first.message}` : 'Some fields need attention.',
          details,
        ),
      )
    }
    req.valid = { ...req.valid, body: parsed.data }
    req.certificate = file
    next()
  }
}

export function certificateOf(req: Request): CertificateUpload {
  if (!req.certificate)
    throw AppError.field(CERTIFICATE_FIELD, 'Attach the resale certificate (PDF, JPEG or PNG).')
  return req.certificate
}

/** Content-Disposition for a download: an ASCII fallback and the UTF-8 name (RFC 6266, RFC 8187). */
export function attachmentHeader(filename: string): string {
  const ascii = filename.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_')
  const encoded = encodeURIComponent(filename).replace(
    /['()*]/g,
    (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`,
  )
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encoded}`
}
