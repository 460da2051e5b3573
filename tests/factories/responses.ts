import fs from 'node:fs'
import path from 'node:path'
import type { Response } from 'superagent'
import { PDFParse } from 'pdf-parse'

/** The response, after checking its status (its body is shown when the status differs). */
export function expectStatus<R extends { status: number; body: unknown }>(r: R, expected: number): R {
  if (r.status !== expected)
    throw new Error(`expected ${expected}, got ${r.status}: ${JSON.stringify(r.body)}`)
  return r
}

/** A supertest parser that keeps the body as bytes (PDFs, CSV as sent). */
export function binary(res: Response, done: (err: Error | null, body: Buffer) => void) {
  // In node, superagent hands the parser the raw response stream.
  const stream = res as unknown as NodeJS.ReadableStream
  const chunks: Buffer[] = []
  stream.on('data', (c: Buffer) => chunks.push(c))
  stream.on('end', () => done(null, Buffer.concat(chunks)))
}

/** The text of a PDF, as pdf-parse 2 extracts it. */
export async function pdfText(buffer: Buffer): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(buffer) })
  try {
    return (await parser.getText()).text
  } finally {
    await parser.destroy()
  }
}

/** Saves a document under test-results/pdf, to be looked at (pdftoppm) after the run. */
export function keepPdf(name: string, pdf: Buffer) {
  const dir = path.resolve('test-results', 'pdf')
  fs.mkdirSync(dir, { recursive: true })
  fs.writeFileSync(path.join(dir, name), pdf)
}
