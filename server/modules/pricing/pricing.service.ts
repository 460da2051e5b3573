import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { formatCents } from '@shared/domain/money/money'
import {
  keystoneMsrpCents,
  marginPct,
  priceCheck,
  suggestedUnitPriceCents,
} from '@shared/domain/pricing/pricing'
import type {
  AcceptSuggestionsInput,
  PriceBreakView,
  PriceWarning,
  PricingCell,
  PricingItem,
  PricingOverview,
  TierRow,
} from '@shared/schemas/pricing'
import type { ErrorDetail } from '@shared/schemas/errors'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { listTiers } from '@server/modules/price-tiers/price-tiers.service'
import { PriceBreak } from '@server/modules/pricing/price-break.model'
import { productCosts } from '@server/modules/products/product-cost'
import { getSettings } from '@server/modules/settings/settings.service'
import { invalidateCatalogue } from '@server/modules/catalogue/catalogue-cache'

type ProductRow = {
  id: number
  sku: string
  name: string
  recipe_id: number
  recipe_name: string
  bar_weight_g: string
  cut_weight_g: number
  case_pack: number
  msrp_cents: number
}

const pct = (n: number) => `${Number(n.toFixed(1))} %`

/** The tier the keystone MSRP doubles: the one called Standard, or else the first in order. */
export function keystoneTier(tiers: readonly TierRow[]): TierRow | null {
  return tiers.find((t) => t.name.trim().toLowerCase() === 'standard') ?? tiers[0] ?? null
}

/** One product in one tier: its breaks, the 1-case price's margin and check, and the suggestion. */
export function pricingCell(
  tier: TierRow,
  breaks: readonly PriceBreakView[],
  costCents: number | null,
  priceStepCents: number,
): PricingCell {
  const sorted = [...breaks].sort((a, b) => a.minCases - b.minCases)
  const single = sorted.find((b) => b.minCases === 1) ?? null
  // A cost of 0 (nothing priced yet) suggests nothing: a price of 0 is no price.
  const cost = costCents != null && costCents > 0 ? costCents : null
  const check =
    single && cost != null
      ? priceCheck({
          priceCents: single.unitPriceCents,
          costCents: cost,
          targetMarginPct: tier.targetMarginPct,
        })
      : null
  const suggested = cost != null ? suggestedUnitPriceCents(cost, tier.targetMarginPct, priceStepCents) : null
  let blocked: PricingCell['suggestionBlocked'] = null
  if (suggested == null) blocked = 'no_cost'
  else if (single?.unitPriceCents === suggested) blocked = 'same_price'
  else if (sorted.some((b) => b.minCases > 1 && b.unitPriceCents > suggested)) blocked = 'price_rises'
  return {
    tierId: tier.id,
    breaks: sorted,
    singleCasePriceCents: single?.unitPriceCents ?? null,
    marginPct: single && costCents != null ? marginPct(single.unitPriceCents, costCents) : null,
    level: check?.level ?? null,
    suggestedUnitPriceCents: suggested,
    suggestionBlocked: blocked,
  }
}

/** The pricing rows of the given products (all active ones when `productIds` is null). */
async function pricingItems(
  productIds: number[] | null,
  tiers: TierRow[],
  priceStepCents: number,
  transaction?: Transaction,
): Promise<PricingItem[]> {
  const products = await sequelize.query<ProductRow>(
    `SELECT p.id, p.sku, p.name, p.recipe_id, r.name AS recipe_name, r.bar_weight_g, p.cut_weight_g,
            p.case_pack, p.msrp_cents
       FROM products p JOIN recipes r ON r.id = p.recipe_id
      WHERE ($1::int[] IS NULL AND p.active) OR p.id = ANY($1::int[])
      ORDER BY p.sku`,
    { bind: [productIds], type: QueryTypes.SELECT, transaction },
  )
  const ids = products.map((p) => p.id)
  const breaks = await sequelize.query<{
    tier_id: number
    product_id: number
    min_cases: number
    unit_price_cents: number
  }>(
    `SELECT tier_id, product_id, min_cases, unit_price_cents FROM price_breaks
      WHERE product_id = ANY($1::int[]) ORDER BY product_id, tier_id, min_cases`,
    { bind: [ids], type: QueryTypes.SELECT, transaction },
  )
  const costs = await productCosts(
    products.map((p) => ({
      id: p.id,
      recipeId: p.recipe_id,
      cutWeightG: p.cut_weight_g,
      recipeBarWeightG: Number(p.bar_weight_g),
    })),
    transaction,
  )
  const keystone = keystoneTier(tiers)
  return products.map((p) => {
    const cost = costs.get(p.id) ?? { costPerBarCents: null, missingCosts: [] }
    const cells = tiers.map((tier) =>
      pricingCell(
        tier,
        breaks
          .filter((b) => b.product_id === p.id && b.tier_id === tier.id)
          .map((b) => ({ minCases: b.min_cases, unitPriceCents: b.unit_price_cents })),
        cost.costPerBarCents,
        priceStepCents,
      ),
    )
    const keystonePrice = cells.find((c) => c.tierId === keystone?.id)?.singleCasePriceCents ?? null
    return {
      productId: p.id,
      sku: p.sku,
      name: p.name,
      recipeName: p.recipe_name,
      casePack: p.case_pack,
      msrpCents: p.msrp_cents,
      costPerBarCents: cost.costPerBarCents,
      missingCosts: cost.missingCosts,
      keystoneMsrpCents: keystonePrice == null ? null : keystoneMsrpCents(keystonePrice),
      cells,
    }
  })
}

export async function pricingOverview(): Promise<PricingOverview> {
  const settings = await getSettings()
  const tiers = await listTiers()
  return {
    currency: settings.currency,
    priceStepCents: settings.priceStepCents,
    tiers,
    keystoneTierId: keystoneTier(tiers)?.id ?? null,
    items: await pricingItems(null, tiers, settings.priceStepCents),
  }
}

async function lockProducts(ids: number[], transaction: Transaction): Promise<Set<number>> {
  const rows = await sequelize.query<{ id: number }>(
    'SELECT id FROM products WHERE id = ANY($1::int[]) ORDER BY id FOR UPDATE',
    { bind: [[...new Set(ids)]], type: QueryTypes.SELECT, transaction },
  )
  return new Set(rows.map((r) => r.id))
}

/**
 * Replaces one product's breaks in one tier. A break under the cost per bar is refused (422
 * under_cost, one detail per row); one under the tier's target margin is saved with a warning.
 */
export async function savePriceBreaks(
  productId: number,
  tierId: number,
  breaks: PriceBreakView[],
  byUserId: number,
): Promise<{ item: PricingItem; warnings: PriceWarning[] }> {
  return sequelize.transaction(async (t) => {
    if (!(await lockProducts([productId], t)).has(productId)) throw AppError.notFound('That product')
    const settings = await getSettings(t)
    const tiers = await listTiers(t)
    const tier = tiers.find((x) => x.id === tierId)
    if (!tier) throw AppError.notFound('That price tier')
    const [before] = await pricingItems([productId], tiers, settings.priceStepCents, t)
    const cost = before!.costPerBarCents
    const money = (c: number) => formatCents(c, settings.currency)

    const warnings: PriceWarning[] = []
    const underCost: ErrorDetail[] = []
    breaks.forEach((b, i) => {
      if (cost == null || cost <= 0) return
      const check = priceCheck({
        priceCents: b.unitPriceCents,
        costCents: cost,
        targetMarginPct: tier.targetMarginPct,
      })
      const field = `breaks.${i}.unitPriceCents`
      if (check.level === 'under_cost') {
        underCost.push({
          field,
          message: `${money(b.unitPriceCents)} is under the cost per bar of ${money(cost)}.`,
        })
      } else if (check.level === 'under_margin') {
        warnings.push({
          field,
          code: 'under_margin',
          marginPct: check.marginPct,
          message:
            `${money(b.unitPriceCents)} at ${b.minCases} ${b.minCases === 1 ? 'case' : 'cases'} earns ` +
            `${pct(check.marginPct)}, under ${tier.name}’s target of ${pct(tier.targetMarginPct)}.`,
        })
      }
    })
    if (underCost.length > 0) {
      throw AppError.unprocessable(
        'under_cost',
        underCost.length === 1 ? underCost[0]!.message : 'Some prices are under the cost per bar.',
        underCost,
      )
    }

    await PriceBreak.destroy({ where: { productId, tierId }, transaction: t })
    invalidateCatalogue(t)
    if (breaks.length > 0) {
      await PriceBreak.bulkCreate(
        [...breaks]
          .sort((a, b) => a.minCases - b.minCases)
          .map((b) => ({ productId, tierId, minCases: b.minCases, unitPriceCents: b.unitPriceCents })),
        { transaction: t },
      )
    }
    await audit(
      {
        userId: byUserId,
        action: 'price_breaks.replaced',
        entity: 'product',
        entityId: productId,
        data: { tierId, before: before!.cells.find((c) => c.tierId === tierId)?.breaks ?? [], after: breaks },
      },
      t,
    )
    const [item] = await pricingItems([productId], tiers, settings.priceStepCents, t)
    return { item: item!, warnings }
  })
}

/**
 * Sets each chosen product × tier's 1-case price to its suggestion, all or nothing. The price sent
 * must still be the suggestion (costs may have moved since the screen was drawn: 409
 * suggestion_changed), and the new 1-case price may not undercut a larger break (422 price_rises).
 */
export async function acceptSuggestions(
  input: AcceptSuggestionsInput,
  byUserId: number,
): Promise<{ accepted: number; items: PricingItem[] }> {
  return sequelize.transaction(async (t) => {
    const found = await lockProducts(
      input.items.map((i) => i.productId),
      t,
    )
    const settings = await getSettings(t)
    const tiers = await listTiers(t)
    const money = (c: number) => formatCents(c, settings.currency)
    const unknown: ErrorDetail[] = []
    input.items.forEach((it, i) => {
      if (!found.has(it.productId))
        unknown.push({ field: `items.${i}.productId`, message: 'There is no such product.' })
      if (!tiers.some((x) => x.id === it.tierId))
        unknown.push({ field: `items.${i}.tierId`, message: 'There is no such price tier.' })
    })
    if (unknown.length > 0)
      throw AppError.invalid('Some suggestions name a product or tier that does not exist.', unknown)

    const items = await pricingItems([...found], tiers, settings.priceStepCents, t)
    const cellOf = (productId: number, tierId: number) =>
      items.find((p) => p.productId === productId)!.cells.find((c) => c.tierId === tierId)!

    const changed: ErrorDetail[] = []
    const rises: ErrorDetail[] = []
    input.items.forEach((it, i) => {
      const cell = cellOf(it.productId, it.tierId)
      const field = `items.${i}.unitPriceCents`
      if (cell.suggestedUnitPriceCents == null) {
        changed.push({ field, message: 'This product has no cost yet, so there is no suggestion to accept.' })
      } else if (cell.suggestedUnitPriceCents !== it.unitPriceCents) {
        changed.push({
          field,
          message: `The suggestion is now ${money(cell.suggestedUnitPriceCents)}, not ${money(it.unitPriceCents)}. Reload and check it.`,
        })
      } else if (cell.suggestionBlocked === 'price_rises') {
        const higher = cell.breaks.find((b) => b.minCases > 1 && b.unitPriceCents > it.unitPriceCents)!
        rises.push({
          field,
          message: `The ${higher.minCases}-case break (${money(higher.unitPriceCents)}) would cost more than the new 1-case price; edit the breaks instead.`,
        })
      }
    })
    if (changed.length > 0) {
      throw AppError.conflict(
        'suggestion_changed',
        'Some suggestions have changed since the page was loaded.',
        changed,
      )
    }
    if (rises.length > 0) {
      throw AppError.unprocessable(
        'price_rises',
        'Some suggestions would make a larger order cost more per bar.',
        rises,
      )
    }

    invalidateCatalogue(t)
    for (const it of input.items) {
      await sequelize.query(
        `INSERT INTO price_breaks (tier_id, product_id, min_cases, unit_price_cents) VALUES ($1, $2, 1, $3)
         ON CONFLICT (tier_id, product_id, min_cases)
         DO UPDATE SET unit_price_cents = EXCLUDED.unit_price_cents, updated_at = now()`,
        { bind: [it.tierId, it.productId, it.unitPriceCents], transaction: t },
      )
      await audit(
        {
          userId: byUserId,
          action: 'price.suggestion_accepted',
          entity: 'product',
          entityId: it.productId,
          data: {
            tierId: it.tierId,
            before: cellOf(it.productId, it.tierId).singleCasePriceCents,
            after: it.unitPriceCents,
          },
        },
        t,
      )
    }
    return {
      accepted: input.items.length,
      items: await pricingItems([...found], tiers, settings.priceStepCents, t),
    }
  })
}
