import { Link } from 'react-router-dom'
import type { ReactNode } from 'react'
import { formatDate } from '@shared/domain/dates/dates'
import type { TodayDto } from '@shared/schemas/home'
import { Badge } from '@/components/ui/badge'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { formatMoney } from '@/components/ui/money'
import { Stat } from '@/components/ui/stat'

export type TodayLinks = {
  applications: string
  ordersToConfirm: string
  packing: string
  overdue: string
  dueThisWeek: string
  batch: (id: number) => string
  account: (id: number) => string
  plan: string
  purchases: string
}

const qty = (q: number, unit: 'g' | 'each') =>
  unit === 'each'
    ? `${q.toLocaleString('en-US')} pcs`
    : q >= 1000
      ? `${(q / 1000).toLocaleString('en-US', { maximumFractionDigits: 2 })} kg`
      : `${q.toLocaleString('en-US', { maximumFractionDigits: 1 })} g`

function ListCard({
  title,
  description,
  empty,
  action,
  children,
}: {
  title: string
  description?: string
  empty: string | null
  action?: ReactNode
  children: ReactNode
}) {
  return (
    <Card>
      <CardHeader title={title} description={description} actions={action} />
      <CardBody>{empty ? <p className="text-sm text-ink-700">{empty}</p> : children}</CardBody>
    </Card>
  )
}

/** What needs the owner today: people and orders waiting, money due, stock turning ready, pours and supplies. */
export function TodayPanel({
  data,
  currency,
  links,
}: {
  data: TodayDto
  currency: string
  links: TodayLinks
}) {
  const backlog = data.packing.toPack + data.packing.onTheBench + data.packing.packedToShip
  return (
    <section aria-labelledby="today-heading" className="mb-8 flex flex-col gap-6">
      <h2 id="today-heading" className="text-lg font-medium text-ink-900">
        Today, {formatDate(data.today)}
      </h2>
      {/* Link words stay clear of the sidebar's names (Orders, Invoices, Packing…). */}
      <div className="grid grid-cols-2 gap-4 lg:grid-cols-5">
        <Stat
          label="Applications to review"
          value={data.applications}
          tone={data.applications ? 'honey' : 'default'}
          hint={<Link to={links.applications}>Review them</Link>}
        />
        <Stat
          label="Orders to confirm"
          value={data.ordersToConfirm}
          tone={data.ordersToConfirm ? 'honey' : 'default'}
          hint={<Link to={links.ordersToConfirm}>Confirm them</Link>}
        />
        <Stat
          label="Packing backlog"
          value={backlog}
          hint={
            <>
              {data.packing.toPack} to pack, {data.packing.onTheBench} on the bench,{' '}
              {data.packing.packedToShip} to ship · <Link to={links.packing}>Open the bench</Link>
            </>
          }
        />
        <Stat
          label="Invoices overdue"
          value={data.invoices.overdue.count}
          hint={
            <>
              {formatMoney(data.invoices.overdue.outstandingCents, currency)} outstanding ·{' '}
              <Link to={links.overdue}>Chase them</Link>
            </>
          }
          tone={data.invoices.overdue.count ? 'clay' : 'default'}
        />
        <Stat
          label="Invoices due this week"
          value={data.invoices.dueThisWeek.count}
          hint={
            <>
              {formatMoney(data.invoices.dueThisWeek.outstandingCents, currency)} by{' '}
              {formatDate(data.weekEnd)} · <Link to={links.dueThisWeek}>See them</Link>
            </>
          }
        />
      </div>
      <div className="grid gap-6 lg:grid-cols-2">
        <ListCard
          title="Pours due this week"
          description="From the pour plan: pour these by the day shown to stay in stock."
          empty={data.poursDue.length ? null : 'No pour is due this week.'}
          action={<Link to={links.plan}>See the plan</Link>}
        >
          <ul className="divide-y divide-cream-200 text-sm" aria-label="Pours due this week">
            {data.poursDue.map((p) => (
              <li key={p.productId} className="flex items-center justify-between gap-2 py-2">
                <span>
                  <span className="font-medium text-ink-900">{p.name}</span>{' '}
                  <span className="text-ink-700">
                    · {p.moulds} {p.moulds === 1 ? 'mould' : 'moulds'}
                  </span>
                </span>
                <span className="flex items-center gap-2">
                  by {formatDate(p.pourBy)}
                  {p.late ? <Badge tone="clay">Late</Badge> : null}
                </span>
              </li>
            ))}
          </ul>
        </ListCard>
        <ListCard
          title="Ingredients running low"
          description="Less on hand than the planned and suggested pours need."
          empty={data.lowIngredients.length ? null : 'Enough of everything for the pours in the plan.'}
          action={<Link to={links.purchases}>Buy supplies</Link>}
        >
          <ul className="divide-y divide-cream-200 text-sm" aria-label="Ingredients running low">
            {data.lowIngredients.map((i) => (
              <li key={i.ingredientId} className="flex flex-wrap items-center justify-between gap-2 py-2">
                <span className="font-medium text-ink-900">{i.name}</span>
                <span className="text-ink-700">
                  {qty(i.onHand, i.unit)} on hand, {qty(i.needed, i.unit)} needed: buy {qty(i.toBuy, i.unit)}
                </span>
              </li>
            ))}
          </ul>
        </ListCard>
        <ListCard
          title="Batches ready this week"
          empty={data.batchesReady.length ? null : 'No batch finishes its cure this week.'}
        >
          <ul className="divide-y divide-cream-200 text-sm" aria-label="Batches ready this week">
            {data.batchesReady.map((b) => (
              <li key={b.id} className="flex items-center justify-between gap-2 py-2">
                <Link to={links.batch(b.id)}>
                  {b.productName} · {b.lotCode}
                </Link>
                <span className="text-ink-700">
                  {b.bars} bars on {formatDate(b.readyDate)}
                </span>
              </li>
            ))}
          </ul>
        </ListCard>
        <ListCard
          title="Resale certificates to renew"
          description="Expired, or expiring within 30 days."
          empty={data.certificates.length ? null : 'Every certificate on file is good for more than 30 days.'}
        >
          <ul className="divide-y divide-cream-200 text-sm" aria-label="Resale certificates to renew">
            {data.certificates.map((c) => (
              <li key={c.shopId} className="flex items-center justify-between gap-2 py-2">
                <Link to={links.account(c.shopId)}>{c.tradingName}</Link>
                <span className="flex items-center gap-2">
                  {formatDate(c.expiresOn)}
                  <Badge tone={c.status === 'expired' ? 'clay' : 'honey'}>
                    {c.status === 'expired' ? 'Expired' : 'Expires soon'}
                  </Badge>
                </span>
              </li>
            ))}
          </ul>
        </ListCard>
      </div>
    </section>
  )
}
