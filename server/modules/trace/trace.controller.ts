import type { Request, Response } from 'express'
import { LotIdParamsSchema, TraceLotsQuerySchema } from '@shared/schemas/batches'
import { params, query } from '@server/middlewares/validate'
import * as trace from '@server/modules/trace/trace.service'

export async function lots(req: Request, res: Response) {
  res.json({ items: await trace.listTraceableLots(query(req, TraceLotsQuerySchema).q || undefined) })
}

export async function show(req: Request, res: Response) {
  res.json({ trace: await trace.traceLot(params(req, LotIdParamsSchema).lotId) })
}

export async function csv(req: Request, res: Response) {
  const result = await trace.traceLot(params(req, LotIdParamsSchema).lotId)
  res
    .status(200)
    .type('text/csv; charset=utf-8')
    .attachment(trace.traceCsvFilename(result))
    .send(trace.traceCsv(result))
}
