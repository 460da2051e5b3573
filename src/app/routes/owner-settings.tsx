import { formatCents } from '@shared/domain/money/money'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { LeadTimeForm } from '@/features/planning/components/lead-time-form'
import { useSettings } from '@/features/studio/api/studio'
import { StudioProfileForm } from '@/features/studio/components/studio-profile-form'

export function Component() {
  const settings = useSettings()
  return (
    <>
      <PageHeader
        title="Settings"
        description="The studio's profile as shops and documents show it, and the rules orders follow."
      />
      {settings.isPending || !settings.data ? (
        <LoadingBlock />
      ) : (
        <div className="flex flex-col gap-6">
          <Card>
            <CardHeader title="Studio profile" />
            <CardBody>
              <StudioProfileForm studio={settings.data.studio} />
            </CardBody>
          </Card>
          <Card>
            <CardHeader
              title="Order rules"
              description="The minimums and rates that orders are priced with."
            />
            <CardBody>
              <dl className="grid gap-3 text-sm sm:grid-cols-2">
                <div>
                  <dt className="text-ink-700">Opening order minimum</dt>
                  <dd className="font-medium">
                    {formatCents(settings.data.openingMinimumCents, settings.data.currency)}
                  </dd>
                </div>
                <div>
                  <dt className="text-ink-700">Reorder minimum</dt>
                  <dd className="font-medium">
                    {formatCents(settings.data.reorderMinimumCents, settings.data.currency)}
                  </dd>
                </div>
                <div>
                  <dt className="text-ink-700">Sales tax without a certificate</dt>
                  <dd className="font-medium">{settings.data.taxRatePct} %</dd>
                </div>
                <div>
                  <dt className="text-ink-700">Labour rate</dt>
                  <dd className="font-medium">
                    {formatCents(settings.data.labourRateCents, settings.data.currency)} per hour
                  </dd>
                </div>
              </dl>
            </CardBody>
          </Card>
          <Card>
            <CardHeader
              title="Pour planning"
              description="How much time the pour plan keeps to spare when it works out the last day to pour."
            />
            <CardBody>
              <LeadTimeForm pourLeadTimeDays={settings.data.pourLeadTimeDays} />
            </CardBody>
          </Card>
        </div>
      )}
    </>
  )
}
