import { Router } from 'express'
import multer from 'multer'
import {
  IMPORT_MAX_BYTES,
  IdParamsSchema,
  ImportBodySchema,
  PurchaseListQuerySchema,
  PurchaseSchema,
  UpdatePurchaseSchema,
} from '@shared/schemas/ingredients'
import { requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/purchases/purchases.controller'

// One CSV file in memory; a larger one is refused with 413 before it is read.
const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: IMPORT_MAX_BYTES, files: 1, fields: 5 },
})

export function purchasesRoutes() {
  const r = Router()
  r.use(requireRight('ingredients.manage'))
  r.get('/', validate({ query: PurchaseListQuerySchema }), c.list)
  r.post('/', validate({ body: PurchaseSchema }), c.create)
  r.post('/import/preview', upload.single('file'), validate({ body: ImportBodySchema }), c.preview)
  r.post('/import/confirm', upload.single('file'), validate({ body: ImportBodySchema }), c.confirm)
  r.get('/:id', validate({ params: IdParamsSchema }), c.get)
  r.patch('/:id', validate({ params: IdParamsSchema, body: UpdatePurchaseSchema }), c.update)
  return r
}
