import { Navigate } from 'react-router-dom'
import { LoadingBlock } from '@/components/ui/spinner'
import { homeFor, paths } from '@/config/paths'
import { useMe } from '@/features/auth/api/me'

export function HomeRedirect() {
  const me = useMe()
  if (me.isPending) return <LoadingBlock className="min-h-dvh" />
  return <Navigate to={me.data ? homeFor[me.data.role] : paths.signIn} replace />
}
