// zod/mini, not the full zod: the sign-in page loads this file before anything else of the app,
// and zod/mini's functions tree-shake where the full zod's methods cannot (about 20 KB gzipped less
// on the first page; DEVELOPERS.md, "The sign-in page and zod/mini"). The schemas are zod's own
// (zod/v4/core) and mix with the full zod's anywhere: users.ts builds on EmailSchema.
import { z } from 'zod/mini'
import { ROLES } from '@shared/permissions'

export const EmailSchema = z.pipe(
  z
    .string({ error: 'Enter an e-mail address.' })
    .check(z.trim(), z.toLowerCase(), z.maxLength(254, 'An e-mail address has at most 254 characters.')),
  z.email({ error: 'Enter a valid e-mail address.' }),
)

/** At least 10 characters: long passwords beat complicated rules (NIST SP 800-63B). */
export const NewPasswordSchema = z
  .string({ error: 'Enter a password.' })
  .check(z.minLength(10, 'Use at least 10 characters.'), z.maxLength(200, 'Use at most 200 characters.'))

export const LoginSchema = z.object({
  email: EmailSchema,
  password: z
    .string({ error: 'Enter your password.' })
    .check(
      z.minLength(1, 'Enter your password.'),
      z.maxLength(200, 'A password has at most 200 characters.'),
    ),
})
export type LoginInput = z.infer<typeof LoginSchema>

export const PasswordResetRequestSchema = z.object({ email: EmailSchema })
export type PasswordResetRequestInput = z.infer<typeof PasswordResetRequestSchema>

export const SetPasswordSchema = z.object({
  token: z
    .string({ error: 'This link is not valid.' })
    .check(z.minLength(20, 'This link is not valid.'), z.maxLength(200, 'This link is not valid.')),
  password: NewPasswordSchema,
})
export type SetPasswordInput = z.infer<typeof SetPasswordSchema>

/** The client form adds a confirmation field that never leaves the browser. */
export const SetPasswordFormSchema = z
  .object({ password: NewPasswordSchema, confirm: z.string() })
  .check(
    z.refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ.' }),
  )

export const SessionUserSchema = z.object({
  id: z.number().check(z.int()),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  shopId: z.nullable(z.number().check(z.int())),
})
export type SessionUser = z.infer<typeof SessionUserSchema>

export const ChangePasswordSchema = z.object({
  currentPassword: z
    .string({ error: 'Enter your current password.' })
    .check(
      z.minLength(1, 'Enter your current password.'),
      z.maxLength(200, 'A password has at most 200 characters.'),
    ),
  newPassword: NewPasswordSchema,
})
export type ChangePasswordInput = z.infer<typeof ChangePasswordSchema>

export const ChangePasswordFormSchema = z
  .extend(ChangePasswordSchema, { confirm: z.string() })
  .check(
    z.refine((v) => v.newPassword === v.confirm, { path: ['confirm'], message: 'The two passwords differ.' }),
  )
