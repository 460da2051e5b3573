import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { casesFromBars } from '@shared/domain/availability/availability'
import { isoToday } from '@shared/domain/dates/dates'
import { selectPriceBreak } from '@shared/domain/pricing/pricing'
import type { CartDto, CartLineDto, CartLineInput, PriceBreakDto } from '@shared/schemas/orders'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { readyStockByProduct } from '@server/modules/availability/availability.service'
import { CartLine } from '@server/modules/cart/cart-line.model'
import { sellableProducts } from '@server/modules/catalogue/catalogue.service'
import { price, pricingSettings } from '@server/modules/orders/order-pricing'
import { orderingShop, taxExemptOn } from '@server/modules/orders/order-shop'
import { promisePreorders } from '@server/modules/orders/preorders.service'
import { photoUrl } from '@server/modules/products/products.service'
import { getSettings } from '@server/modules/settings/settings.service'
import { isShopOrderable } from '@server/modules/shops/shops.service'

/** As many products as one order may carry. */
export const CART_MAX_LINES = 200

type Row = {
  product_id: number
  cases: number
  preorder: boolean
  sku: string
  name: string
  case_pack: number
  net_weight_g: number
  active: boolean
  photo_sha256: string | null
  breaks: PriceBreakDto[]
}

/**
 * The shop's cart as the buyer sees it: each line at the break its case count pays, today's ready
 * stock beside it (and the pre-order date curing stock could promise), the order's totals from
 * priceOrder and the minimum that applies. A line whose product went off sale or lost its price
 * stays in the cart, marked unavailable and left out of the totals.
 */
export async function getCart(shopId: number): Promise<CartDto> {
  const settings = await getSettings()
  const shop = await orderingShop(shopId)
  const today = isoToday(new Date(), settings.timeZone)
  const rows = await sequelize.query<Row>(
    `SELECT c.product_id, c.cases, c.preorder, p.sku, p.name, p.case_pack, p.net_weight_g, p.active,
            u.sha256 AS photo_sha256,
            COALESCE(json_agg(json_build_object('minCases', b.min_cases, 'unitPriceCents', b.unit_price_cents)
                              ORDER BY b.min_cases) FILTER (WHERE b.id IS NOT NULL), '[]') AS breaks
       FROM cart_lines c
       JOIN products p ON p.id = c.product_id
       LEFT JOIN price_breaks b ON b.product_id = p.id AND b.tier_id = $2
       LEFT JOIN uploads u ON u.id = p.photo_upload_id
      WHERE c.shop_id = $1
      GROUP BY c.product_id, c.cases, c.preorder, p.id, u.sha256
      ORDER BY p.name, p.id`,
    { bind: [shopId, shop.tierId], type: QueryTypes.SELECT },
  )
  const stock = rows.length > 0 ? await readyStockByProduct(rows.map((r) => r.product_id)) : new Map()
  const readyBars = new Map(rows.map((r) => [r.product_id, stock.get(r.product_id)?.readyBars ?? 0]))

  const lines = rows.map((r) => {
    const priceBreak = r.active ? selectPriceBreak(r.breaks, r.cases) : null
    return { row: r, priceBreak, bars: r.cases * r.case_pack }
  })
  const priced = lines.filter((l) => l.priceBreak !== null)
  const taxExempt = taxExemptOn(shop, today)
  const isOpeningOrder = !shop.openingOrderDone
  const minimumCents = isOpeningOrder ? settings.openingMinimumCents : settings.reorderMinimumCents
  const pricing =
    priced.length === 0
      ? {
          lines: [],
          subtotalCents: 0,
          weightG: 0,
          shippingCents: 0,
          taxCents: 0,
          totalCents: 0,
          minimumCents,
          belowMinimumByCents: minimumCents,
        }
      : price({
          lines: priced.map((l) => ({
            productId: l.row.product_id,
            cases: l.row.cases,
            casePack: l.row.case_pack,
            netWeightG: l.row.net_weight_g,
            breaks: l.row.breaks,
          })),
          isOpeningOrder,
          ...pricingSettings(settings),
          taxExempt,
        })
  const pricedLine = new Map(pricing.lines.map((l) => [l.productId, l]))

  // Promise dates: binding for pre-order lines when placed; here an estimate, also for short lines.
  const askPromise = lines.filter(
    (l) => l.priceBreak && (l.row.preorder || l.bars > (readyBars.get(l.row.product_id) ?? 0)),
  )
  const promises = await promisePreorders(
    askPromise.map((l) => ({ key: l.row.product_id, productId: l.row.product_id, bars: l.bars })),
    today,
    { readyBars },
  )

  const dtoLines: CartLineDto[] = lines.map(({ row: r, priceBreak, bars }) => {
    const s = stock.get(r.product_id) ?? { readyBars: 0, nextReady: null }
    const p = pricedLine.get(r.product_id)
    const promisedDate = promises.dates.get(r.product_id) ?? null
    const stockState: CartLineDto['stock'] = !priceBreak
      ? 'unavailable'
      : r.preorder
        ? promisedDate
          ? 'preorder'
          : 'preorder_short'
        : bars <= s.readyBars
          ? 'ready'
          : 'short'
    return {
      productId: r.product_id,
      sku: r.sku,
      name: r.name,
      casePack: r.case_pack,
      netWeightG: r.net_weight_g,
      photoUrl: r.photo_sha256 ? photoUrl(r.product_id, r.photo_sha256.trim()) : null,
      cases: r.cases,
      bars,
      preorder: r.preorder,
      priceBreaks: r.active ? r.breaks : [],
      priceBreak,
      nextBreak: r.active ? (r.breaks.find((b) => b.minCases > r.cases) ?? null) : null,
      unitPriceCents: p?.unitPriceCents ?? 0,
      lineTotalCents: p?.lineTotalCents ?? 0,
      readyBars: s.readyBars,
      readyCases: casesFromBars(s.readyBars, r.case_pack),
      nextReady: s.nextReady,
      stock: stockState,
      promisedDate: stockState === 'ready' ? null : promisedDate,
    }
  })
  const accountOrderable = await isShopOrderable(shopId)
  return {
    lines: dtoLines,
    cases: dtoLines.reduce((n, l) => n + l.cases, 0),
    subtotalCents: pricing.subtotalCents,
    weightG: pricing.weightG,
    shippingCents: pricing.shippingCents,
    taxCents: pricing.taxCents,
    totalCents: pricing.totalCents,
    taxRatePct: settings.taxRatePct,
    taxExempt,
    minimumKind: isOpeningOrder ? 'opening' : 'reorder',
    minimumCents: pricing.minimumCents,
    belowMinimumByCents: pricing.belowMinimumByCents,
    canPlace:
      accountOrderable &&
      dtoLines.length > 0 &&
      pricing.belowMinimumByCents === 0 &&
      dtoLines.every((l) => l.stock === 'ready' || l.stock === 'preorder'),
    accountOrderable,
    currency: settings.currency,
  }
}

/** Writes one product's line (the cart keeps one per product, ready or pre-order); other lines stay. */
async function putLine(
  shopId: number,
  userId: number,
  productId: number,
  line: { cases: number; preorder: boolean },
  t: Transaction,
) {
  await CartLine.destroy({ where: { shopId, productId }, transaction: t })
  await CartLine.create(
    { shopId, productId, cases: line.cases, preorder: line.preorder, updatedBy: userId },
    { transaction: t },
  )
}

async function requireRoom(shopId: number, t: Transaction) {
  const [row] = await sequelize.query<{ n: number }>(
    'SELECT count(DISTINCT product_id)::int AS n FROM cart_lines WHERE shop_id = $1',
    {
      bind: [shopId],
      type: QueryTypes.SELECT,
      transaction: t,
    },
  )
  if ((row?.n ?? 0) > CART_MAX_LINES) {
    throw AppError.unprocessable(
      'cart_full',
      `A cart holds at most ${CART_MAX_LINES} products: place an order first.`,
    )
  }
}

/** `PUT /api/cart/lines/:productId`: the product must be in the shop's catalogue (else 404). */
export async function setCartLine(
  shopId: number,
  userId: number,
  productId: number,
  input: CartLineInput & { preorder: boolean },
): Promise<CartDto> {
  const products = await sellableProducts({ shopId }, [productId])
  if (!products.has(productId)) throw AppError.notFound('That product')
  await sequelize.transaction(async (t) => {
    await putLine(shopId, userId, productId, { cases: input.cases, preorder: input.preorder }, t)
    await requireRoom(shopId, t)
  })
  return getCart(shopId)
}

export async function removeCartLine(shopId: number, productId: number): Promise<CartDto> {
  const removed = await CartLine.destroy({ where: { shopId, productId } })
  if (removed === 0) throw AppError.notFound('That cart line')
  return getCart(shopId)
}

export async function clearCart(shopId: number): Promise<CartDto> {
  await CartLine.destroy({ where: { shopId } })
  return getCart(shopId)
}

/**
 * Puts lines into the cart at today's prices (a product already there takes the new case count).
 * Products no longer on sale or priced for the shop are left out and reported.
 */
export async function addLinesToCart(
  shopId: number,
  userId: number,
  lines: readonly { productId: number; sku: string; name: string; cases: number }[],
): Promise<{ cart: CartDto; skipped: { productId: number; sku: string; name: string }[] }> {
  const products = await sellableProducts(
    { shopId },
    lines.map((l) => l.productId),
  )
  const skipped = lines
    .filter((l) => !products.has(l.productId))
    .map(({ productId, sku, name }) => ({ productId, sku, name }))
  await sequelize.transaction(async (t) => {
    for (const l of lines) {
      if (products.has(l.productId))
        await putLine(shopId, userId, l.productId, { cases: l.cases, preorder: false }, t)
    }
    await requireRoom(shopId, t)
  })
  return { cart: await getCart(shopId), skipped }
}
