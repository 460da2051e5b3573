import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { casesFromBars } from '@shared/domain/availability/availability'
import type { CatalogueItem } from '@shared/schemas/catalogue'
import type { PriceBreakDto } from '@shared/schemas/orders'
import { pool, sequelize } from '@server/db/sequelize'
import { readyStockByProduct, studioToday } from '@server/modules/availability/availability.service'
import { photoUrl } from '@server/modules/products/products.service'
import { cachedCatalogue, cachedShopTier, constantBody } from '@server/modules/catalogue/catalogue-cache'
import type { CachedBody } from '@server/modules/catalogue/catalogue-cache'

/** A product a shop may order: on sale and priced at the shop's tier (its breaks ascending). */
export type SellableProduct = {
  productId: number
  sku: string
  name: string
  casePack: number
  netWeightG: number
  msrpCents: number
  scentNotes: string | null
  description: string | null
  photoUrl: string | null
  priceBreaks: PriceBreakDto[]
}

type Row = {
  id: number
  sku: string
  name: string
  case_pack: number
  net_weight_g: number
  msrp_cents: number
  scent_notes: string | null
  description: string | null
  photo_sha256: string | null
  breaks: PriceBreakDto[]
}

/**
 * One query: active products with at least one break in the tier, and only that tier's breaks.
 * Nothing here reads a cost, a margin or another tier. `tier` is the tier's id, or the shop whose
 * tier it is (so a buyer's catalogue needs no separate look-up of the shop).
 */
export async function sellableProducts(
  tier: { tierId: number } | { shopId: number },
  productIds: number[] | null = null,
  transaction?: Transaction,
): Promise<Map<number, SellableProduct>> {
  const tierSql = 'tierId' in tier ? '$1::int' : '(SELECT tier_id FROM shops WHERE id = $1)'
  const rows = await sequelize.query<Row>(
    `SELECT p.id, p.sku, p.name, p.case_pack, p.net_weight_g, p.msrp_cents, p.scent_notes, p.description,
            u.sha256 AS photo_sha256,
            json_agg(json_build_object('minCases', b.min_cases, 'unitPriceCents', b.unit_price_cents)
                     ORDER BY b.min_cases) AS breaks
       FROM products p
       JOIN price_breaks b ON b.product_id = p.id AND b.tier_id = ${tierSql}
       LEFT JOIN uploads u ON u.id = p.photo_upload_id
      WHERE p.active AND ($2::int[] IS NULL OR p.id = ANY($2::int[]))
      GROUP BY p.id, u.sha256
      ORDER BY p.name, p.id`,
    {
      bind: ['tierId' in tier ? tier.tierId : tier.shopId, productIds],
      type: QueryTypes.SELECT,
      transaction,
    },
  )
  return new Map(
    rows.map((r) => [
      r.id,
      {
        productId: r.id,
        sku: r.sku,
        name: r.name,
        casePack: r.case_pack,
        netWeightG: r.net_weight_g,
        msrpCents: r.msrp_cents,
        scentNotes: r.scent_notes,
        description: r.description,
        photoUrl: r.photo_sha256 ? photoUrl(r.id, r.photo_sha256.trim()) : null,
        priceBreaks: r.breaks,
      },
    ]),
  )
}

/** The catalogue of a tier, or of a shop at its tier, with ready stock: two queries in all. */
export async function catalogue(tier: { tierId: number } | { shopId: number }): Promise<CatalogueItem[]> {
  const products = [...(await sellableProducts(tier)).values()]
  if (products.length === 0) return []
  const stock = await readyStockByProduct(products.map((p) => p.productId))
  return products.map((p) => {
    const s = stock.get(p.productId) ?? { readyBars: 0, nextReady: null }
    return {
      productId: p.productId,
      sku: p.sku,
      name: p.name,
      casePack: p.casePack,
      netWeightG: p.netWeightG,
      msrpCents: p.msrpCents,
      priceBreaks: p.priceBreaks,
      readyBars: s.readyBars,
      readyCases: casesFromBars(s.readyBars, p.casePack),
      nextReady: s.nextReady,
      scentNotes: p.scentNotes,
      description: p.description,
      photoUrl: p.photoUrl,
    }
  })
}

const NO_TIER = constantBody(JSON.stringify({ items: [] }))

/** `GET /api/catalogue`'s body for a shop: its tier's cached JSON (catalogue-cache.ts), made at most once per change. */
export async function catalogueJsonForShop(shopId: number): Promise<CachedBody> {
  const tierId = await cachedShopTier(shopId, async () => {
    const { rows } = await pool.query<{ tier_id: number | null }>('SELECT tier_id FROM shops WHERE id = $1', [
      shopId,
    ])
    return rows[0]?.tier_id ?? null
  })
  if (tierId === null) return NO_TIER
  return cachedCatalogue(`${tierId}|${await studioToday()}`, async () =>
    JSON.stringify({ items: await catalogue({ tierId }) }),
  )
}
