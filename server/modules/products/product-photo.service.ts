import { createHash } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import { PHOTO_MAX_BYTES } from '@shared/schemas/products'
import type { PhotoType, ProductRow } from '@shared/schemas/products'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { Product } from '@server/modules/products/product.model'
import { getProduct } from '@server/modules/products/products.service'
import { PHOTO_EXTENSION, safeFilename, sniffImageType } from '@server/modules/products/photo-file'
import { invalidateCatalogue } from '@server/modules/catalogue/catalogue-cache'

/** Stores the photo in `uploads` and points the product at it; the previous photo is deleted. */
export async function saveProductPhoto(
  productId: number,
  file: { buffer: Buffer; originalname?: string } | undefined,
  byUserId: number,
): Promise<ProductRow> {
  if (!file || file.buffer.length === 0) throw AppError.field('photo', 'Choose a photo to upload.')
  // multer stops at the limit already; this keeps the rule true if the limit is ever set elsewhere.
  if (file.buffer.length > PHOTO_MAX_BYTES) {
    throw AppError.field('photo', 'The photo is larger than 2 MB.', 413, 'payload_too_large')
  }
  const type = sniffImageType(file.buffer)
  if (!type) throw AppError.field('photo', 'The photo must be a JPEG, PNG or WebP image.')
  await sequelize.transaction(async (t) => {
    const product = await Product.findByPk(productId, { transaction: t, lock: t.LOCK.UPDATE })
    if (!product) throw AppError.notFound('That product')
    const filename = safeFilename(file.originalname, type, product.sku.toLowerCase())
    const sha256 = createHash('sha256').update(file.buffer).digest('hex')
    const [inserted] = await sequelize.query<{ id: number }>(
      `INSERT INTO uploads (purpose, filename, content_type, size_bytes, sha256, data, uploaded_by)
       VALUES ('product_photo', $1, $2, $3, $4, $5, $6) RETURNING id`,
      {
        bind: [filename, type, file.buffer.length, sha256, file.buffer, byUserId],
        type: QueryTypes.SELECT,
        transaction: t,
      },
    )
    const previous = product.photoUploadId
    await product.update({ photoUploadId: inserted!.id }, { transaction: t })
    invalidateCatalogue(t)
    if (previous) {
      await sequelize.query(`DELETE FROM uploads WHERE id = $1 AND purpose = 'product_photo'`, {
        bind: [previous],
        transaction: t,
      })
    }
    await audit(
      {
        userId: byUserId,
        action: 'product.photo',
        entity: 'product',
        entityId: productId,
        data: { uploadId: inserted!.id, sha256, contentType: type, sizeBytes: file.buffer.length },
      },
      t,
    )
  })
  return getProduct(productId)
}

export async function removeProductPhoto(productId: number, byUserId: number): Promise<ProductRow> {
  await sequelize.transaction(async (t) => {
    const product = await Product.findByPk(productId, { transaction: t, lock: t.LOCK.UPDATE })
    if (!product) throw AppError.notFound('That product')
    const previous = product.photoUploadId
    if (!previous) return
    await product.update({ photoUploadId: null }, { transaction: t })
    invalidateCatalogue(t)
    await sequelize.query(`DELETE FROM uploads WHERE id = $1 AND purpose = 'product_photo'`, {
      bind: [previous],
      transaction: t,
    })
    await audit(
      { userId: byUserId, action: 'product.photo_removed', entity: 'product', entityId: productId },
      t,
    )
  })
  return getProduct(productId)
}

export type StoredPhoto = {
  data: Buffer
  contentType: PhotoType
  filename: string
  sha256: string
  sizeBytes: number
}

export async function readProductPhoto(productId: number): Promise<StoredPhoto> {
  const [row] = await sequelize.query<{
    data: Buffer
    content_type: string
    filename: string
    sha256: string
    size_bytes: number
  }>(
    `SELECT u.data, u.content_type, u.filename, u.sha256, u.size_bytes
       FROM products p JOIN uploads u ON u.id = p.photo_upload_id
      WHERE p.id = $1 AND u.purpose = 'product_photo'`,
    { bind: [productId], type: QueryTypes.SELECT },
  )
  // Only the three image types are ever served, whatever a row might say.
  const contentType = row && (Object.keys(PHOTO_EXTENSION) as PhotoType[]).find((t) => t === row.content_type)
  if (!row || !contentType) throw AppError.notFound('That photo')
  return {
    data: row.data,
    contentType,
    filename: row.filename,
    sha256: row.sha256.trim(),
    sizeBytes: row.size_bytes,
  }
}
