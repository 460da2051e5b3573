import { useMemo, useState } from 'react'
import { Link, useSearchParams } from 'react-router-dom'
import { addDays, compareIso, formatDate } from '@shared/domain/dates/dates'
import type { PlanProduct } from '@shared/schemas/planning'
import { LinkButton } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { Field, Select } from '@/components/ui/field'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { Stat } from '@/components/ui/stat'
import { toast } from '@/components/ui/toast'
import { paths } from '@/config/paths'
import { useDropPlannedPour, usePourPlan } from '@/features/planning/api/plan'
import { DemandChart } from '@/features/planning/components/demand-chart'
import { OutlookChart } from '@/features/planning/components/outlook-chart'
import { PlanIngredients } from '@/features/planning/components/plan-ingredients'
import { PlanPourDialog } from '@/features/planning/components/plan-pour-dialog'
import { PlanTable } from '@/features/planning/components/plan-table'
import { PlannedPours } from '@/features/planning/components/planned-pours'
import { WeekPlan } from '@/features/planning/components/week-plan'

const WINDOWS = [4, 8, 12, 26, 52]
const COVERS = [2, 4, 6, 8]
const HORIZONS = [4, 8, 12, 26]
const pick = (v: string | null, allowed: number[], fallback: number) =>
  allowed.includes(Number(v)) ? Number(v) : fallback

/** What to pour, and by when, to keep every product in stock. */
export function Component() {
  const [search, setSearch] = useSearchParams()
  const windowWeeks = pick(search.get('window'), WINDOWS, 8)
  const coverWeeks = pick(search.get('cover'), COVERS, 4)
  const horizonWeeks = pick(search.get('horizon'), HORIZONS, 8)
  const plan = usePourPlan({ windowWeeks, coverWeeks, horizonWeeks })
  const drop = useDropPlannedPour()
  const [planning, setPlanning] = useState<PlanProduct | null>(null)
  const [outlookId, setOutlookId] = useState<number | null>(null)
  const set = (key: string, value: string) =>
    setSearch(
      (s) => {
        s.set(key, value)
        return s
      },
      { replace: true },
    )

  const data = plan.data
  const selling = useMemo(
    () => (data?.products ?? []).filter((p) => p.weeklyDemandBars > 0 || p.preorderBars > 0),
    [data],
  )
  const outlookProduct =
    data?.products.find((p) => p.productId === outlookId) ??
    [...selling].sort((a, b) => (a.runOutDate ?? '9999').localeCompare(b.runOutDate ?? '9999'))[0] ??
    data?.products[0] ??
    null
  const thisWeek = data?.weeks.find(
    (w) => compareIso(w.weekStart, data.today) <= 0 && compareIso(data.today, addDays(w.weekStart, 7)) < 0,
  )
  const toBuy = (data?.ingredients ?? []).filter((i) => i.toBuy > 0)

  return (
    <>
      <PageHeader
        title="Pour plan"
        description="When each product's ready stock runs out at its demand, the last day to pour so a cured batch is there in time, and what those pours need."
        actions={
          <LinkButton to={paths.owner.purchases} variant="secondary">
            Purchases
          </LinkButton>
        }
      />
      <div className="mb-6 flex flex-wrap gap-4" role="group" aria-label="Plan settings">
        <Field label="Demand from the last">
          <Select value={String(windowWeeks)} onChange={(e) => set('window', e.target.value)}>
            {WINDOWS.map((w) => (
              <option key={w} value={w}>
                {w} weeks of orders
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Each pour covers">
          <Select value={String(coverWeeks)} onChange={(e) => set('cover', e.target.value)}>
            {COVERS.map((w) => (
              <option key={w} value={w}>
                {w} weeks of demand
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Plan ahead">
          <Select value={String(horizonWeeks)} onChange={(e) => set('horizon', e.target.value)}>
            {HORIZONS.map((w) => (
              <option key={w} value={w}>
                {w} weeks
              </option>
            ))}
          </Select>
        </Field>
      </div>
      {!data ? (
        <LoadingBlock label="Working out the plan…" />
      ) : (
        <div className="flex flex-col gap-6">
          <p className="text-sm text-ink-700">
            Demand from orders placed {formatDate(data.windowStart)} – {formatDate(data.windowEnd)}. Latest
            pour date = run-out date − cure days − the lead time of {data.leadTimeDays}{' '}
            {data.leadTimeDays === 1 ? 'day' : 'days'} (in <Link to={paths.owner.settings}>Settings</Link>).
          </p>
          <div className="grid grid-cols-2 gap-4 lg:grid-cols-4">
            <Stat
              label="To pour this week"
              value={thisWeek?.pours.length ?? 0}
              tone={thisWeek?.pours.length ? 'honey' : 'default'}
              hint={thisWeek?.pours.some((p) => p.late) ? 'Some are late' : undefined}
            />
            <Stat label="Pours planned" value={data.planned.length} />
            <Stat
              label="Products selling"
              value={selling.length}
              hint={`of ${data.products.length} active`}
            />
            <Stat
              label="Ingredients to buy"
              value={toBuy.length}
              tone={toBuy.length ? 'clay' : 'default'}
              hint={toBuy.length ? 'For the pours in the plan' : 'Enough on hand'}
            />
          </div>
          <Card>
            <CardHeader
              title="Planned pours"
              description="Open one in the batch form when you pour it; recording the batch marks it poured."
            />
            <CardBody>
              <PlannedPours
                pours={data.planned}
                pourHref={(p) => `${paths.owner.batchNew}?plan=${p.id}`}
                dropping={drop.isPending ? (drop.variables ?? null) : null}
                onDrop={(p) =>
                  drop.mutate(p.id, {
                    onSuccess: () => toast.success(`The planned pour of ${p.productName} was dropped.`),
                  })
                }
              />
            </CardBody>
          </Card>
          <Card>
            <CardHeader
              title="Week by week"
              description="The suggested pours, by the week of their pour-by date."
            />
            <CardBody>
              <WeekPlan weeks={data.weeks} />
            </CardBody>
          </Card>
          <Card>
            <CardHeader title="Demand and stock" />
            <CardBody className="grid gap-6 xl:grid-cols-2">
              <DemandChart products={data.products} windowWeeks={data.windowWeeks} />
              <div className="flex min-w-0 flex-col gap-3">
                {outlookProduct ? (
                  <>
                    <Field label="Outlook for">
                      <Select
                        value={String(outlookProduct.productId)}
                        onChange={(e) => setOutlookId(Number(e.target.value))}
                      >
                        {data.products.map((p) => (
                          <option key={p.productId} value={p.productId}>
                            {p.name} ({p.sku})
                          </option>
                        ))}
                      </Select>
                    </Field>
                    <OutlookChart product={outlookProduct} />
                  </>
                ) : null}
              </div>
            </CardBody>
          </Card>
          <Card>
            <CardHeader
              title="By product"
              description="Free bars only: bars set aside for orders are already sold."
            />
            <CardBody>
              <PlanTable products={data.products} onPlan={setPlanning} />
            </CardBody>
          </Card>
          <Card>
            <CardHeader
              title="Ingredients and purchases"
              description="What the suggested and planned pours take, from each recipe's batch sheet, against every lot on hand."
            />
            <CardBody>
              <PlanIngredients ingredients={data.ingredients} />
            </CardBody>
          </Card>
          <PlanPourDialog
            product={planning}
            today={data.today}
            onClose={() => setPlanning(null)}
            onPlanned={(p) => {
              setPlanning(null)
              toast.success(
                `Planned: ${p.productName}, ${p.moulds} ${p.moulds === 1 ? 'mould' : 'moulds'} on ${formatDate(p.pourDate)}.`,
              )
            }}
          />
        </div>
      )}
    </>
  )
}
