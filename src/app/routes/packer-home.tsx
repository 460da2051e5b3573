import { PageHeader } from '@/components/ui/page-header'
import { useMe } from '@/features/auth/api/me'
import { StudioCard } from '@/features/studio/components/studio-card'

export function Component() {
  const me = useMe()
  return (
    <>
      <PageHeader
        title="Packing"
        description={`Signed in as ${me.data?.name ?? ''}. Cartons ship from the studio address below.`}
      />
      <div className="grid gap-6 md:grid-cols-2">
        <StudioCard title="Ship-from address" />
      </div>
    </>
  )
}
