import type { Request, Response } from 'express'
import { can } from '@shared/permissions'
import {
  ApproveShopSchema,
  CertificateFieldsSchema,
  DeclineShopSchema,
  InviteBuyerSchema,
  ShopIdParamsSchema,
  ShopListQuerySchema,
  ShopUpdateSchema,
} from '@shared/schemas/shops'
import { AppError } from '@server/lib/app-error'
import { buyerShopId, currentUser } from '@server/middlewares/require-role'
import { body, params, query } from '@server/middlewares/validate'
import { attachmentHeader, certificateOf } from '@server/modules/shops/certificate-file'
import { readCertificate } from '@server/modules/shops/certificate.service'
import * as shops from '@server/modules/shops/shops.service'
import type { StatusMove } from '@server/modules/shops/shops.service'

export async function mine(req: Request, res: Response) {
  res.json({ shop: await shops.getShop(buyerShopId(req)) })
}

export async function list(req: Request, res: Response) {
  res.json({ items: await shops.listShops(query(req, ShopListQuerySchema)) })
}

export async function detail(req: Request, res: Response) {
  res.json({ shop: await shops.getShopAccount(params(req, ShopIdParamsSchema).id) })
}

export async function update(req: Request, res: Response) {
  const { id } = params(req, ShopIdParamsSchema)
  res.json({ shop: await shops.updateShop(id, body(req, ShopUpdateSchema), currentUser(req).id) })
}

export async function approve(req: Request, res: Response) {
  const { id } = params(req, ShopIdParamsSchema)
  res.json(await shops.approveShop(id, body(req, ApproveShopSchema), currentUser(req).id))
}

export async function decline(req: Request, res: Response) {
  const { id } = params(req, ShopIdParamsSchema)
  res.json({ shop: await shops.declineShop(id, body(req, DeclineShopSchema), currentUser(req).id) })
}

export function move(to: StatusMove) {
  return async (req: Request, res: Response) => {
    const { id } = params(req, ShopIdParamsSchema)
    res.json({ shop: await shops.moveShop(id, to, currentUser(req).id) })
  }
}

export async function inviteBuyer(req: Request, res: Response) {
  const { id } = params(req, ShopIdParamsSchema)
  res
    .status(201)
    .json({ buyer: await shops.inviteBuyer(id, body(req, InviteBuyerSchema), currentUser(req).id) })
}

async function sendCertificate(res: Response, shopId: number) {
  const file = await readCertificate(shopId)
  res.set({
    'Content-Type': file.contentType,
    'Content-Disposition': attachmentHeader(file.filename),
    'X-Content-Type-Options': 'nosniff',
    'Content-Security-Policy': "default-src 'none'; sandbox",
    'Content-Length': String(file.data.length),
  })
  res.end(file.data)
}

/** The owner gets any shop's certificate; a buyer only their own shop's (another shop's is 404). */
export async function certificate(req: Request, res: Response) {
  const { id } = params(req, ShopIdParamsSchema)
  const user = currentUser(req)
  if (!can(user.role, 'shops.manage')) {
    if (!can(user.role, 'shop.own')) throw AppError.forbidden()
    if (user.shopId !== id) throw AppError.notFound('That resale certificate')
  }
  await sendCertificate(res, id)
}

export async function myCertificate(req: Request, res: Response) {
  await sendCertificate(res, buyerShopId(req))
}

export async function replaceCertificate(req: Request, res: Response) {
  const { id } = params(req, ShopIdParamsSchema)
  const user = currentUser(req)
  await shops.replaceCertificate(id, certificateOf(req), body(req, CertificateFieldsSchema), {
    ...user,
    role: 'owner',
  })
  res.json({ shop: await shops.getShopAccount(id) })
}

export async function renewMyCertificate(req: Request, res: Response) {
  const id = buyerShopId(req)
  const user = currentUser(req)
  await shops.replaceCertificate(id, certificateOf(req), body(req, CertificateFieldsSchema), {
    ...user,
    role: 'buyer',
  })
  res.json({ shop: await shops.getShop(id) })
}
