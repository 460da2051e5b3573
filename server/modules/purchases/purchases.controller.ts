import type { Request, Response } from 'express'
import {
  IdParamsSchema,
  ImportBodySchema,
  PurchaseListQuerySchema,
  PurchaseSchema,
  UpdatePurchaseSchema,
} from '@shared/schemas/ingredients'
import { AppError } from '@server/lib/app-error'
import { currentUser } from '@server/middlewares/require-role'
import { body, params, query } from '@server/middlewares/validate'
import {
  confirmImport,
  csvTextFromBytes,
  previewImport,
} from '@server/modules/purchases/purchase-import.service'
import * as purchases from '@server/modules/purchases/purchases.service'

export async function list(req: Request, res: Response) {
  res.json({ items: await purchases.listPurchases(query(req, PurchaseListQuerySchema)) })
}

export async function create(req: Request, res: Response) {
  const purchase = await purchases.recordPurchase(body(req, PurchaseSchema), currentUser(req).id)
  res.status(201).json({ purchase })
}

export async function get(req: Request, res: Response) {
  res.json({ purchase: await purchases.getPurchase(params(req, IdParamsSchema).id) })
}

export async function update(req: Request, res: Response) {
  const { id } = params(req, IdParamsSchema)
  res.json({
    purchase: await purchases.updatePurchase(id, body(req, UpdatePurchaseSchema), currentUser(req).id),
  })
}

/** The CSV from an uploaded file (field `file`) or from the JSON body's `csv`. */
function importText(req: Request): string {
  if (req.file) return csvTextFromBytes(req.file.buffer)
  const { csv } = body(req, ImportBodySchema)
  if (csv === undefined || csv.trim() === '') {
    throw AppError.field('file', 'Choose a CSV file to upload, or paste the CSV text.')
  }
  return csv
}

export async function preview(req: Request, res: Response) {
  res.json(await previewImport(importText(req)))
}

export async function confirm(req: Request, res: Response) {
  res.status(201).json(await confirmImport(importText(req), currentUser(req).id))
}
