import { z } from 'zod'
import { recordId } from '@shared/schemas/record-id'
import { ROLES } from '@shared/permissions'
import { EmailSchema } from '@shared/schemas/auth'

export const InviteUserSchema = z
  .object({
    email: EmailSchema,
    name: z.string().trim().min(1, 'Enter a name.').max(120, 'At most 120 characters.'),
    role: z.enum(ROLES, { error: 'Choose a role.' }),
    shopId: z.coerce.number<string | number>().int().positive().max(2_147_483_647).nullish(),
  })
  .refine((v) => v.role !== 'buyer' || !!v.shopId, {
    path: ['shopId'],
    message: 'A buyer belongs to a shop.',
  })
export type InviteUserInput = z.infer<typeof InviteUserSchema>

export const UpdateUserSchema = z.object({
  name: z.string().trim().min(1, 'Enter a name.').max(120).optional(),
  active: z.boolean().optional(),
})
export type UpdateUserInput = z.infer<typeof UpdateUserSchema>

export const UserIdParamsSchema = z.object({ id: recordId('Not a user.') })

export type UserRow = {
  id: number
  email: string
  name: string
  role: (typeof ROLES)[number]
  shopId: number | null
  shopName: string | null
  active: boolean
  invitationPending: boolean
  lastLoginAt: string | null
}
