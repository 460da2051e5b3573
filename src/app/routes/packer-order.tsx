import { useQueryClient } from '@tanstack/react-query'
import { useParams } from 'react-router-dom'
import { formatDate, isoToday } from '@shared/domain/dates/dates'
import { ORDER_STATUS_LABELS } from '@shared/schemas/orders'
import { Badge } from '@/components/ui/badge'
import type { BadgeTone } from '@/components/ui/badge'
import { Button, buttonClasses } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { EmptyState } from '@/components/ui/empty-state'
import { Notice } from '@/components/ui/notice'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { toast } from '@/components/ui/toast'
import { paths } from '@/config/paths'
import { useMe } from '@/features/auth/api/me'
import { packingKeys, packingSlipHref, useClaimOrder, usePackingOrder } from '@/features/packing/api/packing'
import { PackedForm } from '@/features/packing/components/packed-form'
import { PackingLines } from '@/features/packing/components/packing-lines'
import { ShipForm } from '@/features/shipments/components/ship-form'

const STATUS_TONE: Record<string, BadgeTone> = {
  confirmed: 'neutral',
  packing: 'sky',
  packed: 'honey',
  shipped: 'green',
  placed: 'neutral',
  cancelled: 'clay',
}

function weight(g: number) {
  return `${(g / 1000).toFixed(2)} kg`
}

/** One order on the bench: its lines and lots, the packing slip, recording it packed, and shipping it. */
export function Component() {
  const { orderId } = useParams()
  const id = Number(orderId)
  const me = useMe()
  const qc = useQueryClient()
  const order = usePackingOrder(id)
  const claim = useClaimOrder()
  const isOwner = me.data?.role === 'owner'
  const back = isOwner
    ? { to: paths.owner.packing, label: 'Packing' }
    : { to: paths.packer.home, label: 'Packing queue' }

  if (order.isPending || !me.data) return <LoadingBlock label="Loading the order…" />
  if (order.isError || !order.data) {
    return (
      <>
        <PageHeader title="Order not found" back={back} />
        <EmptyState
          title="This order is not on the bench."
          message="It may not be confirmed yet, or it was cancelled."
        />
      </>
    )
  }
  const o = order.data
  const mine = o.packer?.id === me.data.id
  const canPack = o.status === 'packing' && (mine || isOwner)
  const today = isoToday(new Date(), Intl.DateTimeFormat().resolvedOptions().timeZone)

  return (
    <>
      <PageHeader
        title={`Order ${o.number}`}
        back={back}
        description={
          <span className="flex flex-wrap items-center gap-2">
            <Badge tone={STATUS_TONE[o.status]}>{ORDER_STATUS_LABELS[o.status]}</Badge>
            <span>
              {o.shopName}
              {o.poNumber ? ` · PO ${o.poNumber}` : ''}
              {o.requestedShipDate ? ` · ship by ${formatDate(o.requestedShipDate)}` : ''}
            </span>
          </span>
        }
        actions={
          <>
            <a
              href={packingSlipHref(o.id)}
              target="_blank"
              rel="noopener"
              className={buttonClasses('secondary')}
            >
              Packing slip
            </a>
            {o.status === 'confirmed' ? (
              <Button
                loading={claim.isPending}
                disabled={!o.readyToPack}
                onClick={() =>
                  claim.mutate(
                    { id: o.id },
                    { onSuccess: () => toast.success(`${o.number} is yours to pack.`) },
                  )
                }
              >
                Claim
              </Button>
            ) : null}
          </>
        }
      />

      {o.awaitingPayment && o.status !== 'shipped' ? (
        <Notice title="Payment awaited" className="mb-6">
          {o.shopName} pays before its orders ship (prepay), and this order&rsquo;s invoice is not yet paid.
          It can be packed now; it can ship once the studio records the payment.
        </Notice>
      ) : null}

      <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
        <div className="flex min-w-0 flex-col gap-6">
          <Card>
            <CardHeader
              title="Lines and lots"
              description={
                o.status === 'packing'
                  ? 'Tick each line as it goes into the carton. Every bar comes from the lots shown.'
                  : 'The bars and the batch lots they come from.'
              }
            />
            <CardBody>
              <PackingLines lines={o.lines} tickable={canPack} />
            </CardBody>
          </Card>

          {canPack ? (
            <Card>
              <CardHeader
                title="Record packed"
                description="The bars per line must match the allocations above."
              />
              <CardBody>
                <PackedForm order={o} />
              </CardBody>
            </Card>
          ) : null}

          {o.status === 'packed' ? (
            <Card>
              <CardHeader
                title="Ship"
                description="The buyer gets the tracking number with the packing slip, and the invoice is sent."
              />
              <CardBody>
                {o.awaitingPayment ? (
                  <p className="text-sm text-ink-800">
                    Shipping opens once the prepay invoice is paid. The packed cartons wait here.
                  </p>
                ) : (
                  <ShipForm
                    orderId={o.id}
                    today={today}
                    onShipped={(r) => {
                      toast.success(
                        r.invoice
                          ? `${o.number} shipped. Invoice ${r.invoice.number} ${r.invoice.raisedNow ? 'raised and sent' : 'was already raised'}.`
                          : `${o.number} shipped.`,
                      )
                      void qc.invalidateQueries({ queryKey: packingKeys.all })
                    }}
                  />
                )}
              </CardBody>
            </Card>
          ) : null}
        </div>

        <div className="flex min-w-0 flex-col gap-6">
          <Card>
            <CardHeader title="Ship to" as="h2" />
            <CardBody className="text-sm text-ink-800">
              <p className="font-medium text-ink-900">{o.shipTo.name}</p>
              <p>Attn. {o.shipTo.contactName}</p>
              {o.shipTo.lines.map((l) => (
                <p key={l}>{l}</p>
              ))}
              {o.shipTo.contactPhone ? <p className="mt-1">{o.shipTo.contactPhone}</p> : null}
            </CardBody>
          </Card>
          <Card>
            <CardHeader title="On the bench" as="h2" />
            <CardBody>
              <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2 text-sm">
                <dt className="text-ink-600">Placed</dt>
                <dd>{formatDate(o.placedAt.slice(0, 10))}</dd>
                <dt className="text-ink-600">Packer</dt>
                <dd>{o.packer ? (mine ? `You (${o.packer.name})` : o.packer.name) : 'Not claimed'}</dd>
                {o.packedAt ? (
                  <>
                    <dt className="text-ink-600">Packed</dt>
                    <dd>
                      {formatDate(o.packedAt.slice(0, 10))}, {o.cartons}{' '}
                      {o.cartons === 1 ? 'carton' : 'cartons'}
                      {o.packedWeightG ? `, ${weight(o.packedWeightG)}` : ''}
                    </dd>
                  </>
                ) : null}
                {o.shipment ? (
                  <>
                    <dt className="text-ink-600">Shipped</dt>
                    <dd>
                      {formatDate(o.shipment.shipDate)} by {o.shipment.carrier}
                      <span className="block font-mono">{o.shipment.trackingNumber}</span>
                    </dd>
                  </>
                ) : null}
                {o.note ? (
                  <>
                    <dt className="text-ink-600">Note</dt>
                    <dd>{o.note}</dd>
                  </>
                ) : null}
              </dl>
            </CardBody>
          </Card>
        </div>
      </div>
    </>
  )
}
