// The framework floor of the client benchmark: React, react-dom, the data router and the query
// client, wired the way the app wires them, with nothing of the product.
import { StrictMode } from 'react'
import { createRoot } from 'react-dom/client'
import { QueryClient, QueryClientProvider, useQuery } from '@tanstack/react-query'
import { RouterProvider, createBrowserRouter, useNavigate } from 'react-router-dom'

const queryClient = new QueryClient()

function Page() {
  const navigate = useNavigate()
  const q = useQuery({ queryKey: ['health'], queryFn: () => fetch('/api/health').then((r) => r.json()) })
  return (
    <button type="button" onClick={() => navigate('/')}>
      {q.data ? 'up' : 'loading'}
    </button>
  )
}

const router = createBrowserRouter([{ path: '/', element: <Page /> }])

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  </StrictMode>,
)
