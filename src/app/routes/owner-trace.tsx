import { useSearchParams } from 'react-router-dom'
import { Card, CardBody } from '@/components/ui/card'
import { EmptyState } from '@/components/ui/empty-state'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { paths } from '@/config/paths'
import { useTrace, useTraceLots } from '@/features/batches/api/trace'
import { TraceLoading, TraceLotPicker, TraceTable } from '@/features/batches/components/trace-view'

export function Component() {
  const [params, setParams] = useSearchParams()
  const lotId = Number(params.get('lot')) || null
  const lots = useTraceLots()
  const trace = useTrace(lotId)
  return (
    <>
      <PageHeader
        title="Trace a lot"
        description="Follow one purchase of an ingredient to the batches made with it and the shops that received their bars: what a recall or a supplier's notice needs."
      />
      <div className="flex flex-col gap-6">
        <Card>
          <CardBody>
            {lots.isPending ? (
              <LoadingBlock />
            ) : (
              <TraceLotPicker
                lots={lots.data ?? []}
                value={lotId}
                onChange={(id) => setParams(id ? { lot: String(id) } : {}, { replace: true })}
              />
            )}
          </CardBody>
        </Card>
        {lotId === null ? (
          <EmptyState
            title="Choose a lot to trace."
            message="Lots that went into batches are listed first."
          />
        ) : trace.isPending ? (
          <TraceLoading />
        ) : trace.data ? (
          <TraceTable trace={trace.data} batchHref={paths.owner.batch} />
        ) : (
          <EmptyState title="That lot could not be traced." message={trace.error?.message} />
        )}
      </div>
    </>
  )
}
