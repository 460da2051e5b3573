import { Navigate, Outlet, useLocation } from 'react-router-dom'
import type { Role } from '@shared/permissions'
import { AppShell } from '@/components/layout/app-shell'
import { LoadingBlock } from '@/components/ui/spinner'
import { homeFor, paths } from '@/config/paths'
import { useMe } from '@/features/auth/api/me'
import { Forbidden } from '@/app/routes/forbidden'

/** Signed-in pages: signed-out people go to sign-in and come back afterwards. */
export function SignedInLayout() {
  const me = useMe()
  const location = useLocation()
  if (me.isPending) return <LoadingBlock className="min-h-dvh" />
  if (!me.data) {
    const next = encodeURIComponent(location.pathname + location.search)
    return <Navigate to={`${paths.signIn}?next=${next}`} replace />
  }
  return <AppShell user={me.data} />
}

/** Pages of one role; others are told it is not for them (the API refuses them anyway). */
export function RoleGate({ roles }: { roles: Role[] }) {
  const me = useMe()
  if (!me.data) return null
  return roles.includes(me.data.role) ? <Outlet /> : <Forbidden />
}

export function HomeRedirect() {
  const me = useMe()
  if (me.isPending) return <LoadingBlock className="min-h-dvh" />
  return <Navigate to={me.data ? homeFor[me.data.role] : paths.signIn} replace />
}
