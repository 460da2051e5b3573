import { describe, expect, it } from 'vitest'
import {
  isCertificateValid,
  priceOrder,
  shippingFor,
  unitPriceFor,
  validateOrderLines,
  validateShippingBands,
  type OrderPricingInput,
  type PricingLine,
  type ShippingBand,
} from '@shared/domain/orders/order-pricing'

const bands: ShippingBand[] = [
  { maxWeightG: 2000, rateCents: 1200 },
  { maxWeightG: 5000, rateCents: 1800 },
  { maxWeightG: 10000, rateCents: 2600 },
  { maxWeightG: null, rateCents: 3900 },
]

const lavender: PricingLine = {
  productId: 1,
  cases: 3,
  casePack: 12,
  netWeightG: 113,
  breaks: [
    { minCases: 1, unitPriceCents: 650 },
    { minCases: 3, unitPriceCents: 600 },
    { minCases: 6, unitPriceCents: 560 },
  ],
}
const oatmeal: PricingLine = {
  productId: 2,
  cases: 1,
  casePack: 6,
  netWeightG: 142,
  breaks: [{ minCases: 1, unitPriceCents: 800 }],
}

function input(overrides: Partial<OrderPricingInput> = {}): OrderPricingInput {
  return {
    lines: [lavender, oatmeal],
    isOpeningOrder: false,
    openingMinimumCents: 30000,
    reorderMinimumCents: 15000,
    shippingBands: bands,
    packagingWeightPerCaseG: 150,
    taxRatePct: 8.875,
    taxExempt: false,
    ...overrides,
  }
}

/** One line of 10 bars at $1.00: a subtotal of exactly 1000 cents. */
function tenDollars(overrides: Partial<OrderPricingInput> = {}): OrderPricingInput {
  return input({
    lines: [
      {
        productId: 9,
        cases: 1,
        casePack: 10,
        netWeightG: 100,
        breaks: [{ minCases: 1, unitPriceCents: 100 }],
      },
    ],
    ...overrides,
  })
}

describe('priceOrder: a worked order', () => {
  it('prices each line at its own break, weighs, ships, taxes (hand calculation)', () => {
    expect(priceOrder(input())).toEqual({
      lines: [
        // 3 cases × 12 = 36 bars at the 3-case break of 600; 36 × 113 g + 3 × 150 g packaging
        { productId: 1, cases: 3, bars: 36, unitPriceCents: 600, lineTotalCents: 21600, weightG: 4518 },
        // 1 case × 6 = 6 bars at 800; 6 × 142 g + 150 g
        { productId: 2, cases: 1, bars: 6, unitPriceCents: 800, lineTotalCents: 4800, weightG: 1002 },
      ],
      subtotalCents: 26400,
      weightG: 5520,
      shippingCents: 2600, // 5520 g falls in the 5001–10000 g band
      taxCents: 2343, // 8.875 % of 26400 = 2343.0; shipping untaxed
      totalCents: 31343,
      minimumCents: 15000,
      belowMinimumByCents: 0,
    })
  })
})

describe('priceOrder: price breaks', () => {
  it.each([
    { cases: 1, expected: 650, source: 'hand calculation: first break' },
    { cases: 2, expected: 650, source: 'hand calculation: below the 3-case break' },
    { cases: 3, expected: 600, source: 'hand calculation: exactly on a break' },
    { cases: 5, expected: 600, source: 'hand calculation' },
    { cases: 6, expected: 560, source: 'hand calculation' },
    { cases: 40, expected: 560, source: 'hand calculation: above the last break' },
  ])('$cases cases → $expected ¢ a bar ($source)', ({ cases, expected }) => {
    const priced = priceOrder(input({ lines: [{ ...lavender, cases }] }))
    expect(priced.lines[0]?.unitPriceCents).toBe(expected)
    expect(priced.lines[0]?.lineTotalCents).toBe(expected * cases * 12)
  })

  it('ignores the order of the breaks (hand calculation)', () => {
    expect(unitPriceFor([...lavender.breaks].reverse(), 4)).toBe(600)
  })
})

describe('priceOrder: minimums', () => {
  it.each([
    {
      opening: true,
      expected: { minimumCents: 30000, belowMinimumByCents: 3600 },
      source: 'hand calculation: 30000 − 26400',
    },
    {
      opening: false,
      expected: { minimumCents: 15000, belowMinimumByCents: 0 },
      source: 'hand calculation: reorder met',
    },
  ])('opening order $opening ($source)', ({ opening, expected }) => {
    expect(priceOrder(input({ isOpeningOrder: opening }))).toMatchObject(expected)
  })

  it('compares the minimum with merchandise only, not shipping or tax (common practice)', () => {
    const priced = priceOrder(input({ reorderMinimumCents: 26401 }))
    expect(priced.totalCents).toBeGreaterThan(26401)
    expect(priced.belowMinimumByCents).toBe(1)
  })
})

describe('priceOrder: tax', () => {
  it.each([
    { rate: 8.875, exempt: false, tax: 89, source: 'hand calculation: 88.75 rounds half up' },
    { rate: 7.25, exempt: false, tax: 73, source: 'hand calculation: 72.5 rounds half up' },
    { rate: 7.24, exempt: false, tax: 72, source: 'hand calculation: 72.4 rounds down' },
    { rate: 0, exempt: false, tax: 0, source: 'hand calculation: no sales tax' },
    {
      rate: 8.875,
      exempt: true,
      tax: 0,
      source: 'common practice: resale certificate on file makes it exempt',
    },
  ])('$rate % exempt $exempt on $10.00 → $tax ¢ ($source)', ({ rate, exempt, tax }) => {
    const priced = priceOrder(tenDollars({ taxRatePct: rate, taxExempt: exempt }))
    expect(priced.taxCents).toBe(tax)
    expect(priced.totalCents).toBe(priced.subtotalCents + priced.shippingCents + tax)
  })

  it('a true half survives binary noise: 1.15 % of $30.00 = 34.5 → 35 (hand calculation)', () => {
    const priced = priceOrder(
      tenDollars({
        lines: [
          {
            productId: 9,
            cases: 1,
            casePack: 10,
            netWeightG: 100,
            breaks: [{ minCases: 1, unitPriceCents: 300 }],
          },
        ],
        taxRatePct: 1.15,
      }),
    )
    expect(priced.taxCents).toBe(35)
  })

  it('leaves shipping untaxed (product rule; shipping taxability varies by state, memory)', () => {
    const withShipping = priceOrder(tenDollars({ shippingBands: [{ maxWeightG: null, rateCents: 5000 }] }))
    const without = priceOrder(tenDollars({ shippingBands: [] }))
    expect(withShipping.taxCents).toBe(without.taxCents)
  })
})

describe('shippingFor', () => {
  it.each([
    { weight: 1, bands, expected: 1200, source: 'hand calculation' },
    { weight: 2000, bands, expected: 1200, source: 'product rule: a band includes its max weight' },
    { weight: 2001, bands, expected: 1800, source: 'hand calculation' },
    { weight: 10000, bands, expected: 2600, source: 'hand calculation' },
    { weight: 10001, bands, expected: 3900, source: 'product rule: the open-ended band' },
    { weight: 250000, bands, expected: 3900, source: 'product rule: the open-ended band' },
    {
      weight: 7000,
      bands: bands.slice(0, 2),
      expected: 1800,
      source: 'product rule: over every band pays the last',
    },
    { weight: 7000, bands: [], expected: 0, source: 'product rule: no bands, no shipping charge' },
  ])('$weight g → $expected ¢ ($source)', ({ weight, bands: b, expected }) => {
    expect(shippingFor(weight, b)).toBe(expected)
  })

  it.each([
    {
      bands: [
        { maxWeightG: 5000, rateCents: 1800 },
        { maxWeightG: 2000, rateCents: 1200 },
      ],
      field: 'shippingBands.1.maxWeightG',
      source: 'bad input: not ascending',
    },
    {
      bands: [
        { maxWeightG: null, rateCents: 3900 },
        { maxWeightG: 2000, rateCents: 1200 },
      ],
      field: 'shippingBands.0.maxWeightG',
      source: 'bad input: open-ended band not last',
    },
    { bands: [{ maxWeightG: 2000, rateCents: -1 }], field: 'shippingBands.0.rateCents', source: 'bad input' },
    { bands: [{ maxWeightG: 0, rateCents: 100 }], field: 'shippingBands.0.maxWeightG', source: 'bad input' },
  ])('rejects bands at $field ($source)', ({ bands: b, field }) => {
    expect(() => validateShippingBands(b)).toThrow(
      expect.objectContaining({ code: 'invalid_shipping_bands', field }),
    )
  })
})

describe('priceOrder: bad input', () => {
  it.each([
    { lines: [], code: 'no_lines', field: 'lines', source: 'bad input: empty order' },
    {
      lines: [{ ...lavender, cases: 0 }],
      code: 'invalid_cases',
      field: 'lines.0.cases',
      source: 'bad input',
    },
    {
      lines: [oatmeal, { ...lavender, cases: -2 }],
      code: 'invalid_cases',
      field: 'lines.1.cases',
      source: 'bad input',
    },
    {
      lines: [{ ...lavender, cases: 1.5 }],
      code: 'invalid_cases',
      field: 'lines.0.cases',
      source: 'bad input: whole cases',
    },
    {
      lines: [lavender, { ...lavender }],
      code: 'duplicate_product',
      field: 'lines.1.productId',
      source: 'bad input',
    },
    {
      lines: [{ ...lavender, casePack: 0 }],
      code: 'invalid_case_pack',
      field: 'lines.0.casePack',
      source: 'bad input',
    },
    {
      lines: [{ ...lavender, netWeightG: 0 }],
      code: 'invalid_weight',
      field: 'lines.0.netWeightG',
      source: 'bad input',
    },
    {
      lines: [{ ...lavender, breaks: [] }],
      code: 'no_price',
      field: 'lines.0.productId',
      source: 'bad input: no price at this tier',
    },
    {
      lines: [{ ...lavender, cases: 2, breaks: [{ minCases: 3, unitPriceCents: 600 }] }],
      code: 'no_price',
      field: 'lines.0.cases',
      source: 'bad input: fewer cases than the first break',
    },
  ] as { lines: PricingLine[]; code: string; field: string; source: string }[])(
    'rejects with $code at $field ($source)',
    ({ lines, code, field }) => {
      expect(() => priceOrder(input({ lines }))).toThrow(expect.objectContaining({ code, field }))
    },
  )

  it.each([
    { overrides: { taxRatePct: -1 }, code: 'invalid_tax_rate', source: 'bad input' },
    { overrides: { taxRatePct: Number.NaN }, code: 'invalid_tax_rate', source: 'bad input' },
    { overrides: { taxRatePct: 101 }, code: 'invalid_tax_rate', source: 'bad input' },
    { overrides: { openingMinimumCents: 10.5 }, code: 'invalid_minimum', source: 'bad input' },
    { overrides: { packagingWeightPerCaseG: -5 }, code: 'invalid_weight', source: 'bad input' },
  ] as { overrides: Partial<OrderPricingInput>; code: string; source: string }[])(
    'rejects $overrides with $code ($source)',
    ({ overrides, code }) => {
      expect(() => priceOrder(input(overrides))).toThrow(expect.objectContaining({ code }))
    },
  )

  it('rejects two breaks starting at the same case count (bad input)', () => {
    expect(() =>
      unitPriceFor(
        [
          { minCases: 1, unitPriceCents: 650 },
          { minCases: 1, unitPriceCents: 600 },
        ],
        2,
      ),
    ).toThrow(expect.objectContaining({ code: 'invalid_price_breaks' }))
  })
})

describe('validateOrderLines', () => {
  it.each([
    { lines: [{ productId: 1, cases: 2 }], source: 'hand calculation' },
    {
      lines: [
        { productId: 1, cases: 2 },
        { productId: 2, cases: 1 },
      ],
      source: 'hand calculation',
    },
  ])('accepts $lines ($source)', ({ lines }) => {
    expect(() => validateOrderLines(lines)).not.toThrow()
  })

  it.each([
    {
      lines: [
        { productId: 1, cases: 2 },
        { productId: 2, cases: 1 },
        { productId: 1, cases: 1 },
      ],
      code: 'duplicate_product',
      field: 'lines.2.productId',
      source: 'bad input',
    },
    { lines: [], code: 'no_lines', field: 'lines', source: 'bad input' },
  ])('rejects with $code at $field ($source)', ({ lines, code, field }) => {
    expect(() => validateOrderLines(lines)).toThrow(expect.objectContaining({ code, field }))
  })
})

describe('isCertificateValid', () => {
  it.each([
    {
      onFile: true,
      expiresOn: null,
      today: '2026-12-01',
      expected: true,
      source: 'product rule: no expiry date',
    },
    {
      onFile: true,
      expiresOn: '2026-12-31',
      today: '2026-12-01',
      expected: true,
      source: 'hand calculation',
    },
    {
      onFile: true,
      expiresOn: '2026-12-01',
      today: '2026-12-01',
      expected: true,
      source: 'product rule: good through its last day',
    },
    {
      onFile: true,
      expiresOn: '2026-11-30',
      today: '2026-12-01',
      expected: false,
      source: 'hand calculation: expired',
    },
    {
      onFile: false,
      expiresOn: null,
      today: '2026-12-01',
      expected: false,
      source: 'common practice: no certificate, no exemption',
    },
  ])(
    'on file $onFile, expires $expiresOn, today $today → $expected ($source)',
    ({ onFile, expiresOn, today, expected }) => {
      expect(isCertificateValid({ onFile, expiresOn }, today)).toBe(expected)
    },
  )

  it('rejects a bad date (bad input)', () => {
    expect(() => isCertificateValid({ onFile: true, expiresOn: '31/12/2026' }, '2026-12-01')).toThrow(
      expect.objectContaining({ code: 'invalid_date' }),
    )
  })
})
