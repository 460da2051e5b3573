import { useEffect, useState } from 'react'
import { RouterProvider } from 'react-router-dom'
import { AppProvider } from '@/app/provider'
import { createRouter } from '@/app/router'
import { paths } from '@/config/paths'
import { setUnauthorizedHandler } from '@/lib/api-client'

export function App() {
  const [router] = useState(createRouter)
  useEffect(() => {
    // A lost session (expired, signed out elsewhere, deactivated) sends the person to sign in.
    setUnauthorizedHandler(() => {
      const here = window.location.pathname + window.location.search
      if (!here.startsWith(paths.signIn))
        window.location.assign(`${paths.signIn}?next=${encodeURIComponent(here)}`)
    })
    return () => setUnauthorizedHandler(null)
  }, [])
  return (
    <AppProvider>
      <RouterProvider router={router} />
    </AppProvider>
  )
}
