import { Navigate, Outlet } from 'react-router-dom'
import type { Role } from '@shared/permissions'
import { LoadingBlock } from '@/components/ui/spinner'
import { homeFor, paths } from '@/config/paths'
import { useMe } from '@/features/auth/api/me'
import { Forbidden } from '@/app/routes/forbidden'

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
