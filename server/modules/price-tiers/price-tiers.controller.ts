import type { Request, Response } from 'express'
import { TierCreateSchema, TierIdParamsSchema, TierUpdateSchema } from '@shared/schemas/pricing'
import { currentUser } from '@server/middlewares/require-role'
import { body, params } from '@server/middlewares/validate'
import * as tiers from '@server/modules/price-tiers/price-tiers.service'

export async function list(_req: Request, res: Response) {
  res.json({ items: await tiers.listTiers() })
}

export async function create(req: Request, res: Response) {
  res.status(201).json({ tier: await tiers.createTier(body(req, TierCreateSchema), currentUser(req).id) })
}

export async function update(req: Request, res: Response) {
  const { id } = params(req, TierIdParamsSchema)
  res.json({ tier: await tiers.updateTier(id, body(req, TierUpdateSchema), currentUser(req).id) })
}
