import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { LoadingBlock } from '@/components/ui/spinner'
import { useStudioProfile } from '@/features/studio/api/studio'

/** Whom the person deals with: the studio's name, address and contact. */
export function StudioCard({ title = 'The studio' }: { title?: string }) {
  const studio = useStudioProfile()
  return (
    <Card>
      <CardHeader title={title} />
      <CardBody>
        {studio.isPending ? (
          <LoadingBlock />
        ) : studio.data ? (
          <address className="text-sm not-italic leading-6 text-ink-800">
            <span className="font-medium text-ink-900">{studio.data.name}</span>
            {studio.data.address.map((l) => (
              <span key={l} className="block">
                {l}
              </span>
            ))}
            {studio.data.phone ? <span className="block">{studio.data.phone}</span> : null}
            {studio.data.email ? (
              <a className="block text-olive-800 underline" href={`mailto:${studio.data.email}`}>
                {studio.data.email}
              </a>
            ) : null}
          </address>
        ) : null}
      </CardBody>
    </Card>
  )
}
