import type { Request, Response } from 'express'
import {
  DeclarationConfirmSchema,
  ProductCreateSchema,
  ProductIdParamsSchema,
  ProductUpdateSchema,
} from '@shared/schemas/products'
import { currentUser } from '@server/middlewares/require-role'
import { body, params } from '@server/middlewares/validate'
import * as declarations from '@server/modules/products/declaration.service'
import * as photos from '@server/modules/products/product-photo.service'
import * as products from '@server/modules/products/products.service'

export async function list(_req: Request, res: Response) {
  res.json({ items: await products.listProducts() })
}

export async function recipeOptions(_req: Request, res: Response) {
  res.json({ items: await products.recipeOptions() })
}

export async function get(req: Request, res: Response) {
  res.json({ product: await products.getProduct(params(req, ProductIdParamsSchema).id) })
}

export async function create(req: Request, res: Response) {
  const product = await products.createProduct(body(req, ProductCreateSchema), currentUser(req).id)
  res.status(201).json({ product })
}

export async function update(req: Request, res: Response) {
  const { id } = params(req, ProductIdParamsSchema)
  res.json({ product: await products.updateProduct(id, body(req, ProductUpdateSchema), currentUser(req).id) })
}

export async function uploadPhoto(req: Request, res: Response) {
  const { id } = params(req, ProductIdParamsSchema)
  res.json({ product: await photos.saveProductPhoto(id, req.file, currentUser(req).id) })
}

export async function removePhoto(req: Request, res: Response) {
  const { id } = params(req, ProductIdParamsSchema)
  res.json({ product: await photos.removeProductPhoto(id, currentUser(req).id) })
}

/**
 * The photo bytes, under the type sniffed when it was stored. nosniff and an inline disposition
 * with a plain file name keep a browser from treating it as anything but that image; the ETag is
 * the content's SHA-256, so a cached copy is revalidated cheaply (304) and never goes stale.
 */
export async function photo(req: Request, res: Response) {
  const stored = await photos.readProductPhoto(params(req, ProductIdParamsSchema).id)
  res.set({
    'Content-Type': stored.contentType,
    'X-Content-Type-Options': 'nosniff',
    'Content-Disposition': `inline; filename="${stored.filename}"`,
    'Cache-Control': 'private, no-cache',
    ETag: `"${stored.sha256}"`,
  })
  res.send(stored.data)
}

export async function declaration(req: Request, res: Response) {
  res.json({ declaration: await declarations.getDeclaration(params(req, ProductIdParamsSchema).id) })
}

export async function confirmDeclaration(req: Request, res: Response) {
  const { id } = params(req, ProductIdParamsSchema)
  const { text } = body(req, DeclarationConfirmSchema)
  res.json({ declaration: await declarations.confirmDeclaration(id, text, currentUser(req).id) })
}
