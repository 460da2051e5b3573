import { Bar, BarChart, CartesianGrid, Legend, Tooltip, XAxis, YAxis } from 'recharts'
import { formatDate } from '@shared/domain/dates/dates'
import type { PlanProduct } from '@shared/schemas/planning'
import { CHART } from '@/features/planning/components/chart-colors'
import { ChartFigure, NumbersTable } from '@/features/planning/components/chart-figure'

const short = (iso: string) => formatDate(iso).replace(/, \d{4}$/, '')

/** One product's ready and curing bars at the start of each coming week, at its demand. */
export function OutlookChart({ product, width = 560 }: { product: PlanProduct; width?: number }) {
  const data = product.outlook.map((w) => ({
    week: short(w.weekStart),
    ready: w.readyBars,
    curing: w.curingBars,
  }))
  return (
    <ChartFigure
      title={`Stock outlook: ${product.name}`}
      description={`Ready and curing bars at the start of each week, at ${product.weeklyDemandBars} bars a week${product.plannedBars ? ', planned pours counted as curing' : ''}.`}
      chart={
        <BarChart
          responsive
          accessibilityLayer={false}
          style={{ width: '100%', maxWidth: width, height: 260 }}
          data={data}
          margin={{ top: 8, right: 8, bottom: 8, left: 0 }}
        >
          <CartesianGrid stroke={CHART.grid} vertical={false} />
          <XAxis dataKey="week" tick={{ fontSize: 11, fill: CHART.ink }} />
          <YAxis tick={{ fontSize: 12, fill: CHART.ink }} width={40} />
          <Tooltip />
          <Legend wrapperStyle={{ fontSize: 12 }} />
          <Bar dataKey="ready" name="Ready bars" stackId="s" fill={CHART.olive} isAnimationActive={false} />
          <Bar dataKey="curing" name="Curing bars" stackId="s" fill={CHART.sky} isAnimationActive={false} />
        </BarChart>
      }
      table={
        <NumbersTable
          caption={`Stock outlook of ${product.name}`}
          head={['Week of', 'Ready bars', 'Curing bars']}
          rows={product.outlook.map((w) => [formatDate(w.weekStart), w.readyBars, w.curingBars])}
        />
      }
    />
  )
}
