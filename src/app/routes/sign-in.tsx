import { Link, Navigate, useNavigate, useSearchParams } from 'react-router-dom'
import { AuthLayout } from '@/components/layout/auth-layout'
import { LoadingBlock } from '@/components/ui/spinner'
import { homeFor, paths } from '@/config/paths'
import { useMe } from '@/features/auth/api/me'
import { SignInForm } from '@/features/auth/components/sign-in-form'

/** Only same-site paths are followed after sign-in. */
function safeNext(next: string | null) {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : null
}

export function Component() {
  const me = useMe()
  const navigate = useNavigate()
  const [params] = useSearchParams()
  const next = safeNext(params.get('next'))
  if (me.isPending) return <LoadingBlock />
  if (me.data) return <Navigate to={next ?? homeFor[me.data.role]} replace />
  return (
    <AuthLayout title="Sign in" intro="Studio staff and shop buyers sign in here.">
      <SignInForm onSignedIn={(u) => navigate(next ?? homeFor[u.role], { replace: true })} />
      <p className="mt-5 border-t border-cream-200 pt-4 text-center text-sm text-ink-700">
        Not a stockist yet?{' '}
        <Link to={paths.apply} className="font-medium text-olive-800 underline hover:text-olive-900">
          Apply for a wholesale account
        </Link>
      </p>
    </AuthLayout>
  )
}
