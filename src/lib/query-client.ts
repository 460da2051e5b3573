import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query'
import { toast } from '@/components/ui/toast'
import { ApiError } from '@/lib/api-client'

declare module '@tanstack/react-query' {
  interface Register {
    mutationMeta: { /** The form shows the error itself; no toast. */ handlesError?: boolean }
    queryMeta: { handlesError?: boolean }
  }
}

function message(err: unknown) {
  return err instanceof Error ? err.message : 'Something went wrong.'
}

export function makeQueryClient() {
  return new QueryClient({
    queryCache: new QueryCache({
      onError: (err, query) => {
        if (query.meta?.handlesError) return
        if (err instanceof ApiError && err.status === 401) return
        toast.error(message(err))
      },
    }),
    mutationCache: new MutationCache({
      onError: (err, _v, _c, mutation) => {
        if (mutation.meta?.handlesError) return
        if (err instanceof ApiError && err.status === 401) return
        toast.error(message(err))
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        retry: (count, err) => !(err instanceof ApiError && err.status < 500) && count < 2,
        refetchOnWindowFocus: false,
      },
    },
  })
}
