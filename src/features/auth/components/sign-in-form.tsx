import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { Link } from 'react-router-dom'
import { LoginSchema } from '@shared/schemas/auth'
import type { LoginInput, SessionUser } from '@shared/schemas/auth'
import { Button } from '@/components/ui/button'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { paths } from '@/config/paths'
import { useLogin } from '@/features/auth/api/session'
import { applyApiErrors } from '@/lib/form-errors'

export function SignInForm({ onSignedIn }: { onSignedIn: (user: SessionUser) => void }) {
  const login = useLogin()
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<LoginInput>({
    resolver: zodResolver(LoginSchema),
    defaultValues: { email: '', password: '' },
  })
  const { errors } = form.formState

  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      const { user } = await login.mutateAsync(values)
      onSignedIn(user)
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['email', 'password']))
    }
  })

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      {formError ? <FormError message={formError} /> : null}
      <Field label="E-mail" error={errors.email?.message}>
        <Input type="email" autoComplete="username" autoFocus {...form.register('email')} />
      </Field>
      <Field label="Password" error={errors.password?.message}>
        <Input type="password" autoComplete="current-password" {...form.register('password')} />
      </Field>
      <Button type="submit" loading={login.isPending} className="w-full">
        Sign in
      </Button>
      <p className="text-center text-sm">
        <Link to={paths.forgotPassword} className="text-olive-800 underline hover:text-olive-900">
          Forgot your password?
        </Link>
      </p>
    </form>
  )
}
