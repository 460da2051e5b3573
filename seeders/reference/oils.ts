// Reference oils and butters seeded for every studio. Each saponification value is the midpoint
// of the published range beside it (REFERENCES.md); tests/unit/reference-oils.test.ts keeps every
// value inside its range. INCI spellings are supplier usage, to confirm against CosIng.

export interface ReferenceOil {
  name: string
  kind: 'oil'
  inci: string
  /** Saponification value, mg KOH per g of oil. */
  sapKoh: number
  /** The published range the value was taken from; null where REFERENCES.md has none. */
  sapRange: { min: number; max: number; source: string } | null
}

export const referenceOils: readonly ReferenceOil[] = Object.freeze([
  {
    name: 'Olive oil',
    kind: 'oil',
    inci: 'Olea Europaea (Olive) Fruit Oil',
    sapKoh: 190,
    // REFERENCES.md marks this range as recalled, not read in the standard
    sapRange: { min: 184, max: 196, source: 'Codex CXS 33-1981 (memory)' },
  },
  {
    name: 'Coconut oil',
    kind: 'oil',
    inci: 'Cocos Nucifera (Coconut) Oil',
    sapKoh: 256.5,
    sapRange: { min: 248, max: 265, source: 'Codex CXS 210-1999' },
  },
  {
    name: 'Palm oil',
    kind: 'oil',
    inci: 'Elaeis Guineensis (Palm) Oil',
    sapKoh: 199.5,
    sapRange: { min: 190, max: 209, source: 'Codex CXS 210-1999' },
  },
  {
    name: 'Soybean oil',
    kind: 'oil',
    inci: 'Glycine Soja (Soybean) Oil',
    sapKoh: 192,
    sapRange: { min: 189, max: 195, source: 'Codex CXS 210-1999' },
  },
  {
    name: 'Canola oil (low erucic rapeseed)',
    kind: 'oil',
    inci: 'Canola Oil',
    sapKoh: 187.5,
    sapRange: { min: 182, max: 193, source: 'Codex CXS 210-1999' },
  },
  {
    name: 'Sunflower oil, high oleic',
    kind: 'oil',
    inci: 'Helianthus Annuus (Sunflower) Seed Oil',
    sapKoh: 188,
    sapRange: { min: 182, max: 194, source: 'Codex CXS 210-1999' },
  },
  {
    name: 'Safflower oil, high oleic',
    kind: 'oil',
    inci: 'Carthamus Tinctorius (Safflower) Seed Oil',
    sapKoh: 190,
    sapRange: { min: 186, max: 194, source: 'Codex CXS 210-1999' },
  },
  {
    name: 'Castor oil',
    kind: 'oil',
    inci: 'Ricinus Communis (Castor) Seed Oil',
    sapKoh: 181.5,
    sapRange: { min: 176, max: 187, source: 'British Pharmacopoeia 1993' },
  },
  {
    name: 'Lard',
    kind: 'oil',
    inci: 'Lard',
    sapKoh: 197.5,
    sapRange: { min: 192, max: 203, source: 'Codex CXS 211-1999; Canada Food and Drug Regulations B.09.013' },
  },
  {
    name: 'Shea butter',
    kind: 'oil',
    inci: 'Butyrospermum Parkii (Shea) Butter',
    sapKoh: 180, // from memory: a typical trade value; REFERENCES.md has no published range
    sapRange: null,
  },
  {
    name: 'Cocoa butter',
    kind: 'oil',
    inci: 'Theobroma Cacao (Cocoa) Seed Butter',
    sapKoh: 192, // from memory: a typical trade value; REFERENCES.md has no published range
    sapRange: null,
  },
])
