import { z } from 'zod'

const cents = z.number().int().min(0)

export const ShippingBandSchema = z.object({
  maxWeightG: z.number().int().positive().nullable(),
  rateCents: cents,
})

/** Studio settings; each key has a default so a new studio works before anyone edits them. */
export const SettingsSchema = z.object({
  studio: z
    .object({
      name: z.string().trim().min(1).max(120),
      legalName: z.string().trim().max(160),
      email: z.string().trim().max(254),
      phone: z.string().trim().max(40),
      address: z.array(z.string().max(120)).max(5),
      taxId: z.string().trim().max(40),
    })
    .default({
      name: 'Lathercase Studio',
      legalName: 'Lathercase Studio',
      email: 'studio@lathercase.test',
      phone: '',
      address: [],
      taxId: '',
    }),
  currency: z.string().length(3).default('USD'),
  timeZone: z.string().default('UTC'),
  openingMinimumCents: cents.default(30000),
  reorderMinimumCents: cents.default(15000),
  shippingBands: z.array(ShippingBandSchema).default([
    { maxWeightG: 5000, rateCents: 1500 },
    { maxWeightG: 15000, rateCents: 2800 },
    { maxWeightG: 30000, rateCents: 4500 },
    { maxWeightG: null, rateCents: 6500 },
  ]),
  taxRatePct: z.number().min(0).max(30).default(0),
  invoicePrefix: z.string().trim().max(8).default('LC'),
  priceStepCents: z.number().int().min(1).max(1000).default(5),
  labourRateCents: cents.default(2400),
  autoConfirmGoodStanding: z.boolean().default(false),
  pourLeadTimeDays: z.number().int().min(0).max(60).default(7),
})
export type Settings = z.infer<typeof SettingsSchema>
export type SettingsKey = keyof Settings

export const DEFAULT_SETTINGS: Settings = SettingsSchema.parse({})
