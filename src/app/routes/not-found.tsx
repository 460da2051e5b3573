import { LinkButton } from '@/components/ui/button'
import { paths } from '@/config/paths'

export function NotFound() {
  return (
    <div className="mx-auto max-w-md py-16 text-center">
      <p className="text-sm font-medium text-clay-700">404</p>
      <h1 className="mt-2 text-2xl font-bold text-ink-900">There is no page here</h1>
      <p className="mt-2 text-ink-700">The address may be mistyped, or the page has moved.</p>
      <LinkButton to={paths.root} className="mt-6">
        Go to your home page
      </LinkButton>
    </div>
  )
}

export function Component() {
  return (
    <div className="flex min-h-dvh items-center justify-center px-4">
      <NotFound />
    </div>
  )
}
