import type { Request, Response } from 'express'
import { InvoiceIdParamsSchema } from '@shared/schemas/invoices'
import { PaymentListQuerySchema, RecordPaymentSchema } from '@shared/schemas/payments'
import { currentUser } from '@server/middlewares/require-role'
import { body, params, query } from '@server/middlewares/validate'
import { csvAttachment } from '@server/modules/invoices/spreadsheet'
import { listPayments, paymentsCsv, recordPayment } from '@server/modules/payments/payments.service'
import { receivables as receivablesNow } from '@server/modules/payments/receivables.service'
import { remindInvoice } from '@server/modules/payments/reminders.service'

export async function record(req: Request, res: Response) {
  const result = await recordPayment(
    params(req, InvoiceIdParamsSchema).id,
    body(req, RecordPaymentSchema),
    currentUser(req).id,
  )
  res.status(201).json(result)
}

export async function list(req: Request, res: Response) {
  res.json({ items: await listPayments(query(req, PaymentListQuerySchema)) })
}

export async function csv(req: Request, res: Response) {
  csvAttachment(res, 'payments', await paymentsCsv(query(req, PaymentListQuerySchema)))
}

export async function receivables(_req: Request, res: Response) {
  res.json(await receivablesNow())
}

export async function remind(req: Request, res: Response) {
  res.json({ reminder: await remindInvoice(params(req, InvoiceIdParamsSchema).id, currentUser(req).id) })
}
