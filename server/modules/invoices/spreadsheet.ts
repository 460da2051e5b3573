import type { Response } from 'express'

/**
 * Text that a spreadsheet would read as a formula (=, +, -, @, or a leading tab or carriage
 * return) gets a leading apostrophe, so a shop name typed on the public application form cannot
 * run anything in the bookkeeper's spreadsheet (OWASP, "CSV Injection"). Amounts and dates are
 * written by us and never pass through here.
 */
export function spreadsheetSafe(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text
}

/** Sends CSV text as a download named after what it holds and the day it was made. */
export function csvAttachment(res: Response, what: string, csv: string) {
  const day = new Date().toISOString().slice(0, 10)
  res
    .type('text/csv; charset=utf-8')
    .set('Content-Disposition', `attachment; filename="${what}-${day}.csv"`)
    .send(csv)
}
