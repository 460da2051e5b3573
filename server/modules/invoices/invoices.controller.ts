import type { Request, Response } from 'express'
import { InvoiceIdParamsSchema, InvoiceListQuerySchema, VoidInvoiceSchema } from '@shared/schemas/invoices'
import { PackingOrderParamsSchema } from '@shared/schemas/packing'
import { currentUser } from '@server/middlewares/require-role'
import { body, params, query } from '@server/middlewares/validate'
import type { InvoiceViewer } from '@server/modules/invoices/invoice-queries'
import { invoiceFilename, renderInvoicePdf } from '@server/modules/invoices/invoice-mail'
import {
  invoiceList,
  invoicesCsv,
  raiseInvoiceByOwner,
  requireInvoice,
  resendInvoice,
  voidInvoice,
} from '@server/modules/invoices/invoices.service'
import { csvAttachment } from '@server/modules/invoices/spreadsheet'

/** A buyer reads only their own shop's invoices; the owner reads all (rights checked by the route). */
function viewer(req: Request): InvoiceViewer {
  const u = currentUser(req)
  return u.role === 'buyer' ? { role: 'buyer', shopId: u.shopId ?? -1 } : { role: 'owner', shopId: null }
}

export async function list(req: Request, res: Response) {
  res.json({ items: await invoiceList(viewer(req), query(req, InvoiceListQuerySchema)) })
}

export async function detail(req: Request, res: Response) {
  res.json({ invoice: await requireInvoice(params(req, InvoiceIdParamsSchema).id, viewer(req)) })
}

export async function pdf(req: Request, res: Response) {
  const invoice = await requireInvoice(params(req, InvoiceIdParamsSchema).id, viewer(req))
  const file = await renderInvoicePdf(invoice)
  res
    .type('application/pdf')
    .set('Content-Disposition', `inline; filename="${invoiceFilename(invoice)}"`)
    .send(file)
}

export async function voidOne(req: Request, res: Response) {
  res.json(
    await voidInvoice(
      params(req, InvoiceIdParamsSchema).id,
      body(req, VoidInvoiceSchema),
      currentUser(req).id,
    ),
  )
}

export async function send(req: Request, res: Response) {
  res.json(await resendInvoice(params(req, InvoiceIdParamsSchema).id, currentUser(req).id))
}

export async function raise(req: Request, res: Response) {
  const ref = await raiseInvoiceByOwner(params(req, PackingOrderParamsSchema).id, currentUser(req).id)
  res.status(201).json({ invoice: await requireInvoice(ref.id, viewer(req)) })
}

export async function csv(req: Request, res: Response) {
  csvAttachment(res, 'invoices', await invoicesCsv(query(req, InvoiceListQuerySchema)))
}
