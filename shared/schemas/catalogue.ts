import type { PriceBreakDto } from '@shared/schemas/orders'

/**
 * One product as a buyer's catalogue shows it (`GET /api/catalogue`, DESIGN.md contract): the
 * shop's own tier's price breaks only, never a cost, a margin or another tier's price.
 */
export type CatalogueItem = {
  productId: number
  sku: string
  name: string
  casePack: number
  netWeightG: number
  msrpCents: number
  priceBreaks: PriceBreakDto[]
  readyBars: number
  readyCases: number
  nextReady: { date: string; bars: number } | null
  scentNotes: string | null
  description: string | null
  photoUrl: string | null
}

export type CatalogueDto = { items: CatalogueItem[] }
