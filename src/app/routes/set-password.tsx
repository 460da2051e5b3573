import { useQuery } from '@tanstack/react-query'
import { Link, useNavigate, useSearchParams } from 'react-router-dom'
import { AuthLayout } from '@/components/layout/auth-layout'
import { LoadingBlock } from '@/components/ui/spinner'
import { toast } from '@/components/ui/toast'
import { paths } from '@/config/paths'
import { fetchTokenInfo } from '@/features/auth/api/session'
import { SetPasswordForm } from '@/features/auth/components/set-password-form'

export function Component() {
  const [params] = useSearchParams()
  const token = params.get('token') ?? ''
  const navigate = useNavigate()
  const info = useQuery({
    queryKey: ['auth', 'token', token],
    queryFn: () => fetchTokenInfo(token),
    enabled: token.length > 0,
    retry: false,
    meta: { handlesError: true },
  })

  if (!token || info.isError) {
    return (
      <AuthLayout
        title="This link no longer works"
        intro="Links in our e-mails work once and expire after a while."
      >
        <p className="text-sm text-ink-700">
          <Link to={paths.forgotPassword} className="text-olive-800 underline">
            Ask for a new link
          </Link>{' '}
          or{' '}
          <Link to={paths.signIn} className="text-olive-800 underline">
            sign in
          </Link>
          .
        </p>
      </AuthLayout>
    )
  }
  if (info.isPending) return <LoadingBlock />
  const welcome = info.data.purpose === 'invite'
  return (
    <AuthLayout
      title={welcome ? `Welcome, ${info.data.name}` : 'Choose a new password'}
      intro={`For ${info.data.email}.`}
    >
      <SetPasswordForm
        token={token}
        email={info.data.email}
        onDone={() => {
          toast.success('Your password is saved. Sign in with it now.')
          navigate(paths.signIn, { replace: true })
        }}
      />
    </AuthLayout>
  )
}
