import { Navigate, Outlet, useLocation } from 'react-router-dom'
import type { Role } from '@shared/permissions'
import { Forbidden } from '@/app/routes/forbidden'
import { AppShell } from '@/components/layout/app-shell'
import { LoadingBlock } from '@/components/ui/spinner'
import { paths } from '@/config/paths'
import { useMe } from '@/features/auth/api/me'

// Lazy routes of their own: the app shell (navigation, sign-out) and the role gate are not part of
// the entry chunk, so the signed-out pages load without them.
/** Signed-in pages: signed-out people go to sign-in and come back afterwards. */
export function Component() {
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
