import type { Request, Response } from 'express'
import { can } from '@shared/permissions'
import {
  BatchIdParamsSchema,
  ListBatchesQuerySchema,
  RecordBatchSchema,
  StockMoveBodySchema,
  SuggestLotsQuerySchema,
  UpdateBatchSchema,
} from '@shared/schemas/batches'
import { AppError } from '@server/lib/app-error'
import { currentUser } from '@server/middlewares/require-role'
import { body, params, query } from '@server/middlewares/validate'
import * as batches from '@server/modules/batches/batches.service'

/** Packers see batches and their stock, never what a bar cost. */
const withCosts = (req: Request) => can(currentUser(req).role, 'costs.view')

export async function products(_req: Request, res: Response) {
  res.json({ items: await batches.listPourableProducts() })
}

export async function suggest(req: Request, res: Response) {
  res.json({ suggestion: await batches.suggestLots(query(req, SuggestLotsQuerySchema)) })
}

export async function list(req: Request, res: Response) {
  res.json({
    items: await batches.listBatches(query(req, ListBatchesQuerySchema), { withCosts: withCosts(req) }),
  })
}

export async function record(req: Request, res: Response) {
  const batch = await batches.recordBatch(body(req, RecordBatchSchema), currentUser(req).id)
  res.status(201).json({ batch })
}

export async function detail(req: Request, res: Response) {
  const { id } = params(req, BatchIdParamsSchema)
  const batch = await batches.getBatch(id, { withCosts: withCosts(req) })
  if (!batch) throw AppError.notFound('That batch')
  res.json({ batch })
}

export async function update(req: Request, res: Response) {
  const { id } = params(req, BatchIdParamsSchema)
  res.json({ batch: await batches.updateBatch(id, body(req, UpdateBatchSchema), currentUser(req).id) })
}

export async function move(req: Request, res: Response) {
  const { id } = params(req, BatchIdParamsSchema)
  const result = await batches.adjustStock(id, body(req, StockMoveBodySchema), currentUser(req).id)
  res.status(201).json(result)
}
