import { describe, expect, it } from 'vitest'
import { DomainError } from '@shared/domain/errors'
import { csvField, parseCsv, toCsv } from '@shared/domain/csv/csv'

const fields = (text: string) => parseCsv(text).map((r) => r.fields)

describe('parseCsv', () => {
  it.each([
    // RFC 4180 §2 rule 1: records on separate lines, delimited by CRLF
    {
      text: 'aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n',
      rows: [
        ['aaa', 'bbb', 'ccc'],
        ['zzz', 'yyy', 'xxx'],
      ],
      source: 'RFC 4180 §2 rule 1',
    },
    // rule 2: the last record may or may not end with a line break
    {
      text: 'aaa,bbb,ccc\r\nzzz,yyy,xxx',
      rows: [
        ['aaa', 'bbb', 'ccc'],
        ['zzz', 'yyy', 'xxx'],
      ],
      source: 'RFC 4180 §2 rule 2',
    },
    // rule 4: spaces are part of a field; the last field is not followed by a comma
    { text: 'aaa, bbb ,ccc', rows: [['aaa', ' bbb ', 'ccc']], source: 'RFC 4180 §2 rule 4' },
    // rule 5: fields may be enclosed in double quotes
    {
      text: '"aaa","bbb","ccc"\r\nzzz,yyy,xxx',
      rows: [
        ['aaa', 'bbb', 'ccc'],
        ['zzz', 'yyy', 'xxx'],
      ],
      source: 'RFC 4180 §2 rule 5',
    },
    // rule 6: line breaks, quotes and commas inside a quoted field
    {
      text: '"aaa","b\r\nbb","ccc"\r\nzzz,yyy,xxx',
      rows: [
        ['aaa', 'b\r\nbb', 'ccc'],
        ['zzz', 'yyy', 'xxx'],
      ],
      source: 'RFC 4180 §2 rule 6',
    },
    { text: '"Cedar, sage",x', rows: [['Cedar, sage', 'x']], source: 'RFC 4180 §2 rule 6' },
    // rule 7: a quote inside a quoted field is written twice
    { text: '"aaa","b""bb","ccc"', rows: [['aaa', 'b"bb', 'ccc']], source: 'RFC 4180 §2 rule 7' },
    { text: '""', rows: [], source: 'RFC 4180 §2 rule 7 (an empty quoted field alone is a blank line)' },
    { text: 'a,"",c', rows: [['a', '', 'c']], source: 'RFC 4180 §2 rules 5 and 7' },
    // empty fields, a trailing comma opens one more empty field
    {
      text: 'a,,c\r\n,,',
      rows: [
        ['a', '', 'c'],
        ['', '', ''],
      ],
      source: 'RFC 4180 §2 rule 4',
    },
    { text: 'a,b,\r\n', rows: [['a', 'b', '']], source: 'RFC 4180 §2 rule 4' },
    // leniencies beyond the RFC for files edited by hand or on other systems
    {
      text: 'a,b\nc,d\n',
      rows: [
        ['a', 'b'],
        ['c', 'd'],
      ],
      source: 'bare LF line breaks (common practice)',
    },
    {
      text: 'a,b\rc,d',
      rows: [
        ['a', 'b'],
        ['c', 'd'],
      ],
      source: 'bare CR line breaks (common practice)',
    },
    {
      text: 'a,b\r\n\r\n\r\nc,d\r\n\r\n',
      rows: [
        ['a', 'b'],
        ['c', 'd'],
      ],
      source: 'blank lines skipped (common practice)',
    },
    {
      text: 'a, "b,c" ,d',
      rows: [['a', 'b,c', 'd']],
      source: 'spaces around a quoted field (common practice)',
    },
    {
      text: '\uFEFFingredient,unit\r\nOlive oil,kg',
      rows: [
        ['ingredient', 'unit'],
        ['Olive oil', 'kg'],
      ],
      source: 'UTF-8 byte order mark, as spreadsheets save it',
    },
    { text: '', rows: [], source: 'hand calculation' },
    {
      text: 'Lavender essential oil,"$1,234.56"',
      rows: [['Lavender essential oil', '$1,234.56']],
      source: 'RFC 4180 §2 rule 6',
    },
  ])('$source: $text', ({ text, rows }) => {
    expect(fields(text)).toEqual(rows)
  })

  it('numbers each record by the line it starts on, counting line breaks inside quotes (hand calculation)', () => {
    const records = parseCsv('h1,h2\r\n"two\r\nlines",x\r\n\r\nlast,y')
    expect(records.map((r) => r.line)).toEqual([1, 2, 5])
  })

  it.each([
    {
      text: 'a,"bbb\r\nccc',
      line: 1,
      what: 'not closed',
      source: 'RFC 4180 §2 rule 5 (a quoted field ends with a quote)',
    },
    {
      text: 'ok,ok\r\na,b"c',
      line: 2,
      what: 'quote mark inside an unquoted field',
      source: 'RFC 4180 §2 rule 5 (quotes may not appear inside unquoted fields)',
    },
    {
      text: 'ok\r\nok\r\n"abc"def,x',
      line: 3,
      what: 'follows a closing quote',
      source: 'RFC 4180 §2 rule 7',
    },
  ])('refuses $what on line $line ($source)', ({ text, line, what }) => {
    const call = () => parseCsv(text)
    expect(call).toThrow(DomainError)
    expect(call).toThrow(
      expect.objectContaining({ field: 'csv', message: expect.stringContaining(`Line ${line}:`) }),
    )
    expect(call).toThrow(new RegExp(what))
  })
})

describe('csvField / toCsv', () => {
  it.each([
    { value: 'plain', out: 'plain', source: 'RFC 4180 §2 rule 5 (quotes optional)' },
    { value: 'a,b', out: '"a,b"', source: 'RFC 4180 §2 rule 6' },
    { value: 'say "hi"', out: '"say ""hi"""', source: 'RFC 4180 §2 rule 7' },
    { value: 'two\nlines', out: '"two\nlines"', source: 'RFC 4180 §2 rule 6' },
    { value: ' padded', out: '" padded"', source: 'kept through our own lenient parse (hand calculation)' },
  ])('$value → $out ($source)', ({ value, out }) => {
    expect(csvField(value)).toBe(out)
  })

  it('round-trips through parseCsv (hand calculation)', () => {
    const rows = [
      ['ingredient', 'supplier', 'cost'],
      ['Cedar & sage fragrance', 'Hillside "North" Aromatics', '1,034.00'],
      ['Olive oil', 'Line\r\nbreak', ' 12 '],
    ]
    const text = toCsv(rows)
    expect(text.endsWith('\r\n')).toBe(true)
    expect(fields(text)).toEqual(rows)
  })
})
