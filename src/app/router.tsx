import { createBrowserRouter } from 'react-router-dom'
import { paths } from '@/config/paths'
import { HomeRedirect, RoleGate, SignedInLayout } from '@/app/routes/guards'
import { NotFound } from '@/app/routes/not-found'
import { RouteError } from '@/app/routes/route-error'

// Every page is its own chunk: the sign-in page loads only what it needs.
export function createRouter() {
  return createBrowserRouter([
    {
      errorElement: <RouteError />,
      children: [
        { path: paths.root, element: <HomeRedirect /> },
        { path: paths.signIn, lazy: () => import('@/app/routes/sign-in') },
        { path: paths.forgotPassword, lazy: () => import('@/app/routes/forgot-password') },
        { path: paths.setPassword, lazy: () => import('@/app/routes/set-password') },
        {
          element: <SignedInLayout />,
          children: [
            { path: paths.account, lazy: () => import('@/app/routes/account') },
            {
              element: <RoleGate roles={['owner']} />,
              children: [
                { path: paths.owner.home, lazy: () => import('@/app/routes/owner-home') },
                { path: paths.owner.team, lazy: () => import('@/app/routes/owner-team') },
                { path: paths.owner.settings, lazy: () => import('@/app/routes/owner-settings') },
              ],
            },
            {
              element: <RoleGate roles={['packer']} />,
              children: [{ path: paths.packer.home, lazy: () => import('@/app/routes/packer-home') }],
            },
            {
              element: <RoleGate roles={['buyer']} />,
              children: [{ path: paths.buyer.home, lazy: () => import('@/app/routes/buyer-home') }],
            },
            { path: '*', element: <NotFound /> },
          ],
        },
      ],
    },
  ])
}
