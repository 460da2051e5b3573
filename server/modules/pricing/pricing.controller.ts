import type { Request, Response } from 'express'
import { AcceptSuggestionsSchema, PriceBreaksSchema, PricingParamsSchema } from '@shared/schemas/pricing'
import { currentUser } from '@server/middlewares/require-role'
import { body, params } from '@server/middlewares/validate'
import * as pricing from '@server/modules/pricing/pricing.service'

export async function overview(_req: Request, res: Response) {
  res.json(await pricing.pricingOverview())
}

export async function saveBreaks(req: Request, res: Response) {
  const { productId, tierId } = params(req, PricingParamsSchema)
  const { breaks } = body(req, PriceBreaksSchema)
  res.json(await pricing.savePriceBreaks(productId, tierId, breaks, currentUser(req).id))
}

export async function accept(req: Request, res: Response) {
  res.json(await pricing.acceptSuggestions(body(req, AcceptSuggestionsSchema), currentUser(req).id))
}
