/**
 * The demo studio's catalogue: what Brindlewick Soapery buys, the recipes it pours, the bars it
 * sells. Invented for the demo; suppliers, names and prices describe no real business.
 * Oils take their saponification values from seeders/reference/oils.ts (each inside its
 * published range). Seeders look rows up by these names and SKUs.
 */
export type DemoIngredient = {
  name: string
  kind: 'oil' | 'lye' | 'liquid' | 'fragrance' | 'colourant' | 'additive' | 'packaging'
  inci: string | null
  /** oils: the name of the reference oil whose SAP value it takes */
  referenceOil?: string
  purityPct?: number
  /** fragrances: the supplier certificate's IFRA category 9 limit (invented for the demo) */
  maxUsagePct?: number
  vanillinPct?: number
  /** purchases: [supplier, lot code, received, quantity, unit, cost cents incl. freight] */
  purchases: [string, string, string, number, 'g' | 'kg' | 'oz' | 'lb' | 'each', number][]
}

export const DEMO_INGREDIENTS: DemoIngredient[] = [
  {
    name: 'Olive oil',
    kind: 'oil',
    inci: 'Olea Europaea (Olive) Fruit Oil',
    referenceOil: 'Olive oil',
    purchases: [
      ['Greenfield Oil Traders', 'GOT-2608-114', '2026-08-20', 20, 'kg', 16800],
      ['Greenfield Oil Traders', 'GOT-2610-201', '2026-10-15', 20, 'kg', 17400],
    ],
  },
  {
    name: 'Coconut oil',
    kind: 'oil',
    inci: 'Cocos Nucifera (Coconut) Oil',
    referenceOil: 'Coconut oil',
    purchases: [['Greenfield Oil Traders', 'GOT-2609-033', '2026-09-02', 15, 'kg', 8700]],
  },
  {
    name: 'Palm oil',
    kind: 'oil',
    inci: 'Elaeis Guineensis (Palm) Oil',
    referenceOil: 'Palm oil',
    purchases: [['Northway Soap Supply', 'NSS-P-5520', '2026-09-02', 10, 'kg', 5900]],
  },
  {
    name: 'Shea butter',
    kind: 'oil',
    inci: 'Butyrospermum Parkii (Shea) Butter',
    referenceOil: 'Shea butter',
    purchases: [['Northway Soap Supply', 'NSS-SB-0912', '2026-09-12', 11, 'lb', 6450]],
  },
  {
    name: 'Castor oil',
    kind: 'oil',
    inci: 'Ricinus Communis (Castor) Seed Oil',
    referenceOil: 'Castor oil',
    purchases: [['Northway Soap Supply', 'NSS-C-3301', '2026-08-28', 5, 'kg', 3100]],
  },
  {
    name: 'Cocoa butter',
    kind: 'oil',
    inci: 'Theobroma Cacao (Cocoa) Seed Butter',
    referenceOil: 'Cocoa butter',
    purchases: [['Northway Soap Supply', 'NSS-CB-1010', '2026-10-10', 4, 'kg', 5600]],
  },
  {
    name: 'Sodium hydroxide',
    kind: 'lye',
    inci: 'Sodium Hydroxide',
    purityPct: 99,
    purchases: [['Ridgeline Chemical', 'RC-NAOH-77812', '2026-08-15', 10, 'kg', 4200]],
  },
  {
    name: 'Distilled water',
    kind: 'liquid',
    inci: 'Aqua',
    purchases: [['Ridgeline Chemical', 'RC-H2O-1101', '2026-08-15', 40, 'kg', 2400]],
  },
  {
    name: 'Lavender essential oil',
    kind: 'fragrance',
    inci: 'Lavandula Angustifolia (Lavender) Oil',
    maxUsagePct: 4.5,
    vanillinPct: 0,
    purchases: [['Hillside Aromatics', 'HA-LAV-2609', '2026-09-05', 16, 'oz', 5200]],
  },
  {
    name: 'Cedar & sage fragrance',
    kind: 'fragrance',
    inci: null,
    maxUsagePct: 6,
    vanillinPct: 0.1,
    purchases: [['Hillside Aromatics', 'HA-CS-2609', '2026-09-05', 16, 'oz', 3400]],
  },
  {
    name: 'Honey oat fragrance',
    kind: 'fragrance',
    inci: null,
    maxUsagePct: 5,
    vanillinPct: 1.8,
    purchases: [['Hillside Aromatics', 'HA-HO-2610', '2026-10-01', 16, 'oz', 3600]],
  },
  {
    name: 'Sweet orange essential oil',
    kind: 'fragrance',
    inci: 'Citrus Aurantium Dulcis (Orange) Peel Oil',
    maxUsagePct: 5,
    vanillinPct: 0,
    purchases: [['Hillside Aromatics', 'HA-OR-2609', '2026-09-05', 16, 'oz', 2100]],
  },
  {
    name: 'Peppermint essential oil',
    kind: 'fragrance',
    inci: 'Mentha Piperita (Peppermint) Oil',
    maxUsagePct: 3,
    vanillinPct: 0,
    purchases: [['Hillside Aromatics', 'HA-PM-2610', '2026-10-01', 8, 'oz', 2600]],
  },
  {
    name: 'Activated charcoal',
    kind: 'colourant',
    inci: 'Charcoal Powder',
    purchases: [['Northway Soap Supply', 'NSS-AC-221', '2026-09-12', 500, 'g', 1400]],
  },
  {
    name: 'French green clay',
    kind: 'colourant',
    inci: 'Illite',
    purchases: [['Northway Soap Supply', 'NSS-GC-118', '2026-09-12', 1, 'kg', 1800]],
  },
  {
    name: 'Rose clay',
    kind: 'colourant',
    inci: 'Kaolin',
    purchases: [['Northway Soap Supply', 'NSS-RC-140', '2026-10-10', 1, 'kg', 1900]],
  },
  {
    name: 'Colloidal oatmeal',
    kind: 'additive',
    inci: 'Avena Sativa (Oat) Kernel Flour',
    purchases: [['Northway Soap Supply', 'NSS-OAT-09', '2026-09-12', 2, 'kg', 2200]],
  },
  {
    name: 'Sodium lactate',
    kind: 'additive',
    inci: 'Sodium Lactate',
    purchases: [['Ridgeline Chemical', 'RC-SL-4410', '2026-08-15', 1, 'kg', 1500]],
  },
  {
    name: 'Poppy seeds',
    kind: 'additive',
    inci: 'Papaver Somniferum Seed',
    purchases: [['Greenfield Oil Traders', 'GOT-PS-77', '2026-09-02', 500, 'g', 900]],
  },
  {
    name: 'Kraft bar box',
    kind: 'packaging',
    inci: null,
    purchases: [['Foldline Packaging', 'FP-KB-26-09', '2026-09-20', 1000, 'each', 21000]],
  },
  {
    name: 'Paper label',
    kind: 'packaging',
    inci: null,
    purchases: [['Foldline Packaging', 'FP-LB-26-09', '2026-09-20', 2000, 'each', 6000]],
  },
]

export type DemoRecipe = {
  name: string
  superfatPct: number
  lyeConcentrationPct: number
  cureDays: number
  labourMinutes: number
  barWeightG: number
  barsPerMould: number
  barsKeptBack: number
  mouldOilWeightG: number
  oils: [string, number][]
  fragrances: [string, number][]
  additives: [string, number][]
  packaging: [string, number][]
}

const base = {
  superfatPct: 5,
  lyeConcentrationPct: 33,
  cureDays: 28,
  labourMinutes: 20,
  barWeightG: 130,
  barsPerMould: 12,
  barsKeptBack: 2,
  mouldOilWeightG: 1100,
}
const pack: [string, number][] = [
  ['Kraft bar box', 1],
  ['Paper label', 1],
]
const classic: [string, number][] = [
  ['Olive oil', 40],
  ['Coconut oil', 25],
  ['Palm oil', 20],
  ['Shea butter', 10],
  ['Castor oil', 5],
]

export const DEMO_RECIPES: DemoRecipe[] = [
  {
    ...base,
    name: 'Lavender classic',
    oils: classic,
    fragrances: [['Lavender essential oil', 4]],
    additives: [['Sodium lactate', 10]],
    packaging: pack,
  },
  {
    ...base,
    name: 'Cedar & sage',
    oils: classic,
    fragrances: [['Cedar & sage fragrance', 5]],
    additives: [['Sodium lactate', 10]],
    packaging: pack,
  },
  {
    ...base,
    name: 'Honey oat',
    cureDays: 35,
    oils: [
      ['Olive oil', 45],
      ['Coconut oil', 25],
      ['Shea butter', 15],
      ['Cocoa butter', 10],
      ['Castor oil', 5],
    ],
    fragrances: [['Honey oat fragrance', 4]],
    additives: [['Colloidal oatmeal', 15]],
    packaging: pack,
  },
  {
    ...base,
    name: 'Charcoal clarity',
    oils: classic,
    fragrances: [['Peppermint essential oil', 2.5]],
    additives: [['Activated charcoal', 6]],
    packaging: pack,
  },
  {
    ...base,
    name: 'Orange poppy scrub',
    oils: classic,
    fragrances: [['Sweet orange essential oil', 4.5]],
    additives: [['Poppy seeds', 8]],
    packaging: pack,
  },
  {
    ...base,
    name: 'Unscented shea',
    superfatPct: 7,
    oils: [
      ['Olive oil', 50],
      ['Coconut oil', 20],
      ['Shea butter', 25],
      ['Castor oil', 5],
    ],
    fragrances: [],
    additives: [],
    packaging: pack,
  },
  {
    ...base,
    name: 'Clay facial',
    cureDays: 42,
    barWeightG: 110,
    oils: [
      ['Olive oil', 55],
      ['Coconut oil', 20],
      ['Shea butter', 20],
      ['Castor oil', 5],
    ],
    fragrances: [['Lavender essential oil', 3]],
    additives: [['French green clay', 12]],
    packaging: pack,
  },
  {
    ...base,
    name: 'Rose clay',
    barWeightG: 110,
    oils: [
      ['Olive oil', 50],
      ['Coconut oil', 25],
      ['Cocoa butter', 20],
      ['Castor oil', 5],
    ],
    fragrances: [['Sweet orange essential oil', 3]],
    additives: [['Rose clay', 10]],
    packaging: pack,
  },
]

export type DemoProduct = {
  sku: string
  name: string
  recipe: string
  scentNotes: string
  description: string
  netWeightG: number
  cutWeightG: number
  casePack: number
  msrpCents: number
  gtin: string | null
  /** unit price per bar for [tier, minCases] breaks */
  prices: Record<'Standard' | 'Preferred' | 'Distributor', [number, number][]>
}

const std = (p: number): DemoProduct['prices'] => ({
  Standard: [
    [1, p],
    [5, p - 25],
  ],
  Preferred: [
    [1, p - 35],
    [5, p - 55],
  ],
  Distributor: [
    [1, p - 90],
    [10, p - 110],
  ],
})

export const DEMO_PRODUCTS: DemoProduct[] = [
  {
    sku: 'LAV',
    name: 'Lavender Field',
    recipe: 'Lavender classic',
    scentNotes: 'Lavender, soft herbal',
    description: 'A classic lavender bar with a creamy lather.',
    netWeightG: 113,
    cutWeightG: 130,
    casePack: 12,
    msrpCents: 1000,
    gtin: '0201234000013' /* restricted-circulation prefix 02: no real trade item */,
    prices: std(500),
  },
  {
    sku: 'CDR',
    name: 'Cedar & Sage',
    recipe: 'Cedar & sage',
    scentNotes: 'Cedarwood, clary sage',
    description: 'Woody and green, a favourite for gift boxes.',
    netWeightG: 113,
    cutWeightG: 130,
    casePack: 12,
    msrpCents: 1000,
    gtin: null,
    prices: std(500),
  },
  {
    sku: 'HNY',
    name: 'Honey Oat',
    recipe: 'Honey oat',
    scentNotes: 'Warm honey, toasted oat',
    description: 'Gentle oatmeal bar; browns to a warm tan as it cures.',
    netWeightG: 113,
    cutWeightG: 130,
    casePack: 12,
    msrpCents: 1100,
    gtin: null,
    prices: std(550),
  },
  {
    sku: 'CHR',
    name: 'Charcoal Clarity',
    recipe: 'Charcoal clarity',
    scentNotes: 'Peppermint, cool',
    description: 'Activated charcoal and a breath of peppermint.',
    netWeightG: 113,
    cutWeightG: 130,
    casePack: 12,
    msrpCents: 1100,
    gtin: null,
    prices: std(550),
  },
  {
    sku: 'ORP',
    name: 'Orange Poppy Scrub',
    recipe: 'Orange poppy scrub',
    scentNotes: 'Sweet orange',
    description: 'A bright scrub bar with poppy seeds.',
    netWeightG: 113,
    cutWeightG: 130,
    casePack: 12,
    msrpCents: 1000,
    gtin: null,
    prices: std(500),
  },
  {
    sku: 'UNS',
    name: 'Unscented Shea',
    recipe: 'Unscented shea',
    scentNotes: 'No added scent',
    description: 'Extra shea, extra superfat, nothing else.',
    netWeightG: 113,
    cutWeightG: 130,
    casePack: 12,
    msrpCents: 900,
    gtin: null,
    prices: std(450),
  },
  {
    sku: 'GCL',
    name: 'Green Clay Facial',
    recipe: 'Clay facial',
    scentNotes: 'Light lavender',
    description: 'A smaller facial bar with French green clay.',
    netWeightG: 99,
    cutWeightG: 110,
    casePack: 10,
    msrpCents: 1200,
    gtin: null,
    prices: std(600),
  },
  {
    sku: 'RSC',
    name: 'Rose Clay Glow',
    recipe: 'Rose clay',
    scentNotes: 'Orange blossom, soft',
    description: 'Rose clay and cocoa butter in a petite bar.',
    netWeightG: 99,
    cutWeightG: 110,
    casePack: 10,
    msrpCents: 1200,
    gtin: null,
    prices: std(600),
  },
  {
    sku: 'LAV-MINI',
    name: 'Lavender Field Guest Bar',
    recipe: 'Lavender classic',
    scentNotes: 'Lavender, soft herbal',
    description: 'A guest-size cut of our lavender bar for hotels and gift baskets.',
    netWeightG: 56,
    cutWeightG: 65,
    casePack: 24,
    msrpCents: 500,
    gtin: null,
    prices: std(260),
  },
  {
    sku: 'CDR-MINI',
    name: 'Cedar & Sage Guest Bar',
    recipe: 'Cedar & sage',
    scentNotes: 'Cedarwood, clary sage',
    description: 'Guest-size cedar and sage.',
    netWeightG: 56,
    cutWeightG: 65,
    casePack: 24,
    msrpCents: 500,
    gtin: null,
    prices: std(260),
  },
  {
    sku: 'HNY-XL',
    name: 'Honey Oat Kitchen Block',
    recipe: 'Honey oat',
    scentNotes: 'Warm honey, toasted oat',
    description: 'A large block for the kitchen sink.',
    netWeightG: 170,
    cutWeightG: 195,
    casePack: 8,
    msrpCents: 1500,
    gtin: null,
    prices: std(750),
  },
  {
    sku: 'UNS-XL',
    name: 'Unscented Shea Family Block',
    recipe: 'Unscented shea',
    scentNotes: 'No added scent',
    description: 'A large unscented block for sensitive skin.',
    netWeightG: 170,
    cutWeightG: 195,
    casePack: 8,
    msrpCents: 1400,
    gtin: null,
    prices: std(700),
  },
]
