import type { Request, Response } from 'express'
import {
  CardCheckoutParamsSchema,
  PaymentIdParamsSchema,
  ProblemIdParamsSchema,
  RefundSchema,
} from '@shared/schemas/card-payments'
import type { CardPaymentsStatusDto } from '@shared/schemas/card-payments'
import { InvoiceIdParamsSchema } from '@shared/schemas/invoices'
import { buyerShopId, currentUser } from '@server/middlewares/require-role'
import { body, params } from '@server/middlewares/validate'
import { cardPaymentsEnabled } from '@server/modules/card-payments/card-provider'
import * as svc from '@server/modules/card-payments/card-payments.service'

export function status(_req: Request, res: Response) {
  const dto: CardPaymentsStatusDto = { enabled: cardPaymentsEnabled() }
  res.json(dto)
}

export async function checkout(req: Request, res: Response) {
  const user = currentUser(req)
  const checkout = await svc.createCheckout(params(req, InvoiceIdParamsSchema).id, {
    userId: user.id,
    shopId: buyerShopId(req),
  })
  res.status(201).json({ checkout })
}

export async function checkoutState(req: Request, res: Response) {
  const p = params(req, CardCheckoutParamsSchema)
  res.json({ checkout: await svc.checkoutState(p.id, p.sessionId, buyerShopId(req)) })
}

export async function webhook(req: Request, res: Response) {
  res.json(await svc.handleWebhook(req.body, req.get('stripe-signature')))
}

export async function refund(req: Request, res: Response) {
  const result = await svc.refundPayment(
    params(req, PaymentIdParamsSchema).id,
    body(req, RefundSchema),
    currentUser(req).id,
  )
  res.status(201).json(result)
}

export async function problems(_req: Request, res: Response) {
  res.json({ items: await svc.listProblems() })
}

export async function dismiss(req: Request, res: Response) {
  await svc.dismissProblem(params(req, ProblemIdParamsSchema).id, currentUser(req).id)
  res.status(204).end()
}
