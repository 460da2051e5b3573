import { Router } from 'express'
import type { Request, Response } from 'express'
import { SalesQuerySchema } from '@shared/schemas/sales'
import { requireRight } from '@server/middlewares/require-role'
import { query, validate } from '@server/middlewares/validate'
import { csvAttachment } from '@server/modules/invoices/spreadsheet'
import { salesCsv, salesReport } from '@server/modules/sales/sales.service'

/** Mounted at /api: `/sales` and `/sales.csv` (owner only: revenue, costs and margins). */
export function salesRoutes() {
  const r = Router()
  const guard = [requireRight('reports.view'), validate({ query: SalesQuerySchema })]
  r.get('/sales', ...guard, async (req: Request, res: Response) => {
    res.json({ report: await salesReport(query(req, SalesQuerySchema)) })
  })
  r.get('/sales.csv', ...guard, async (req: Request, res: Response) => {
    const report = await salesReport(query(req, SalesQuerySchema))
    csvAttachment(res, `sales-by-${report.by}-${report.from}-to`, salesCsv(report))
  })
  return r
}
