import { LinkButton } from '@/components/ui/button'
import { paths } from '@/config/paths'

/** What a signed-in person sees on a page their role may not use. */
export function Forbidden() {
  return (
    <div className="mx-auto max-w-md py-16 text-center">
      <p className="text-sm font-medium text-clay-700">Not allowed</p>
      <h1 className="mt-2 text-2xl font-bold text-ink-900">This page is not for your account</h1>
      <p className="mt-2 text-ink-700">
        Your role does not give access to it. If you think it should, ask the studio owner.
      </p>
      <LinkButton to={paths.root} className="mt-6">
        Go to your home page
      </LinkButton>
    </div>
  )
}
