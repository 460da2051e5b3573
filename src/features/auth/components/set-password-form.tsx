import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { SetPasswordFormSchema } from '@shared/schemas/auth'
import { Button } from '@/components/ui/button'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { useSetPassword } from '@/features/auth/api/session'
import { applyApiErrors } from '@/lib/form-errors'

type Values = z.infer<typeof SetPasswordFormSchema>

export function SetPasswordForm({
  token,
  email,
  onDone,
}: {
  token: string
  email: string
  onDone: () => void
}) {
  const setPassword = useSetPassword()
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<Values>({
    resolver: zodResolver(SetPasswordFormSchema),
    defaultValues: { password: '', confirm: '' },
  })
  const { errors } = form.formState

  const submit = form.handleSubmit(async ({ password }) => {
    setFormError(null)
    try {
      await setPassword.mutateAsync({ token, password })
      onDone()
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['password']))
    }
  })

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      {formError ? <FormError message={formError} /> : null}
      <input type="email" value={email} autoComplete="username" readOnly hidden />
      <Field
        label="New password"
        hint="At least 10 characters. A short sentence works well."
        error={errors.password?.message}
      >
        <Input type="password" autoComplete="new-password" autoFocus {...form.register('password')} />
      </Field>
      <Field label="Type it again" error={errors.confirm?.message}>
        <Input type="password" autoComplete="new-password" {...form.register('confirm')} />
      </Field>
      <Button type="submit" loading={setPassword.isPending} className="w-full">
        Save password
      </Button>
    </form>
  )
}
