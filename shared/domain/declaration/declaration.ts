import { DomainError, requireNonNegative } from '@shared/domain/errors'

/** How the fragrance is declared: "Fragrance" in the US (21 CFR 701.3), "Parfum" in the EU (1223/2009). */
export const FRAGRANCE_LABEL_US = 'Fragrance'
export const FRAGRANCE_LABEL_EU = 'Parfum'

export interface DeclarationItem {
  label: string
  grams: number
  kind: 'saponified' | 'ingredient' | 'fragrance'
}

export interface DeclarationEntry {
  label: string
  grams: number
  /** Percent of everything added. */
  pct: number
  /** At or under 1 %: the rules let these follow the rest in any order. */
  minor: boolean
}

/**
 * The ingredient list for a bar, in descending order of weight as added (21 CFR 701.3(a);
 * EU 1223/2009 Art. 19(1)(g)). Every fragrance is declared as one entry under `fragranceLabel`;
 * items with the same label (ignoring case and outer spaces) are added together. Entries at or
 * under 1 % must come after the rest and may go in any order; they are kept in descending order
 * too, which a single descending sort already gives. Equal weights keep the order given.
 */
export function buildDeclaration(
  items: readonly DeclarationItem[],
  options: { fragranceLabel?: string } = {},
): { entries: DeclarationEntry[]; text: string } {
  const fragranceLabel = (options.fragranceLabel ?? FRAGRANCE_LABEL_US).trim()
  if (fragranceLabel === '')
    throw new DomainError('empty_label', 'The fragrance label is empty', 'fragranceLabel')

  const merged = new Map<string, { label: string; grams: number }>()
  items.forEach((item, i) => {
    requireNonNegative(item.grams, `items.${i}.grams`)
    const label = item.kind === 'fragrance' ? fragranceLabel : item.label.trim()
    if (label === '') throw new DomainError('empty_label', 'An ingredient has no label', `items.${i}.label`)
    const key = label.toLocaleLowerCase('en-US')
    const entry = merged.get(key)
    if (!entry) merged.set(key, { label, grams: item.grams })
    else {
      entry.grams += item.grams
      // The declared fragrance keeps the label chosen for it, whatever spelling came first.
      if (item.kind === 'fragrance') entry.label = fragranceLabel
    }
  })

  const total = [...merged.values()].reduce((sum, e) => sum + e.grams, 0)
  if (total <= 0)
    throw new DomainError('empty_declaration', 'Nothing to declare: the items weigh 0 g', 'items')

  const entries = [...merged.values()]
    .sort((a, b) => b.grams - a.grams)
    .map(({ label, grams }) => ({ label, grams, pct: (grams / total) * 100, minor: grams * 100 <= total }))
  return { entries, text: entries.map((e) => e.label).join(', ') }
}

// Saponified INCI names as supplier INCI lists give them (REFERENCES.md; spelling to confirm
// against CosIng). Keys are normalised names: see normaliseOilName.
const SAPONIFIED: ReadonlyMap<string, string> = new Map(
  (
    [
      ['Sodium Olivate', ['olive oil', 'olea europaea fruit oil', 'olea europaea oil']],
      ['Sodium Cocoate', ['coconut oil', 'cocos nucifera oil']],
      ['Sodium Palmate', ['palm oil', 'elaeis guineensis oil']],
      ['Sodium Palm Kernelate', ['palm kernel oil', 'elaeis guineensis kernel oil']],
      ['Sodium Shea Butterate', ['shea butter', 'butyrospermum parkii butter', 'butyrospermum parkii']],
      ['Sodium Castorate', ['castor oil', 'ricinus communis seed oil', 'ricinus communis oil']],
    ] as const
  ).flatMap(([saponified, names]) => names.map((name) => [name, saponified] as const)),
)

// Grade words that do not change what the oil saponifies to. "Fractionated" and "hydrogenated"
// do, so they are not here and such oils get no name.
const GRADE_WORDS = new Set([
  'refined',
  'unrefined',
  'organic',
  'virgin',
  'extra',
  'pomace',
  'rbd',
  'deodorised',
  'deodorized',
  'pure',
  'raw',
])

/** "Olea Europaea (Olive) Fruit Oil" → "olea europaea fruit oil"; "Coconut oil 76°, refined" → "coconut oil". */
function normaliseOilName(name: string): string {
  return name
    .toLowerCase()
    .replace(/\([^)]*\)/g, ' ')
    .replace(/[^a-z]+/g, ' ')
    .split(' ')
    .filter((word) => word !== '' && !GRADE_WORDS.has(word))
    .join(' ')
}

/** The saponified INCI name of a common soap oil, from its INCI or trade name; null when not known. */
export function saponifiedInci(oilInciOrName: string): string | null {
  return SAPONIFIED.get(normaliseOilName(oilInciOrName)) ?? null
}
