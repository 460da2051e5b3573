import type { Request, Response } from 'express'
import { InviteUserSchema, UpdateUserSchema, UserIdParamsSchema } from '@shared/schemas/users'
import { currentUser } from '@server/middlewares/require-role'
import { body, params } from '@server/middlewares/validate'
import * as users from '@server/modules/users/users.service'

export async function list(_req: Request, res: Response) {
  res.json({ items: await users.listUsers() })
}

export async function invite(req: Request, res: Response) {
  const user = await users.inviteUser(body(req, InviteUserSchema), currentUser(req).id)
  res.status(201).json({ user })
}

export async function update(req: Request, res: Response) {
  const { id } = params(req, UserIdParamsSchema)
  res.json({ user: await users.updateUser(id, body(req, UpdateUserSchema), currentUser(req).id) })
}

export async function reinvite(req: Request, res: Response) {
  const { id } = params(req, UserIdParamsSchema)
  await users.resendInvitation(id, currentUser(req).id)
  res.status(204).end()
}
