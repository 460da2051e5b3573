import { Router } from 'express'
import type { RequestHandler } from 'express'
import multer from 'multer'
import {
  DeclarationConfirmSchema,
  PHOTO_MAX_BYTES,
  ProductCreateSchema,
  ProductIdParamsSchema,
  ProductUpdateSchema,
} from '@shared/schemas/products'
import { AppError } from '@server/lib/app-error'
import { requireAuth, requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/products/products.controller'

// In memory, one file, 2 MB: a larger file stops at the limit and answers 413.
const parsePhoto = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: PHOTO_MAX_BYTES, files: 1, fields: 0, parts: 1 },
}).single('photo')

/** multer's own errors, said about the `photo` field the form shows them beside. */
const photoUpload: RequestHandler = (req, res, next) => {
  parsePhoto(req, res, (err: unknown) => {
    if (!err) return next()
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') {
        return next(AppError.field('photo', 'The photo is larger than 2 MB.', 413, 'payload_too_large'))
      }
      return next(AppError.field('photo', 'Send one image file, in the form field named “photo”.'))
    }
    next(err)
  })
}

export function productsRoutes() {
  const r = Router()
  const id = validate({ params: ProductIdParamsSchema })
  // Shops see product photos in the catalogue: any signed-in person may load one.
  r.get('/:id/photo', requireAuth, id, c.photo)

  r.use(requireRight('products.manage'))
  r.get('/', c.list)
  r.get('/recipe-options', c.recipeOptions)
  r.post('/', validate({ body: ProductCreateSchema }), c.create)
  r.get('/:id', id, c.get)
  r.patch('/:id', validate({ params: ProductIdParamsSchema, body: ProductUpdateSchema }), c.update)
  r.post('/:id/photo', id, photoUpload, c.uploadPhoto)
  r.delete('/:id/photo', id, c.removePhoto)
  r.get('/:id/declaration', id, c.declaration)
  r.post(
    '/:id/declaration',
    validate({ params: ProductIdParamsSchema, body: DeclarationConfirmSchema }),
    c.confirmDeclaration,
  )
  return r
}
