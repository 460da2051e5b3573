import { describe, expect, it } from 'vitest'
import { spreadsheetSafe } from '@server/modules/invoices/spreadsheet'

describe('spreadsheetSafe', () => {
  // OWASP, "CSV Injection": cells starting with =, +, -, @, tab or carriage return are read as formulas.
  it.each([
    ['=HYPERLINK("x")', `'=HYPERLINK("x")`, 'OWASP CSV Injection: leading ='],
    ['+1 555 0100', `'+1 555 0100`, 'OWASP CSV Injection: leading +'],
    ['-2+3', `'-2+3`, 'OWASP CSV Injection: leading -'],
    ['@SUM(A1)', `'@SUM(A1)`, 'OWASP CSV Injection: leading @'],
    ['\tcmd', `'\tcmd`, 'OWASP CSV Injection: leading tab'],
    ['\rcmd', `'\rcmd`, 'OWASP CSV Injection: leading carriage return'],
    ['Juniper & Vine', 'Juniper & Vine', 'plain text is left alone (common practice)'],
    ['PO-2231', 'PO-2231', 'a hyphen inside the text is harmless (common practice)'],
    ['', '', 'empty stays empty'],
  ])('%j → %j (%s)', (input, expected) => {
    expect(spreadsheetSafe(input)).toBe(expected)
  })
})
