import { Navigate, useLocation } from 'react-router-dom'
import { AppShell } from '@/components/layout/app-shell'
import { LoadingBlock } from '@/components/ui/spinner'
import { paths } from '@/config/paths'
import { useMe } from '@/features/auth/api/me'

// A lazy route of its own: the app shell (navigation, sign-out) is not part of the entry chunk,
// so the signed-out pages load without it.
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

