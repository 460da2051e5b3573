import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { PasswordResetRequestSchema } from '@shared/schemas/auth'
import type { PasswordResetRequestInput } from '@shared/schemas/auth'
import { Button } from '@/components/ui/button'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { useRequestPasswordReset } from '@/features/auth/api/session'
import { applyApiErrors } from '@/lib/form-errors'

export function ForgotPasswordForm() {
  const request = useRequestPasswordReset()
  const [sentTo, setSentTo] = useState<string | null>(null)
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<PasswordResetRequestInput>({
    resolver: zodResolver(PasswordResetRequestSchema),
    defaultValues: { email: '' },
  })

  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      await request.mutateAsync(values)
      setSentTo(values.email)
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['email']))
    }
  })

  if (sentTo) {
    return (
      <div role="status" className="rounded-md bg-olive-50 p-4 text-sm text-olive-900">
        If <strong>{sentTo}</strong> belongs to an account, a link to choose a new password is on its way. It
        works once, for one hour.
      </div>
    )
  }
  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      {formError ? <FormError message={formError} /> : null}
      <Field label="E-mail" error={form.formState.errors.email?.message}>
        <Input type="email" autoComplete="email" autoFocus {...form.register('email')} />
      </Field>
      <Button type="submit" loading={request.isPending} className="w-full">
        Send me a reset link
      </Button>
    </form>
  )
}
