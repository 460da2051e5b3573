import { QueryTypes, UniqueConstraintError } from 'sequelize'
import type { Transaction } from 'sequelize'
import { NET_OVER_CUT_MESSAGE } from '@shared/schemas/products'
import type {
  PhotoType,
  ProductCreateInput,
  ProductRow,
  ProductUpdateInput,
  RecipeOption,
} from '@shared/schemas/products'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { Product } from '@server/modules/products/product.model'
import { productCosts } from '@server/modules/products/product-cost'
import { invalidateCatalogue } from '@server/modules/catalogue/catalogue-cache'

type Row = {
  id: number
  sku: string
  name: string
  scent_notes: string | null
  description: string | null
  recipe_id: number
  recipe_name: string
  bar_weight_g: string
  net_weight_g: number
  cut_weight_g: number
  case_pack: number
  msrp_cents: number
  gtin: string | null
  active: boolean
  photo_upload_id: number | null
  photo_sha256: string | null
  photo_content_type: PhotoType | null
  photo_size: number | null
  photo_filename: string | null
  price_break_count: number
  priced_tier_count: number
  declaration_confirmed_at: Date | null
  updated_at: Date
}

const SELECT = `
  SELECT p.id, p.sku, p.name, p.scent_notes, p.description, p.recipe_id, r.name AS recipe_name, r.bar_weight_g,
         p.net_weight_g, p.cut_weight_g, p.case_pack, p.msrp_cents, p.gtin, p.active, p.photo_upload_id,
         u.sha256 AS photo_sha256, u.content_type AS photo_content_type, u.size_bytes AS photo_size,
         u.filename AS photo_filename,
         (SELECT count(*)::int FROM price_breaks b WHERE b.product_id = p.id) AS price_break_count,
         (SELECT count(DISTINCT b.tier_id)::int FROM price_breaks b WHERE b.product_id = p.id) AS priced_tier_count,
         p.declaration_confirmed_at, p.updated_at
    FROM products p
    JOIN recipes r ON r.id = p.recipe_id
    LEFT JOIN uploads u ON u.id = p.photo_upload_id`

/** The photo's address; the version changes with the bytes, so a new photo is never served from a cache. */
export function photoUrl(productId: number, sha256: string) {
  return `/api/products/${productId}/photo?v=${sha256.slice(0, 16)}`
}

async function rows(id: number | null, transaction?: Transaction): Promise<ProductRow[]> {
  const found = await sequelize.query<Row>(`${SELECT} WHERE ($1::int IS NULL OR p.id = $1) ORDER BY p.sku`, {
    bind: [id],
    type: QueryTypes.SELECT,
    transaction,
  })
  const costs = await productCosts(
    found.map((r) => ({
      id: r.id,
      recipeId: r.recipe_id,
      cutWeightG: r.cut_weight_g,
      recipeBarWeightG: Number(r.bar_weight_g),
    })),
    transaction,
  )
  return found.map((r) => ({
    id: r.id,
    sku: r.sku,
    name: r.name,
    scentNotes: r.scent_notes,
    description: r.description,
    recipeId: r.recipe_id,
    recipeName: r.recipe_name,
    netWeightG: r.net_weight_g,
    cutWeightG: r.cut_weight_g,
    casePack: r.case_pack,
    msrpCents: r.msrp_cents,
    gtin: r.gtin,
    active: r.active,
    photo:
      r.photo_upload_id && r.photo_sha256
        ? {
            url: photoUrl(r.id, r.photo_sha256),
            sha256: r.photo_sha256,
            contentType: r.photo_content_type!,
            sizeBytes: r.photo_size!,
            filename: r.photo_filename!,
          }
        : null,
    costPerBarCents: costs.get(r.id)?.costPerBarCents ?? null,
    missingCosts: costs.get(r.id)?.missingCosts ?? [],
    priceBreakCount: r.price_break_count,
    pricedTierCount: r.priced_tier_count,
    declarationConfirmedAt: r.declaration_confirmed_at ? r.declaration_confirmed_at.toISOString() : null,
    updatedAt: r.updated_at.toISOString(),
  }))
}

export async function listProducts(): Promise<ProductRow[]> {
  return rows(null)
}

export async function getProduct(id: number, transaction?: Transaction): Promise<ProductRow> {
  const [row] = await rows(id, transaction)
  if (!row) throw AppError.notFound('That product')
  return row
}

/** Recipes a product can be made from: the ones not archived. */
export async function recipeOptions(): Promise<RecipeOption[]> {
  const found = await sequelize.query<{ id: number; name: string; bar_weight_g: string }>(
    'SELECT id, name, bar_weight_g FROM recipes WHERE archived_at IS NULL ORDER BY lower(name), id',
    { type: QueryTypes.SELECT },
  )
  return found.map((r) => ({ id: r.id, name: r.name, barWeightG: Number(r.bar_weight_g) }))
}

async function assertRecipeUsable(recipeId: number, transaction: Transaction) {
  const [recipe] = await sequelize.query<{ archived_at: Date | null }>(
    'SELECT archived_at FROM recipes WHERE id = $1',
    { bind: [recipeId], type: QueryTypes.SELECT, transaction },
  )
  if (!recipe) throw AppError.field('recipeId', 'Choose one of the studio’s recipes.')
  if (recipe.archived_at) throw AppError.field('recipeId', 'That recipe is archived: choose a current one.')
}

const SKU_TAKEN = 'Another product already has this SKU.'
const GTIN_TAKEN = 'Another product already has this GTIN.'

async function assertUnique(
  values: { sku?: string; gtin?: string | null },
  exceptId: number | null,
  transaction: Transaction,
) {
  if (values.sku !== undefined) {
    const clash = await Product.findOne({ where: { sku: values.sku }, transaction })
    if (clash && clash.id !== exceptId) throw AppError.field('sku', SKU_TAKEN, 409, 'sku_taken')
  }
  if (values.gtin) {
    const clash = await Product.findOne({ where: { gtin: values.gtin }, transaction })
    if (clash && clash.id !== exceptId) throw AppError.field('gtin', GTIN_TAKEN, 409, 'gtin_taken')
  }
}

/** Two saves racing past the checks above meet the unique indexes; they answer like the checks. */
function uniqueToConflict(err: unknown): never {
  if (err instanceof UniqueConstraintError) {
    const constraint = String((err.parent as { constraint?: string } | undefined)?.constraint ?? '')
    if (constraint === 'products_sku_key') throw AppError.field('sku', SKU_TAKEN, 409, 'sku_taken')
    if (constraint === 'products_gtin_key') throw AppError.field('gtin', GTIN_TAKEN, 409, 'gtin_taken')
  }
  throw err
}

export async function createProduct(input: ProductCreateInput, byUserId: number): Promise<ProductRow> {
  const id = await sequelize
    .transaction(async (t) => {
      await assertRecipeUsable(input.recipeId, t)
      await assertUnique({ sku: input.sku, gtin: input.gtin ?? null }, null, t)
      const product = await Product.create(
        {
          sku: input.sku,
          name: input.name,
          scentNotes: input.scentNotes ?? null,
          description: input.description ?? null,
          photoUploadId: null,
          recipeId: input.recipeId,
          netWeightG: input.netWeightG,
          cutWeightG: input.cutWeightG,
          casePack: input.casePack,
          msrpCents: input.msrpCents,
          gtin: input.gtin ?? null,
          active: input.active,
        },
        { transaction: t },
      )
      invalidateCatalogue(t)
      await audit(
        { userId: byUserId, action: 'product.created', entity: 'product', entityId: product.id, data: input },
        t,
      )
      return product.id
    })
    .catch(uniqueToConflict)
  return getProduct(id)
}

export async function updateProduct(
  id: number,
  patch: ProductUpdateInput,
  byUserId: number,
): Promise<ProductRow> {
  await sequelize
    .transaction(async (t) => {
      const product = await Product.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE })
      if (!product) throw AppError.notFound('That product')
      const netWeightG = patch.netWeightG ?? product.netWeightG
      const cutWeightG = patch.cutWeightG ?? product.cutWeightG
      if (netWeightG > cutWeightG) {
        throw AppError.field(
          patch.netWeightG !== undefined ? 'netWeightG' : 'cutWeightG',
          NET_OVER_CUT_MESSAGE,
        )
      }
      if (patch.recipeId !== undefined && patch.recipeId !== product.recipeId) {
        await assertRecipeUsable(patch.recipeId, t)
      }
      await assertUnique({ sku: patch.sku, gtin: patch.gtin }, id, t)
      const changes: Partial<Product> = {}
      for (const [key, value] of Object.entries(patch) as [keyof ProductUpdateInput, unknown][]) {
        if (value !== undefined) (changes as Record<string, unknown>)[key] = value
      }
      await product.update(changes, { transaction: t })
      invalidateCatalogue(t)
      await audit(
        { userId: byUserId, action: 'product.updated', entity: 'product', entityId: id, data: patch },
        t,
      )
    })
    .catch(uniqueToConflict)
  return getProduct(id)
}
