import { zodResolver } from '@hookform/resolvers/zod'
import { useMutation } from '@tanstack/react-query'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { ChangePasswordFormSchema } from '@shared/schemas/auth'
import type { ChangePasswordInput } from '@shared/schemas/auth'
import { Button } from '@/components/ui/button'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { api } from '@/lib/api-client'
import { applyApiErrors } from '@/lib/form-errors'

type Values = z.infer<typeof ChangePasswordFormSchema>

export function ChangePasswordForm() {
  const change = useMutation({
    meta: { handlesError: true },
    mutationFn: (input: ChangePasswordInput) => api<void>('/auth/password', { method: 'PUT', body: input }),
  })
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<Values>({
    resolver: zodResolver(ChangePasswordFormSchema),
    defaultValues: { currentPassword: '', newPassword: '', confirm: '' },
  })
  const { errors } = form.formState
  const submit = form.handleSubmit(async ({ currentPassword, newPassword }) => {
    setFormError(null)
    try {
      await change.mutateAsync({ currentPassword, newPassword })
      form.reset()
      toast.success('Password changed. Other devices have been signed out.')
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['currentPassword', 'newPassword']))
    }
  })
  return (
    <form onSubmit={submit} noValidate className="flex max-w-sm flex-col gap-4">
      {formError ? <FormError message={formError} /> : null}
      <Field label="Current password" error={errors.currentPassword?.message}>
        <Input type="password" autoComplete="current-password" {...form.register('currentPassword')} />
      </Field>
      <Field label="New password" hint="At least 10 characters." error={errors.newPassword?.message}>
        <Input type="password" autoComplete="new-password" {...form.register('newPassword')} />
      </Field>
      <Field label="Type the new one again" error={errors.confirm?.message}>
        <Input type="password" autoComplete="new-password" {...form.register('confirm')} />
      </Field>
      <Button type="submit" loading={change.isPending} className="w-fit">
        Change password
      </Button>
    </form>
  )
}
