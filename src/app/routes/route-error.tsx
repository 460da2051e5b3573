import { isRouteErrorResponse, useRouteError } from 'react-router-dom'
import { Button } from '@/components/ui/button'

/** The error boundary of every route: a plain apology and a way out, never a blank page. */
export function RouteError() {
  const error = useRouteError()
  const detail = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : null
  const chunkFailed =
    error instanceof Error &&
    /dynamically imported module|Importing a module script failed/i.test(error.message)
  return (
    <div role="alert" className="mx-auto max-w-md px-4 py-16 text-center">
      <h1 className="text-2xl font-bold text-ink-900">Something went wrong</h1>
      <p className="mt-2 text-ink-700">
        {chunkFailed ? 'A new version of Lathercase is available.' : 'This page could not be shown.'}{' '}
        Reloading usually helps.
      </p>
      {detail && !chunkFailed ? <p className="mt-2 text-sm text-ink-600">{detail}</p> : null}
      <Button className="mt-6" onClick={() => window.location.reload()}>
        Reload the page
      </Button>
    </div>
  )
}
