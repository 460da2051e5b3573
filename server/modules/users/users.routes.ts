import { Router } from 'express'
import { InviteUserSchema, UpdateUserSchema, UserIdParamsSchema } from '@shared/schemas/users'
import { requireRight } from '@server/middlewares/require-role'
import { validate } from '@server/middlewares/validate'
import * as c from '@server/modules/users/users.controller'

export function usersRoutes() {
  const r = Router()
  r.use(requireRight('users.manage'))
  r.get('/', c.list)
  r.post('/', validate({ body: InviteUserSchema }), c.invite)
  r.patch('/:id', validate({ params: UserIdParamsSchema, body: UpdateUserSchema }), c.update)
  r.post('/:id/invitation', validate({ params: UserIdParamsSchema }), c.reinvite)
  return r
}
