/**
 * The same hostile files sent to every route that takes one: a wrong type behind the right
 * extension, markup and script behind an image's name, a file one byte over the limit, an empty
 * file, a PDF carrying script. Each is refused with a 4xx naming the file's field, and nothing
 * is written. Names with folders, traversal and control characters are not refused (DEVELOPERS.md:
 * the stored name is reduced to safe characters), so they are sent with a good file and the kept
 * name, the served type and the Content-Disposition are checked, and who may fetch the file back.
 * (Each route's own cases are in tests/api/applications, shops, products and purchases tests.)
 */
import { QueryTypes } from 'sequelize'
import { beforeAll, describe, expect, it } from 'vitest'
import { CERTIFICATE_MAX_BYTES } from '@shared/schemas/shops'
import { IMPORT_MAX_BYTES } from '@shared/schemas/ingredients'
import { PHOTO_MAX_BYTES } from '@shared/schemas/products'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { ApiClient, clientAs } from '@tests/factories/api-client'
import {
  applicantFields,
  certificatePdf,
  JPEG_HEAD,
  multipart,
  pdfWithCompressedScript,
  PNG_1PX,
} from '@tests/factories/applications'
import { demoShop, makeSellable } from '@tests/factories/fulfilment'
import { binary } from '@tests/factories/responses'
import { dbSnapshot } from './db-state'
import { routeTable } from './route-table'

const app = createApp({ pruneSessions: false, applicationLimits: { perHour: 1000, attemptsPerHour: 1000 } })

type Kind = 'document' | 'image' | 'csv'
type Target = {
  key: string
  url: () => string
  method: 'post' | 'put'
  who: () => ApiClient
  field: string
  kind: Kind
  maxBytes: number
  fields: () => Record<string, string>
}

let owner: ApiClient
/** One visitor for the public form (each new visitor's session would be a row written). */
const visitor = new ApiClient(app)
let buyerA: ApiClient
let buyerB: ApiClient
let packer: ApiClient
let shopA = 0
let productId = 0

const TARGETS: Target[] = [
  {
    key: 'POST /api/applications',
    url: () => '/api/applications',
    method: 'post',
    who: () => visitor,
    field: 'certificate',
    kind: 'document',
    maxBytes: CERTIFICATE_MAX_BYTES,
    fields: () => applicantFields(),
  },
  {
    key: 'PUT /api/shops/mine/certificate',
    url: () => '/api/shops/mine/certificate',
    method: 'put',
    who: () => buyerA,
    field: 'certificate',
    kind: 'document',
    maxBytes: CERTIFICATE_MAX_BYTES,
    fields: () => ({ certificateExpiresOn: '2031-03-31' }),
  },
  {
    key: 'PUT /api/shops/:id/certificate',
    url: () => `/api/shops/${shopA}/certificate`,
    method: 'put',
    who: () => owner,
    field: 'certificate',
    kind: 'document',
    maxBytes: CERTIFICATE_MAX_BYTES,
    fields: () => ({ certificateExpiresOn: '2031-03-31' }),
  },
  {
    key: 'POST /api/products/:id/photo',
    url: () => `/api/products/${productId}/photo`,
    method: 'post',
    who: () => owner,
    field: 'photo',
    kind: 'image',
    maxBytes: PHOTO_MAX_BYTES,
    fields: () => ({}),
  },
  {
    key: 'POST /api/purchases/import/preview',
    url: () => '/api/purchases/import/preview',
    method: 'post',
    who: () => owner,
    field: 'file',
    kind: 'csv',
    maxBytes: IMPORT_MAX_BYTES,
    fields: () => ({}),
  },
  {
    key: 'POST /api/purchases/import/confirm',
    url: () => '/api/purchases/import/confirm',
    method: 'post',
    who: () => owner,
    field: 'file',
    kind: 'csv',
    maxBytes: IMPORT_MAX_BYTES,
    fields: () => ({}),
  },
]

const pad = (head: Buffer, size: number) =>
  Buffer.concat([head, Buffer.alloc(Math.max(0, size - head.length), 0x20)])
const PDF_SCRIPT = certificatePdf('4 0 obj<</Type/Action/S/JavaScript/JS(app.alert\\(1\\))>>endobj\n')
const PDF_ESCAPED_SCRIPT = certificatePdf('4 0 obj<</S/Java#53cript/J#53(app.alert\\(1\\))>>endobj\n')
const SVG = Buffer.from(
  '<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"><script>alert(2)</script></svg>',
)
const HTML = Buffer.from('<!doctype html><html><body><script>alert(document.cookie)</script></body></html>')
const ZIP = Buffer.from('504b0304140000000800', 'hex')
const EXE = Buffer.from('4d5a90000300000004000000ffff0000', 'hex')
const UTF16_CSV = Buffer.from('\ufeffingredient,supplier\n', 'utf16le')

/** The files each kind must refuse: [what, file, name the client claims, type the client claims]. */
function hostileFiles(t: Target): [string, Buffer, string, string][] {
  const ext = { document: 'pdf', image: 'png', csv: 'csv' }[t.kind]
  const claimed = { document: 'application/pdf', image: 'image/png', csv: 'text/csv' }[t.kind]
  const good = { document: certificatePdf(), image: PNG_1PX, csv: Buffer.from('ingredient,supplier\n') }[
    t.kind
  ]
  const files: [string, Buffer, string, string][] = [
    ['an empty file', Buffer.alloc(0), `empty.${ext}`, claimed],
    ['one byte over the limit', pad(good, t.maxBytes + 1), `big.${ext}`, claimed],
    ['HTML with script behind the extension', HTML, `page.${ext}`, claimed],
    ['a program behind the extension', EXE, `setup.${ext}`, claimed],
    ['a zip behind the extension', ZIP, `archive.${ext}`, claimed],
  ]
  if (t.kind !== 'csv')
    files.push([
      'plain text behind the extension',
      Buffer.from('just words, no file\n'),
      `notes.${ext}`,
      claimed,
    ])
  if (t.kind !== 'document') files.push(['a PDF', certificatePdf(), `scan.${ext}`, claimed])
  if (t.kind === 'csv')
    files.push(['a PNG', PNG_1PX, 'image.csv', claimed], ['UTF-16 text', UTF16_CSV, 'excel.csv', claimed])
  files.push(
    ['an SVG with script', SVG, `logo.${ext}`, t.kind === 'image' ? 'image/svg+xml' : claimed],
    ['a PDF with JavaScript', PDF_SCRIPT, `form.${ext}`, claimed],
    ['a PDF with #-escaped JavaScript', PDF_ESCAPED_SCRIPT, `form2.${ext}`, claimed],
    ['a PDF with JavaScript in a compressed stream', pdfWithCompressedScript(), `form3.${ext}`, claimed],
  )
  return files
}

async function send(t: Target, file: Buffer, filename: string, contentType: string) {
  const c = t.who()
  const token = await c.token()
  // A name with line breaks or quotes goes percent-encoded (RFC 2231), as a browser would send it.
  const encodedName = /[\r\n"]/.test(filename)
  const { contentType: type, body } = multipart(t.fields(), [
    { data: file, filename, contentType, field: t.field, encodedName },
  ])
  return c.agent[t.method](t.url()).set('X-CSRF-Token', token).set('Content-Type', type).send(body)
}

beforeAll(async () => {
  ;[owner, buyerA, buyerB, packer] = await Promise.all([
    clientAs(app, 'owner'),
    clientAs(app, 'buyerA'),
    clientAs(app, 'buyerB'),
    clientAs(app, 'packer'),
  ])
  await visitor.token()
  shopA = (await demoShop('A')).shopId
  productId = (await makeSellable(owner, { bars: 12 })).productId
})

describe('hostile files on every upload route', () => {
  it('names only routes the server has', () => {
    const keys = routeTable(app).map((r) => r.key)
    expect(TARGETS.map((t) => t.key).filter((k) => !keys.includes(k))).toEqual([])
  })

  it.each(TARGETS.map((t) => [t.key, t] as const))(
    '%s refuses each with a 4xx on its field and writes nothing',
    async (_k, t) => {
      const problems: string[] = []
      let tried = 0
      for (const [what, file, name, type] of hostileFiles(t)) {
        const before = await dbSnapshot(sequelize)
        const r = await send(t, file, name, type)
        tried++
        const fields = ((r.body?.error?.details ?? []) as { field: string }[]).map((d) => d.field)
        if (r.status < 400 || r.status >= 500)
          problems.push(`${what}: ${r.status} ${JSON.stringify(r.body).slice(0, 200)}`)
        else if (typeof r.body?.error?.message !== 'string' || r.body.error.message.length < 10)
          problems.push(`${what}: ${r.status} without a clear message`)
        else if (!fields.includes(t.field))
          problems.push(`${what}: ${r.status} does not name "${t.field}" (${JSON.stringify(r.body.error)})`)
        // A refused import may write an audit of nothing; the snapshot says it did not.
        if (JSON.stringify(await dbSnapshot(sequelize)) !== JSON.stringify(before))
          problems.push(`${what}: the database changed`)
      }
      expect(problems).toEqual([])
      expect(tried).toBeGreaterThanOrEqual(9)
    },
  )
})

/** Names that try to leave the folder, split the header or hide the extension. */
const TRICKY_NAMES = [
  '../../../../etc/passwd',
  '..\\..\\windows\\system32\\evil.exe',
  '/var/lib/postgresql/x.pdf',
  'C:\\Users\\Public\\cert.pdf',
  'cert.pdf\r\nSet-Cookie: lc.sid=stolen',
  "cert\"; filename*=UTF-8''evil.html",
  'invoice.pdf%00.html',
  'résumé.html.pdf',
  '\u202etxt.exe',
  '.htaccess',
]

describe('tricky file names with a good file', () => {
  it.each(TARGETS.filter((t) => t.kind !== 'csv').map((t) => [t.key, t] as const))(
    '%s keeps a safe name and serves it back with a safe type and disposition, only to those allowed',
    async (_k, t) => {
      for (const name of TRICKY_NAMES) {
        const file = t.kind === 'image' ? (name.includes('exe') ? JPEG_HEAD : PNG_1PX) : certificatePdf()
        const before = await dbSnapshot(sequelize)
        const r = await send(t, file, name, 'application/octet-stream')
        if (r.status >= 400) {
          // A name the multipart parser cannot read is refused on the file's field, with nothing written.
          expect(r.status, name).toBe(400)
          expect(
            r.body.error.details.map((d: { field: string }) => d.field),
            name,
          ).toContain(t.field)
          expect(await dbSnapshot(sequelize), name).toEqual(before)
          continue
        }
        const [kept] = await sequelize.query<{ filename: string; contentType: string }>(
          `SELECT filename, content_type AS "contentType" FROM uploads ORDER BY id DESC LIMIT 1`,
          { type: QueryTypes.SELECT },
        )
        // No folder, no control or direction character, no quote, not hidden, the sniffed type's extension.
        expect(kept!.filename, name).toMatch(
          // eslint-disable-next-line no-control-regex
          /^[^/\\\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069"<>:|?*]+$/,
        )
        expect(kept!.filename, name).not.toMatch(/^\./)
        if (t.kind === 'image') expect(kept!.filename, name).toMatch(/^[A-Za-z0-9._-]+$/)
        expect(kept!.filename.split('.').at(-1), name).toBe(
          { 'application/pdf': 'pdf', 'image/png': 'png', 'image/jpeg': 'jpg' }[kept!.contentType],
        )
      }
    },
  )

  it('a certificate goes back as an attachment of its sniffed type to the owner and its own shop only', async () => {
    const t = TARGETS.find((x) => x.key === 'PUT /api/shops/:id/certificate')!
    expect((await send(t, PNG_1PX, 'cert.pdf\r\nX-Evil: 1', 'application/pdf')).status).toBe(200)
    const url = `/api/shops/${shopA}/certificate`
    for (const [who, c, mine] of [
      ['owner', owner, url],
      ['buyer of A', buyerA, '/api/shops/mine/certificate'],
      ['buyer of A, by id', buyerA, url],
    ] as const) {
      const r = await c.get(mine).buffer(true).parse(binary)
      expect(r.status, who).toBe(200)
      expect(r.headers['content-type'], who).toBe('image/png')
      expect(r.headers['x-content-type-options'], who).toBe('nosniff')
      expect(r.headers['content-disposition'], who).toMatch(/^attachment; filename="[A-Za-z0-9._-]+\.png"/)
      expect(r.headers['content-disposition'], who).not.toMatch(/[\r\n]|X-Evil/)
      expect(r.headers['x-evil'], who).toBeUndefined()
      expect(Buffer.compare(r.body as Buffer, PNG_1PX), who).toBe(0)
    }
    expect((await buyerB.get(url)).status).toBe(404)
    expect((await packer.get(url)).status).toBe(403)
    expect((await new ApiClient(app).get(url)).status).toBe(401)
  })

  it('a product photo goes back inline, as an image, with nosniff, to signed-in people only', async () => {
    const t = TARGETS.find((x) => x.key === 'POST /api/products/:id/photo')!
    // A PNG that carries markup after its image data: served as the PNG it is, never as HTML.
    const polyglot = Buffer.concat([PNG_1PX, HTML])
    expect((await send(t, polyglot, 'photo.html', 'text/html')).status).toBe(200)
    for (const c of [owner, packer, buyerA, buyerB]) {
      const r = await c.get(`/api/products/${productId}/photo`).buffer(true).parse(binary)
      expect(r.status).toBe(200)
      expect(r.headers['content-type']).toBe('image/png')
      expect(r.headers['x-content-type-options']).toBe('nosniff')
      expect(r.headers['content-disposition']).toMatch(/^inline; filename="[A-Za-z0-9._-]+\.png"$/)
    }
    expect((await new ApiClient(app).get(`/api/products/${productId}/photo`)).status).toBe(401)
  })
})
