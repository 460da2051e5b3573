import { createHash, randomBytes } from 'node:crypto'
import bcrypt from 'bcryptjs'
import { Op, QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { ROLE_LABELS } from '@shared/permissions'
import type { SessionUser } from '@shared/schemas/auth'
import { invitationEmail, passwordResetEmail } from '@templates/email/auth'
import { env } from '@server/config/env'
import { pool, sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { sendMail } from '@server/lib/mailer'
import { AuthToken } from '@server/modules/auth/auth-token.model'
import { audit } from '@server/modules/audit/audit.service'
import { getSettings } from '@server/modules/settings/settings.service'
import { User } from '@server/modules/users/user.model'
import { forgetSessionsOf, rememberedUser } from '@server/modules/auth/session-cache'

const HOUR = 60 * 60 * 1000
export const TOKEN_LIFETIME = { reset: HOUR, invite: 7 * 24 * HOUR } as const

// Compared against when the e-mail is unknown, so a wrong address costs as long as a wrong password.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password', 10)

export function hashPassword(password: string) {
  return bcrypt.hash(password, env.BCRYPT_ROUNDS)
}

export function toSessionUser(u: {
  id: number
  email: string
  name: string
  role: SessionUser['role']
  shopId: number | null
}): SessionUser {
  return { id: u.id, email: u.email, name: u.name, role: u.role, shopId: u.shopId }
}

/** The user for valid credentials, or null. Inactive users and users without a password cannot sign in. */
export async function verifyCredentials(email: string, password: string): Promise<SessionUser | null> {
  const user = await User.findOne({ where: { email: email.toLowerCase() } })
  const ok = await bcrypt.compare(password, user?.passwordHash ?? DUMMY_HASH)
  if (!user || !ok || !user.active || !user.passwordHash) return null
  await user.update({ lastLoginAt: new Date() })
  return toSessionUser(user)
}

/** Loads the session's user on every request; a deactivated user's session stops working at once. */
/** The signed-in user a request acts as (remembered by this process: auth/session-cache.ts). */
export function loadSessionUser(id: number): Promise<SessionUser | null> {
  return rememberedUser(id, () => readSessionUser(id))
}

async function readSessionUser(id: number): Promise<SessionUser | null> {
  const { rows } = await pool.query<{
    id: number
    email: string
    name: string
    role: SessionUser['role']
    shop_id: number | null
  }>('SELECT id, email, name, role, shop_id FROM users WHERE id = $1 AND active', [id])
  const r = rows[0]
  return r ? { id: r.id, email: r.email, name: r.name, role: r.role, shopId: r.shop_id } : null
}

const sha256 = (s: string) => createHash('sha256').update(s).digest('hex')

export async function issueToken(userId: number, purpose: 'reset' | 'invite', transaction?: Transaction) {
  const token = randomBytes(32).toString('base64url')
  await AuthToken.create(
    {
      userId,
      purpose,
      tokenHash: sha256(token),
      expiresAt: new Date(Date.now() + TOKEN_LIFETIME[purpose]),
      usedAt: null,
    },
    { transaction },
  )
  return token
}

async function findLiveToken(token: string, transaction?: Transaction) {
  const row = await AuthToken.findOne({
    where: { tokenHash: sha256(token), usedAt: null, expiresAt: { [Op.gt]: new Date() } },
    transaction,
    lock: transaction ? transaction.LOCK.UPDATE : undefined,
  })
  if (!row) throw AppError.field('token', 'This link has expired or was already used. Ask for a new one.')
  return row
}

/** What the set-password page shows before the person types anything. */
export async function describeToken(token: string) {
  const row = await findLiveToken(token)
  const user = await User.findByPk(row.userId)
  if (!user || !user.active)
    throw AppError.field('token', 'This link has expired or was already used. Ask for a new one.')
  return { purpose: row.purpose, email: user.email, name: user.name }
}

/** Always succeeds from the caller's view, so the form does not reveal which addresses exist. */
export async function requestPasswordReset(email: string) {
  const user = await User.findOne({ where: { email, active: true } })
  if (!user) return
  const token = await issueToken(user.id, 'reset')
  const settings = await getSettings()
  const mail = passwordResetEmail({
    name: user.name,
    link: `${env.APP_URL}/set-password?token=${token}`,
    studioName: settings.studio.name,
  })
  // Not awaited: how long the answer takes must not tell whether the address has an account, and a
  // slow relay must not hold the page. sendMail never throws; a refusal is logged and the buyer asks again.
  void sendMail({ to: user.email, ...mail })
}

/** Uses a reset or invitation token once: sets the password and ends every other session of the user. */
export async function setPasswordWithToken(token: string, password: string) {
  const passwordHash = await hashPassword(password)
  await sequelize.transaction(async (t) => {
    const row = await findLiveToken(token, t)
    const user = await User.findByPk(row.userId, { transaction: t, lock: t.LOCK.UPDATE })
    if (!user || !user.active)
      throw AppError.field('token', 'This link has expired or was already used. Ask for a new one.')
    await user.update({ passwordHash }, { transaction: t })
    await AuthToken.update(
      { usedAt: new Date() },
      { where: { userId: user.id, usedAt: null }, transaction: t },
    )
    await sequelize.query(`DELETE FROM sessions WHERE (sess->'passport'->>'user') = $1`, {
      bind: [String(user.id)],
      transaction: t,
    })
    forgetSessionsOf(user.id, t)
    await audit(
      {
        userId: user.id,
        action: row.purpose === 'invite' ? 'invitation.accepted' : 'password.reset',
        entity: 'user',
        entityId: user.id,
      },
      t,
    )
  })
}

export async function sendInvitation(user: User, transaction?: Transaction) {
  const token = await issueToken(user.id, 'invite', transaction)
  const settings = await getSettings()
  let shopName: string | null = null
  if (user.shopId) {
    const rows = await sequelize.query<{ trading_name: string }>(
      'SELECT trading_name FROM shops WHERE id = $1',
      {
        bind: [user.shopId],
        type: QueryTypes.SELECT,
        transaction,
      },
    )
    shopName = rows[0]?.trading_name ?? null
  }
  const mail = invitationEmail({
    name: user.name,
    link: `${env.APP_URL}/set-password?token=${token}`,
    studioName: settings.studio.name,
    roleLabel: ROLE_LABELS[user.role],
    shopName,
  })
  return { to: user.email, ...mail }
}

/** Changes one's own password; every other session of the person ends, this one stays. */
export async function changePassword(
  userId: number,
  currentPassword: string,
  newPassword: string,
  keepSid: string,
) {
  const user = await User.findByPk(userId)
  if (!user?.passwordHash || !(await bcrypt.compare(currentPassword, user.passwordHash))) {
    throw AppError.field('currentPassword', 'That is not your current password.')
  }
  const passwordHash = await hashPassword(newPassword)
  await sequelize.transaction(async (t) => {
    await user.update({ passwordHash }, { transaction: t })
    await sequelize.query(`DELETE FROM sessions WHERE (sess->'passport'->>'user') = $1 AND sid <> $2`, {
      bind: [String(userId), keepSid],
      transaction: t,
    })
    forgetSessionsOf(userId, t)
    await audit({ userId, action: 'password.changed', entity: 'user', entityId: userId }, t)
  })
}
