import { DomainError } from '@shared/domain/errors'

// Comma-separated values as RFC 4180 describes them: fields split by commas, records by line
// breaks (CRLF, and also a bare LF or CR, which spreadsheets on other systems write); a field in
// double quotes may hold commas, line breaks and quotes written twice (""). Two leniencies a
// hand-edited file needs: spaces around a quoted field are ignored, and blank lines are skipped.
// Anything else ambiguous (a quote in the middle of an unquoted field, text after a closing
// quote, a quote left open) is refused with its line number rather than guessed at.

export interface CsvRecord {
  /** The physical line (1-based) on which the record starts. */
  line: number
  fields: string[]
}

const QUOTE = '"'
const COMMA = ','

function isBlank(c: string) {
  return c === ' ' || c === '\t'
}

/** Splits CSV text into records; throws a DomainError on field `csv` naming the line at fault. */
export function parseCsv(text: string): CsvRecord[] {
  const src = text.startsWith('\uFEFF') ? text.slice(1) : text
  const records: CsvRecord[] = []
  let fields: string[] = []
  let field = ''
  let line = 1
  let recordLine = 1
  let i = 0

  const fail = (at: number, message: string): never => {
    throw new DomainError('csv_malformed', `Line ${at}: ${message}`, 'csv')
  }
  const endRecord = () => {
    fields.push(field)
    // A line with nothing on it is not a record (RFC 4180 has no empty records).
    if (!(fields.length === 1 && fields[0] === '')) records.push({ line: recordLine, fields })
    fields = []
    field = ''
  }
  // Consumes a line break at i (CRLF, LF or CR); returns whether there was one.
  const lineBreak = () => {
    if (src[i] === '\r') {
      i += src[i + 1] === '\n' ? 2 : 1
    } else if (src[i] === '\n') {
      i += 1
    } else return false
    line += 1
    return true
  }

  while (i < src.length) {
    // Start of a field: look past leading blanks for an opening quote.
    let j = i
    while (j < src.length && isBlank(src[j]!)) j++
    if (src[j] === QUOTE) {
      const openedOn = line
      i = j + 1
      for (;;) {
        if (i >= src.length) fail(openedOn, 'a quoted field is not closed (a " is missing).')
        const c = src[i]!
        if (c === QUOTE) {
          if (src[i + 1] === QUOTE) {
            field += QUOTE
            i += 2
            continue
          }
          i += 1
          break
        }
        if (c === '\r' || c === '\n') {
          // Line breaks inside quotes belong to the field, written as they were.
          const start = i
          lineBreak()
          field += src.slice(start, i)
          continue
        }
        field += c
        i += 1
      }
      while (i < src.length && isBlank(src[i]!)) i++
      if (i >= src.length) break
      if (src[i] === COMMA) {
        fields.push(field)
        field = ''
        i += 1
        continue
      }
      const breakLine = line
      if (lineBreak()) {
        endRecord()
        recordLine = line
        continue
      }
      fail(breakLine, 'text follows a closing quote; put the whole field in quotes.')
    }

    // An unquoted field runs to the next comma or line break.
    for (;;) {
      if (i >= src.length) break
      const c = src[i]!
      if (c === COMMA || c === '\r' || c === '\n') break
      if (c === QUOTE)
        fail(
          line,
          'a quote mark inside an unquoted field; quote the whole field and write the mark twice ("").',
        )
      field += c
      i += 1
    }
    if (i >= src.length) break
    if (src[i] === COMMA) {
      fields.push(field)
      field = ''
      i += 1
      // A comma at the very end still opens one last (empty) field.
      if (i >= src.length) break
      continue
    }
    lineBreak()
    endRecord()
    recordLine = line
  }
  // The last record needs no line break after it (RFC 4180 §2 rule 2).
  if (field !== '' || fields.length > 0) endRecord()
  return records
}

/** One field as CSV: quoted when it holds a comma, quote, line break or edge spaces. */
export function csvField(value: string): string {
  return /[",\r\n]|^\s|\s$/.test(value) ? `"${value.replaceAll('"', '""')}"` : value
}

/** Records back to CSV text with CRLF line breaks (RFC 4180 §2 rule 1). */
export function toCsv(rows: readonly (readonly string[])[]): string {
  return rows.map((r) => r.map(csvField).join(',')).join('\r\n') + '\r\n'
}
