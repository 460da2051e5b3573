import type { Request, Response } from 'express'
import { BatchSheetRequestSchema, RecipeSheetQuerySchema } from '@shared/schemas/batch-sheet'
import { isoToday } from '@shared/domain/dates/dates'
import { RecipeIdParamsSchema } from '@shared/schemas/recipes'
import { renderPdf } from '@server/lib/pdf'
import { body, params, query } from '@server/middlewares/validate'
import { batchSheetForOils, batchSheetForRecipe } from '@server/modules/batch-sheet/batch-sheet.service'
import { getSettings } from '@server/modules/settings/settings.service'
import { batchSheetDocument } from '@templates/pdf/batch-sheet'

export async function forOils(req: Request, res: Response) {
  res.json(await batchSheetForOils(body(req, BatchSheetRequestSchema)))
}

export async function forRecipe(req: Request, res: Response) {
  const sheet = await batchSheetForRecipe(
    params(req, RecipeIdParamsSchema).id,
    query(req, RecipeSheetQuerySchema),
  )
  res.json({ sheet })
}

export async function forRecipePdf(req: Request, res: Response) {
  const sheet = await batchSheetForRecipe(
    params(req, RecipeIdParamsSchema).id,
    query(req, RecipeSheetQuerySchema),
  )
  const settings = await getSettings()
  const pdf = await renderPdf(
    batchSheetDocument({
      studio: settings.studio,
      sheet,
      printedOn: isoToday(new Date(), settings.timeZone),
    }),
  )
  const slug =
    sheet.recipeName
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '') || 'recipe'
  res
    .type('application/pdf')
    .set('Content-Disposition', `inline; filename="batch-sheet-${slug}.pdf"`)
    .send(pdf)
}
