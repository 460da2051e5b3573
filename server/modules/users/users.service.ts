import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import type { InviteUserInput, UpdateUserInput, UserRow } from '@shared/schemas/users'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { sendMail } from '@server/lib/mailer'
import { audit } from '@server/modules/audit/audit.service'
import { sendInvitation } from '@server/modules/auth/auth.service'
import { Shop } from '@server/modules/shops/shop.model'
import { User } from '@server/modules/users/user.model'
import { forgetSessionsOf, forgetUser } from '@server/modules/auth/session-cache'

type Row = {
  id: number
  email: string
  name: string
  role: UserRow['role']
  shop_id: number | null
  shop_name: string | null
  active: boolean
  has_password: boolean
  last_login_at: Date | null
}

export async function listUsers(
  filter: { shopId?: number } = {},
  transaction?: Transaction,
): Promise<UserRow[]> {
  const rows = await sequelize.query<Row>(
    `SELECT u.id, u.email, u.name, u.role, u.shop_id, s.trading_name AS shop_name, u.active,
            (u.password_hash IS NOT NULL) AS has_password, u.last_login_at
       FROM users u LEFT JOIN shops s ON s.id = u.shop_id
      WHERE ($1::int IS NULL OR u.shop_id = $1)
      ORDER BY CASE u.role WHEN 'owner' THEN 0 WHEN 'packer' THEN 1 ELSE 2 END, s.trading_name NULLS FIRST, u.name`,
    { bind: [filter.shopId ?? null], type: QueryTypes.SELECT, transaction },
  )
  return rows.map((r) => ({
    id: r.id,
    email: r.email,
    name: r.name,
    role: r.role,
    shopId: r.shop_id,
    shopName: r.shop_name,
    active: r.active,
    invitationPending: !r.has_password,
    lastLoginAt: r.last_login_at ? r.last_login_at.toISOString() : null,
  }))
}

async function rowOf(id: number, transaction?: Transaction) {
  const row = (await listUsers({}, transaction)).find((u) => u.id === id)
  if (!row) throw AppError.notFound('That person')
  return row
}

/**
 * Creates the user without a password and e-mails a set-password link. Inside a caller's
 * transaction (opening a shop account together with its first buyer) the user is created in it
 * and the e-mail goes out only once that transaction commits.
 */
export async function inviteUser(
  input: InviteUserInput,
  byUserId: number,
  opts: { transaction?: Transaction } = {},
): Promise<UserRow> {
  const shopId = input.role === 'buyer' ? (input.shopId ?? null) : null
  const create = async (t: Transaction) => {
    if (await User.findOne({ where: { email: input.email }, transaction: t })) {
      throw AppError.field(
        'email',
        'Someone with this e-mail address already has an account.',
        409,
        'email_taken',
      )
    }
    if (shopId) {
      const shop = await Shop.findByPk(shopId, { transaction: t })
      if (!shop || shop.status === 'applied' || shop.status === 'declined') {
        throw AppError.field('shopId', 'Choose an open shop account.')
      }
    }
    const user = await User.create(
      {
        email: input.email,
        name: input.name,
        role: input.role,
        shopId,
        passwordHash: null,
        lastLoginAt: null,
      },
      { transaction: t },
    )
    await audit(
      {
        userId: byUserId,
        action: 'user.invited',
        entity: 'user',
        entityId: user.id,
        data: { role: user.role },
      },
      t,
    )
    return { id: user.id, mail: await sendInvitation(user, t) }
  }
  const outer = opts.transaction
  if (outer) {
    const made = await create(outer)
    outer.afterCommit(async () => {
      await sendMail(made.mail)
    })
    return rowOf(made.id, outer)
  }
  const mail = await sequelize.transaction(create)
  await sendMail(mail.mail)
  return rowOf(mail.id)
}

export async function resendInvitation(id: number, byUserId: number) {
  const user = await User.findByPk(id)
  if (!user) throw AppError.notFound('That person')
  if (user.passwordHash) throw AppError.conflict('already_joined', 'This person has already set a password.')
  const mail = await sendInvitation(user)
  await audit({ userId: byUserId, action: 'user.reinvited', entity: 'user', entityId: id })
  await sendMail(mail)
}

export async function updateUser(id: number, patch: UpdateUserInput, byUserId: number): Promise<UserRow> {
  if (id === byUserId && patch.active === false) {
    throw AppError.field('active', 'You cannot deactivate your own account.', 422, 'cannot_deactivate_self')
  }
  await sequelize.transaction(async (t) => {
    const user = await User.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE })
    if (!user) throw AppError.notFound('That person')
    await user.update(patch, { transaction: t })
    forgetUser(id, t)
    if (patch.active === false) {
      await sequelize.query(`DELETE FROM sessions WHERE (sess->'passport'->>'user') = $1`, {
        bind: [String(id)],
        transaction: t,
      })
      forgetSessionsOf(id, t)
    }
    await audit({ userId: byUserId, action: 'user.updated', entity: 'user', entityId: id, data: patch }, t)
  })
  return rowOf(id)
}
