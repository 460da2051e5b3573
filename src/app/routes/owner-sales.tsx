import { useSearchParams } from 'react-router-dom'
import { addDays, compareIso, isoToday, isValidIsoDate } from '@shared/domain/dates/dates'
import { SALES_GROUPS, SALES_GROUP_LABELS, SalesQuerySchema } from '@shared/schemas/sales'
import type { SalesGroup } from '@shared/schemas/sales'
import { buttonClasses } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { Field, Input, Select } from '@/components/ui/field'
import { Money } from '@/components/ui/money'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { Stat } from '@/components/ui/stat'
import { salesCsvHref, useSalesReport } from '@/features/sales/api/sales'
import { SalesChart } from '@/features/sales/components/sales-chart'
import { SalesTable } from '@/features/sales/components/sales-table'
import { useSettings } from '@/features/studio/api/studio'

/** Revenue, bars sold and margin by product, tier or shop, for the orders shipped in a period. */
export function Component() {
  const [search, setSearch] = useSearchParams()
  const settings = useSettings()
  // The studio's own calendar day, as the API counts ship days.
  const day = settings.data ? isoToday(new Date(), settings.data.timeZone) : undefined
  const currency = settings.data?.currency ?? 'USD'
  const to = search.get('to') ?? day ?? ''
  const from = search.get('from') ?? (day ? addDays(day, -89) : '')
  const by = (SALES_GROUPS as readonly string[]).includes(search.get('by') ?? '')
    ? (search.get('by') as SalesGroup)
    : 'product'
  const parsed = SalesQuerySchema.safeParse({ from, to, by })
  const report = useSalesReport(parsed.success ? parsed.data : { from: '', to: '', by }, parsed.success)
  const problem =
    from && to && (!isValidIsoDate(from) || !isValidIsoDate(to))
      ? 'Enter both days as dates.'
      : from && to && compareIso(from, to) > 0
        ? 'The last day is before the first day.'
        : null
  const set = (key: string, value: string) =>
    setSearch(
      (s) => {
        s.set(key, value)
        if (key !== 'from' && !s.get('from') && from) s.set('from', from)
        if (key !== 'to' && !s.get('to') && to) s.set('to', to)
        return s
      },
      { replace: true },
    )
  const data = report.data

  return (
    <>
      <PageHeader
        title="Sales"
        description="Orders shipped in the period: merchandise revenue (without shipping and tax), bars sold, and the margin over the cost of the bars that left, as frozen on their batches."
        actions={
          parsed.success ? (
            <a className={buttonClasses('secondary')} href={salesCsvHref(parsed.data)} download>
              Download CSV
            </a>
          ) : null
        }
      />
      <div className="mb-6 flex flex-wrap items-end gap-4" role="group" aria-label="Period and grouping">
        <Field label="First day" error={problem && problem.includes('both') ? problem : undefined}>
          <Input type="date" value={from} onChange={(e) => set('from', e.target.value)} />
        </Field>
        <Field label="Last day" error={problem && !problem.includes('both') ? problem : undefined}>
          <Input type="date" value={to} onChange={(e) => set('to', e.target.value)} />
        </Field>
        <Field label="Group by">
          <Select value={by} onChange={(e) => set('by', e.target.value)}>
            {SALES_GROUPS.map((g) => (
              <option key={g} value={g}>
                {SALES_GROUP_LABELS[g]}
              </option>
            ))}
          </Select>
        </Field>
      </div>
      {!data ? (
        problem ? null : (
          <LoadingBlock label="Adding up sales…" />
        )
      ) : (
        <div className="flex flex-col gap-6">
          <div className="grid grid-cols-2 gap-4 lg:grid-cols-4">
            <Stat label="Revenue" value={<Money cents={data.totals.revenueCents} currency={currency} />} />
            <Stat
              label="Margin"
              value={<Money cents={data.totals.marginCents} currency={currency} />}
              hint={
                data.totals.marginPct === null
                  ? undefined
                  : `${data.totals.marginPct.toFixed(1)} % of revenue`
              }
            />
            <Stat label="Bars sold" value={data.totals.bars} />
            <Stat label="Orders shipped" value={data.totals.orders} />
          </div>
          <Card>
            <CardHeader title={`By ${SALES_GROUP_LABELS[data.by].toLowerCase()}`} />
            <CardBody className="flex flex-col gap-6">
              {data.rows.length ? <SalesChart report={data} currency={currency} /> : null}
              <SalesTable report={data} currency={currency} />
            </CardBody>
          </Card>
        </div>
      )}
    </>
  )
}
