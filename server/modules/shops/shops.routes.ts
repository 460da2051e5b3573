import { Router } from 'express'
import {
  ApproveShopSchema,
  CertificateFieldsSchema,
  DeclineShopSchema,
  InviteBuyerSchema,
  ShopIdParamsSchema,
  ShopListQuerySchema,
  ShopUpdateSchema,
} from '@shared/schemas/shops'
import { requireAuth, requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import { receiveCertificate, validateWithCertificate } from '@server/modules/shops/certificate-file'
import * as c from '@server/modules/shops/shops.controller'

export function shopsRoutes() {
  const r = Router()
  const owner = requireRight('shops.manage')
  const buyer = requireRight('shop.own')
  const id = validate({ params: ShopIdParamsSchema })

  // The buyer's own shop (before /:id, which would read "mine" as an id).
  r.get('/mine', buyer, c.mine)
  r.get('/mine/certificate', buyer, c.myCertificate)
  r.put(
    '/mine/certificate',
    buyer,
    receiveCertificate,
    validateWithCertificate(CertificateFieldsSchema, { required: true }),
    c.renewMyCertificate,
  )

  // The owner's accounts.
  r.get('/', owner, validate({ query: ShopListQuerySchema }), c.list)
  r.get('/:id', owner, id, c.detail)
  r.patch('/:id', owner, validate({ params: ShopIdParamsSchema, body: ShopUpdateSchema }), c.update)
  r.post('/:id/approve', owner, validate({ params: ShopIdParamsSchema, body: ApproveShopSchema }), c.approve)
  r.post('/:id/decline', owner, validate({ params: ShopIdParamsSchema, body: DeclineShopSchema }), c.decline)
  r.post('/:id/hold', owner, id, c.move('hold'))
  r.post('/:id/close', owner, id, c.move('close'))
  r.post('/:id/reactivate', owner, id, c.move('reactivate'))
  r.post(
    '/:id/buyers',
    owner,
    validate({ params: ShopIdParamsSchema, body: InviteBuyerSchema }),
    c.inviteBuyer,
  )
  r.get('/:id/certificate', requireAuth, id, c.certificate)
  r.put(
    '/:id/certificate',
    owner,
    id,
    receiveCertificate,
    validateWithCertificate(CertificateFieldsSchema, { required: true }),
    c.replaceCertificate,
  )
  return r
}
