import { describe, expect, it } from 'vitest'
import { DomainError } from '@shared/domain/errors'
import {
  FRAGRANCE_LABEL_EU,
  buildDeclaration,
  saponifiedInci,
  type DeclarationItem,
} from '@shared/domain/declaration/declaration'

// A 1000 g bar as added, listed out of order on purpose.
const bar: DeclarationItem[] = [
  { label: 'Kaolin', grams: 10, kind: 'ingredient' },
  { label: 'Sodium Cocoate', grams: 200, kind: 'saponified' },
  { label: 'Lavandula Angustifolia Oil', grams: 30, kind: 'fragrance' },
  { label: 'Aqua', grams: 200, kind: 'ingredient' },
  { label: 'Titanium Dioxide', grams: 5, kind: 'ingredient' },
  { label: 'Sodium Olivate', grams: 400, kind: 'saponified' },
  { label: 'Mica', grams: 5, kind: 'ingredient' },
  { label: 'Litsea Cubeba Fruit Oil', grams: 10, kind: 'fragrance' },
  { label: 'Sodium Castorate', grams: 80, kind: 'saponified' },
  { label: ' aqua ', grams: 60, kind: 'ingredient' },
]

describe('buildDeclaration', () => {
  it.each([
    {
      name: 'US label',
      options: {},
      text: 'Sodium Olivate, Aqua, Sodium Cocoate, Sodium Castorate, Fragrance, Kaolin, Titanium Dioxide, Mica',
      source: '21 CFR 701.3(a)',
    },
    {
      name: 'EU label',
      options: { fragranceLabel: FRAGRANCE_LABEL_EU },
      text: 'Sodium Olivate, Aqua, Sodium Cocoate, Sodium Castorate, Parfum, Kaolin, Titanium Dioxide, Mica',
      source: 'EU 1223/2009 Art. 19(1)(g)',
    },
  ])('$name in descending order of weight ($source)', ({ options, text }) => {
    expect(buildDeclaration(bar, options).text).toBe(text)
  })

  // 400 + 260 + 200 + 80 + 40 + 10 + 5 + 5 = 1000 g
  it.each([
    { label: 'Sodium Olivate', grams: 400, pct: 40, minor: false, source: 'hand calculation' },
    // 200 + 60, "Aqua" and " aqua " are one ingredient
    { label: 'Aqua', grams: 260, pct: 26, minor: false, source: 'hand calculation' },
    // 30 + 10 of two fragrance oils, declared as one
    { label: 'Fragrance', grams: 40, pct: 4, minor: false, source: '21 CFR 701.3(a)' },
    // exactly 1 % counts as "at or under 1 %"
    { label: 'Kaolin', grams: 10, pct: 1, minor: true, source: '21 CFR 701.3(a)' },
    { label: 'Mica', grams: 5, pct: 0.5, minor: true, source: 'EU 1223/2009 Art. 19(1)(g)' },
  ])('$label: $grams g, $pct %, minor $minor ($source)', ({ label, grams, pct, minor }) => {
    const entry = buildDeclaration(bar).entries.find((e) => e.label === label)
    expect(entry).toBeDefined()
    expect(entry?.grams).toBeCloseTo(grams, 9)
    expect(entry?.pct).toBeCloseTo(pct, 9)
    expect(entry?.minor).toBe(minor)
  })

  it('puts every entry at or under 1 % after the rest, still heaviest first (21 CFR 701.3(a), memory: 701.3(f))', () => {
    const { entries } = buildDeclaration(bar)
    const firstMinor = entries.findIndex((e) => e.minor)
    expect(entries.slice(firstMinor).every((e) => e.minor)).toBe(true)
    expect(entries.slice(0, firstMinor).every((e) => !e.minor)).toBe(true)
    for (let i = 1; i < entries.length; i++)
      expect(entries[i - 1]!.grams).toBeGreaterThanOrEqual(entries[i]!.grams)
  })

  it.each([
    {
      name: 'a fragrance under 1 % is a minor entry',
      items: [
        { label: 'Sodium Olivate', grams: 995, kind: 'saponified' },
        { label: 'Rosemary oil', grams: 5, kind: 'fragrance' },
      ],
      options: {},
      text: 'Sodium Olivate, Fragrance',
      minors: ['Fragrance'],
      source: '21 CFR 701.3(a)',
    },
    {
      name: 'an ingredient labelled like the fragrance joins it',
      items: [
        { label: 'Sodium Olivate', grams: 90, kind: 'saponified' },
        { label: 'parfum', grams: 4, kind: 'ingredient' },
        { label: 'Cedarwood oil', grams: 6, kind: 'fragrance' },
      ],
      options: { fragranceLabel: FRAGRANCE_LABEL_EU },
      text: 'Sodium Olivate, Parfum',
      minors: [],
      source: 'EU 1223/2009 Art. 19(1)(g)',
    },
    {
      name: 'equal weights keep the order given',
      items: [
        { label: 'Sodium Cocoate', grams: 50, kind: 'saponified' },
        { label: 'Sodium Olivate', grams: 50, kind: 'saponified' },
      ],
      options: {},
      text: 'Sodium Cocoate, Sodium Olivate',
      minors: [],
      source: '21 CFR 701.3(a)',
    },
  ] satisfies {
    name: string
    items: DeclarationItem[]
    options: { fragranceLabel?: string }
    text: string
    minors: string[]
    source: string
  }[])('$name ($source)', ({ items, options, text, minors }) => {
    const declaration = buildDeclaration(items, options)
    expect(declaration.text).toBe(text)
    expect(declaration.entries.filter((e) => e.minor).map((e) => e.label)).toEqual(minors)
  })

  it.each<{ items: DeclarationItem[]; options?: { fragranceLabel?: string }; field: string; source: string }>(
    [
      {
        items: [{ label: 'Aqua', grams: -5, kind: 'ingredient' }],
        field: 'items.0.grams',
        source: 'hand calculation',
      },
      {
        items: [{ label: '  ', grams: 5, kind: 'ingredient' }],
        field: 'items.0.label',
        source: 'hand calculation',
      },
      { items: [], field: 'items', source: 'hand calculation' },
      {
        items: [{ label: 'Aqua', grams: 0, kind: 'ingredient' }],
        field: 'items',
        source: 'hand calculation',
      },
      {
        items: [{ label: 'Aqua', grams: 5, kind: 'ingredient' }],
        options: { fragranceLabel: '' },
        field: 'fragranceLabel',
        source: 'hand calculation',
      },
    ],
  )('rejects $field ($source)', ({ items, options, field }) => {
    const call = () => buildDeclaration(items, options)
    expect(call).toThrow(DomainError)
    expect(call).toThrow(expect.objectContaining({ field }))
  })
})

describe('saponifiedInci', () => {
  it.each([
    {
      oil: 'Olea Europaea (Olive) Fruit Oil',
      inci: 'Sodium Olivate',
      source: 'supplier INCI lists (REFERENCES.md)',
    },
    { oil: 'Olive oil (pomace)', inci: 'Sodium Olivate', source: 'supplier INCI lists (REFERENCES.md)' },
    { oil: 'Extra virgin olive oil', inci: 'Sodium Olivate', source: 'supplier INCI lists (REFERENCES.md)' },
    {
      oil: 'Cocos Nucifera (Coconut) Oil',
      inci: 'Sodium Cocoate',
      source: 'supplier INCI lists (REFERENCES.md)',
    },
    {
      oil: 'Coconut oil 76°, refined',
      inci: 'Sodium Cocoate',
      source: 'supplier INCI lists (REFERENCES.md)',
    },
    {
      oil: 'Elaeis Guineensis (Palm) Oil',
      inci: 'Sodium Palmate',
      source: 'supplier INCI lists (REFERENCES.md)',
    },
    { oil: 'Palm oil', inci: 'Sodium Palmate', source: 'supplier INCI lists (REFERENCES.md)' },
    {
      oil: 'Elaeis Guineensis (Palm) Kernel Oil',
      inci: 'Sodium Palm Kernelate',
      source: 'supplier INCI lists (REFERENCES.md)',
    },
    { oil: 'Palm kernel oil', inci: 'Sodium Palm Kernelate', source: 'supplier INCI lists (REFERENCES.md)' },
    {
      oil: 'Butyrospermum Parkii (Shea) Butter',
      inci: 'Sodium Shea Butterate',
      source: 'supplier INCI lists (REFERENCES.md)',
    },
    {
      oil: 'Butyrospermum Parkii (Shea Butter)',
      inci: 'Sodium Shea Butterate',
      source: 'supplier INCI lists (REFERENCES.md)',
    },
    {
      oil: 'Unrefined shea butter',
      inci: 'Sodium Shea Butterate',
      source: 'supplier INCI lists (REFERENCES.md)',
    },
    {
      oil: 'Ricinus Communis (Castor) Seed Oil',
      inci: 'Sodium Castorate',
      source: 'supplier INCI lists (REFERENCES.md)',
    },
    { oil: 'CASTOR OIL', inci: 'Sodium Castorate', source: 'supplier INCI lists (REFERENCES.md)' },
    // not in REFERENCES.md's list, or not the same oil once processed
    { oil: 'Lard', inci: null, source: 'hand calculation' },
    { oil: 'Glycine Soja (Soybean) Oil', inci: null, source: 'hand calculation' },
    { oil: 'Fractionated coconut oil', inci: null, source: 'hand calculation' },
    { oil: 'Hydrogenated palm oil', inci: null, source: 'hand calculation' },
    { oil: '', inci: null, source: 'hand calculation' },
  ])('$oil → $inci ($source)', ({ oil, inci }) => {
    expect(saponifiedInci(oil)).toBe(inci)
  })
})
