import { z } from 'zod'
import { ROLES } from '@shared/permissions'

export const EmailSchema = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .toLowerCase()
  .max(254, 'An e-mail address has at most 254 characters.')
  .pipe(z.email({ error: 'Enter a valid e-mail address.' }))

/** At least 10 characters: long passwords beat complicated rules (NIST SP 800-63B). */
export const NewPasswordSchema = z
  .string({ error: 'Enter a password.' })
  .min(10, 'Use at least 10 characters.')
  .max(200, 'Use at most 200 characters.')

export const LoginSchema = z.object({
  email: EmailSchema,
  password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(200),
})
export type LoginInput = z.infer<typeof LoginSchema>

export const PasswordResetRequestSchema = z.object({ email: EmailSchema })
export type PasswordResetRequestInput = z.infer<typeof PasswordResetRequestSchema>

export const SetPasswordSchema = z.object({
  token: z.string().min(20, 'This link is not valid.').max(200, 'This link is not valid.'),
  password: NewPasswordSchema,
})
export type SetPasswordInput = z.infer<typeof SetPasswordSchema>

/** The client form adds a confirmation field that never leaves the browser. */
export const SetPasswordFormSchema = z
  .object({ password: NewPasswordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ.' })

export const SessionUserSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  shopId: z.number().int().nullable(),
})
export type SessionUser = z.infer<typeof SessionUserSchema>

export const ChangePasswordSchema = z.object({
  currentPassword: z
    .string({ error: 'Enter your current password.' })
    .min(1, 'Enter your current password.')
    .max(200),
  newPassword: NewPasswordSchema,
})
export type ChangePasswordInput = z.infer<typeof ChangePasswordSchema>

export const ChangePasswordFormSchema = ChangePasswordSchema.extend({ confirm: z.string() }).refine(
  (v) => v.newPassword === v.confirm,
  { path: ['confirm'], message: 'The two passwords differ.' },
)
