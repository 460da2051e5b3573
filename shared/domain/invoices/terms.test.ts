import { describe, expect, it } from 'vitest'
import {
  ageing,
  ageingBucket,
  checkInvoiceSeries,
  dueDate,
  earlyPaymentDiscount,
  formatInvoiceNumber,
  invoiceStatus,
  parseInvoiceNumber,
  type InvoiceAmounts,
  type PaymentTerms,
} from '@shared/domain/invoices/terms'

describe('dueDate', () => {
  it.each([
    {
      issue: '2026-12-01',
      terms: 'net_30',
      expected: '2026-12-31',
      source: 'REFERENCES: net 30, due 30 days after the invoice date (common practice)',
    },
    {
      issue: '2026-12-15',
      terms: 'net_30',
      expected: '2027-01-14',
      source: 'REFERENCES: net 30; hand calculation across the year end',
    },
    {
      issue: '2027-02-01',
      terms: 'net_30',
      expected: '2027-03-03',
      source: 'REFERENCES: net 30; hand calculation, 28-day February',
    },
    { issue: '2026-12-01', terms: 'net_15', expected: '2026-12-16', source: 'common practice: net 15' },
    {
      issue: '2026-12-01',
      terms: 'prepay',
      expected: '2026-12-01',
      source: 'common practice: prepay is due on issue',
    },
  ] as { issue: string; terms: PaymentTerms; expected: string; source: string }[])(
    '$issue on $terms → $expected ($source)',
    ({ issue, terms, expected }) => {
      expect(dueDate(issue, terms)).toBe(expected)
    },
  )

  it.each([
    { issue: '2026-12-01', terms: 'net_60', code: 'invalid_terms', source: 'bad input' },
    { issue: '2026-02-30', terms: 'net_30', code: 'invalid_date', source: 'bad input' },
  ])('rejects $issue on $terms with $code ($source)', ({ issue, terms, code }) => {
    expect(() => dueDate(issue, terms as PaymentTerms)).toThrow(expect.objectContaining({ code }))
  })
})

describe('invoiceStatus', () => {
  const due = '2026-12-31'
  it.each([
    {
      total: 31343,
      paid: 0,
      today: '2026-12-01',
      voided: false,
      expected: 'open',
      source: 'hand calculation',
    },
    {
      total: 31343,
      paid: 10000,
      today: '2026-12-01',
      voided: false,
      expected: 'part_paid',
      source: 'hand calculation',
    },
    {
      total: 31343,
      paid: 31343,
      today: '2026-12-01',
      voided: false,
      expected: 'paid',
      source: 'hand calculation',
    },
    {
      total: 31343,
      paid: 40000,
      today: '2026-12-01',
      voided: false,
      expected: 'paid',
      source: 'hand calculation: overpaid',
    },
    {
      total: 31343,
      paid: 0,
      today: '2026-12-31',
      voided: false,
      expected: 'open',
      source: 'product rule: due on the due date, not late',
    },
    {
      total: 31343,
      paid: 0,
      today: '2027-01-01',
      voided: false,
      expected: 'overdue',
      source: 'product rule: late from the next day',
    },
    {
      total: 31343,
      paid: 10000,
      today: '2027-01-01',
      voided: false,
      expected: 'overdue',
      source: 'product rule: overdue outranks part paid',
    },
    {
      total: 31343,
      paid: 31343,
      today: '2027-03-01',
      voided: false,
      expected: 'paid',
      source: 'hand calculation: paid is never late',
    },
    {
      total: 31343,
      paid: 0,
      today: '2027-03-01',
      voided: true,
      expected: 'void',
      source: 'product rule: void outranks all',
    },
    {
      total: 0,
      paid: 0,
      today: '2026-12-01',
      voided: false,
      expected: 'paid',
      source: 'hand calculation: nothing owed',
    },
  ])(
    '$total owed, $paid paid, $today, void $voided → $expected ($source)',
    ({ total, paid, today, voided, expected }) => {
      expect(invoiceStatus({ totalCents: total, paidCents: paid, dueDate: due, voided }, today)).toBe(
        expected,
      )
    },
  )

  it.each([
    { total: -1, paid: 0, field: 'totalCents', source: 'bad input' },
    { total: 100, paid: 0.5, field: 'paidCents', source: 'bad input: part of a cent' },
  ])('rejects $total / $paid ($source)', ({ total, paid, field }) => {
    expect(() =>
      invoiceStatus({ totalCents: total, paidCents: paid, dueDate: due, voided: false }, due),
    ).toThrow(expect.objectContaining({ code: 'invalid_amount', field }))
  })
})

describe('ageingBucket', () => {
  const due = '2026-12-31'
  it.each([
    { today: '2026-12-01', expected: 'current', source: 'hand calculation: not yet due' },
    { today: '2026-12-31', expected: 'current', source: 'hand calculation: due today' },
    { today: '2027-01-01', expected: '1_30', source: 'hand calculation: 1 day late' },
    { today: '2027-01-30', expected: '1_30', source: 'hand calculation: 30 days late' },
    { today: '2027-01-31', expected: '31_60', source: 'hand calculation: 31 days late' },
    { today: '2027-03-01', expected: '31_60', source: 'hand calculation: 60 days late' },
    { today: '2027-03-02', expected: '61_90', source: 'hand calculation: 61 days late' },
    { today: '2027-03-31', expected: '61_90', source: 'hand calculation: 90 days late' },
    { today: '2027-04-01', expected: 'over_90', source: 'hand calculation: 91 days late' },
  ])('due $due, today $today → $expected ($source)', ({ today, expected }) => {
    expect(ageingBucket(due, today)).toBe(expected)
  })
})

describe('ageing', () => {
  const today = '2027-02-15'
  it.each([
    {
      invoices: [],
      expected: { current: 0, '1_30': 0, '31_60': 0, '61_90': 0, over_90: 0 },
      total: 0,
      source: 'hand calculation',
    },
    {
      invoices: [
        { totalCents: 10000, paidCents: 0, dueDate: '2027-03-01', voided: false },
        { totalCents: 20000, paidCents: 5000, dueDate: '2027-02-01', voided: false },
        { totalCents: 7000, paidCents: 0, dueDate: '2027-01-31', voided: false },
        { totalCents: 9000, paidCents: 9000, dueDate: '2026-10-01', voided: false },
        { totalCents: 8000, paidCents: 0, dueDate: '2026-10-01', voided: true },
        { totalCents: 4000, paidCents: 1000, dueDate: '2026-11-01', voided: false },
      ],
      expected: { current: 10000, '1_30': 22000, '31_60': 0, '61_90': 0, over_90: 3000 },
      total: 35000,
      source: 'hand calculation: 15000 + 7000 late 14–15 days; 3000 late 106 days; paid and void add nothing',
    },
  ] as { invoices: InvoiceAmounts[]; expected: Record<string, number>; total: number; source: string }[])(
    '$source',
    ({ invoices, expected, total }) => {
      expect(ageing(invoices, today)).toEqual({ byBucket: expected, outstandingCents: total })
    },
  )
})

describe('earlyPaymentDiscount', () => {
  const base = { totalCents: 31343, issueDate: '2026-12-01', discountPct: 2, discountDays: 10 }
  it.each([
    { paidOn: '2026-12-05', expected: 627, source: 'REFERENCES: 2/10 net 30; hand calculation 626.86 → 627' },
    {
      paidOn: '2026-12-11',
      expected: 627,
      source: 'REFERENCES: 2/10 net 30; day 10 counts (common practice)',
    },
    { paidOn: '2026-12-12', expected: 0, source: 'REFERENCES: 2/10 net 30; day 11 is too late' },
    { paidOn: '2026-12-01', expected: 627, source: 'REFERENCES: 2/10 net 30; paid on issue' },
  ])('paid $paidOn → $expected ¢ off ($source)', ({ paidOn, expected }) => {
    expect(earlyPaymentDiscount({ ...base, paidOn })).toBe(expected)
  })

  it('rounds half up: 2 % of 1025 = 20.5 → 21 (hand calculation)', () => {
    expect(earlyPaymentDiscount({ ...base, totalCents: 1025, paidOn: '2026-12-02' })).toBe(21)
  })

  it.each([
    { overrides: { discountPct: -2 }, code: 'invalid_discount', source: 'bad input' },
    { overrides: { discountPct: 120 }, code: 'invalid_discount', source: 'bad input' },
    { overrides: { discountDays: 1.5 }, code: 'invalid_days', source: 'bad input' },
    { overrides: { totalCents: -100 }, code: 'invalid_amount', source: 'bad input' },
    { overrides: { paidOn: 'soon' }, code: 'invalid_date', source: 'bad input' },
  ])('rejects $overrides with $code ($source)', ({ overrides, code }) => {
    expect(() => earlyPaymentDiscount({ ...base, paidOn: '2026-12-05', ...overrides })).toThrow(
      expect.objectContaining({ code }),
    )
  })
})

describe('formatInvoiceNumber and parseInvoiceNumber', () => {
  it.each([
    { year: 2026, seq: 123, prefix: '', expected: '2026-000123', source: 'product format' },
    {
      year: 2027,
      seq: 1,
      prefix: '',
      expected: '2027-000001',
      source: 'product format: a new series each year',
    },
    {
      year: 2026,
      seq: 999999,
      prefix: 'SB',
      expected: 'SB-2026-999999',
      source: 'product format with prefix',
    },
  ])('$year / $seq / "$prefix" → $expected ($source)', ({ year, seq, prefix, expected }) => {
    expect(formatInvoiceNumber(year, seq, prefix)).toBe(expected)
    expect(parseInvoiceNumber(expected, prefix)).toEqual({ year, seq })
  })

  it.each([
    { year: 2026, seq: 0, prefix: '', code: 'invalid_sequence', source: 'bad input: the series starts at 1' },
    { year: 2026, seq: 1_000_000, prefix: '', code: 'invalid_sequence', source: 'bad input' },
    { year: 26, seq: 1, prefix: '', code: 'invalid_year', source: 'bad input: four-digit year' },
    { year: 2026, seq: 1, prefix: 'sb', code: 'invalid_prefix', source: 'bad input: capitals only' },
    { year: 2026, seq: 1, prefix: '1SB', code: 'invalid_prefix', source: 'bad input: starts with a letter' },
    {
      year: 2026,
      seq: 1,
      prefix: 'STUDIO1',
      code: 'invalid_prefix',
      source: 'bad input: too long for the label',
    },
  ])('rejects $year / $seq / "$prefix" with $code ($source)', ({ year, seq, prefix, code }) => {
    expect(() => formatInvoiceNumber(year, seq, prefix)).toThrow(expect.objectContaining({ code }))
  })

  it.each([
    {
      text: ' sb-2026-000123 ',
      prefix: 'SB',
      expected: { year: 2026, seq: 123 },
      source: 'product rule: typed in any case',
    },
    { text: '2026-000123', prefix: 'SB', expected: null, source: 'bad input: prefix missing' },
    { text: 'SB-2026-000123', prefix: '', expected: null, source: 'bad input: unexpected prefix' },
    { text: '2026-123', prefix: '', expected: null, source: 'bad input: sequence not padded' },
    { text: '2026-000000', prefix: '', expected: null, source: 'bad input: sequence 0' },
    {
      text: 'O26-00042',
      prefix: '',
      expected: null,
      source: 'product format: an order number is not an invoice number',
    },
  ])('"$text" with "$prefix" → $expected ($source)', ({ text, prefix, expected }) => {
    expect(parseInvoiceNumber(text, prefix)).toEqual(expected)
  })
})

describe('checkInvoiceSeries', () => {
  it.each([
    { seqs: [], expected: { missing: [], duplicated: [] }, source: 'hand calculation: nothing issued' },
    {
      seqs: [3, 1, 2],
      expected: { missing: [], duplicated: [] },
      source: 'Council Directive 2006/112/EC Art. 226(2): sequential',
    },
    { seqs: [1, 2, 5], expected: { missing: [3, 4], duplicated: [] }, source: 'hand calculation: a gap' },
    {
      seqs: [1, 2, 2, 3, 3],
      expected: { missing: [], duplicated: [2, 3] },
      source: 'Council Directive 2006/112/EC Art. 226(2): unique',
    },
  ])('$seqs → $expected ($source)', ({ seqs, expected }) => {
    expect(checkInvoiceSeries(seqs)).toEqual(expected)
  })

  it('rejects a bad sequence (bad input)', () => {
    expect(() => checkInvoiceSeries([1, 0])).toThrow(
      expect.objectContaining({ code: 'invalid_sequence', field: 'seqs.1' }),
    )
  })
})
