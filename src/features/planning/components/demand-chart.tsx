import { Bar, BarChart, CartesianGrid, Legend, Tooltip, XAxis, YAxis } from 'recharts'
import type { PlanProduct } from '@shared/schemas/planning'
import { CHART } from '@/features/planning/components/chart-colors'
import { ChartFigure, NumbersTable } from '@/features/planning/components/chart-figure'

const cases = (n: number) => Math.round(n * 100) / 100

/** Cases ordered per week in the demand window, with open pre-orders (in cases) stacked on top. */
export function DemandChart({
  products,
  windowWeeks,
  width = 560,
}: {
  products: PlanProduct[]
  windowWeeks: number
  width?: number
}) {
  const data = products.map((p) => ({
    sku: p.sku,
    name: p.name,
    perWeek: cases(p.weeklyDemandCases),
    preorders: cases(p.preorderBars / p.casePack),
  }))
  return (
    <ChartFigure
      title="Demand per product"
      description={`Cases a week over the last ${windowWeeks} ${windowWeeks === 1 ? 'week' : 'weeks'}, with open pre-orders on top.`}
      chart={
        <BarChart
          responsive
          accessibilityLayer={false}
          style={{ width: '100%', maxWidth: width, height: 260 }}
          data={data}
          margin={{ top: 8, right: 8, bottom: 8, left: 0 }}
        >
          <CartesianGrid stroke={CHART.grid} vertical={false} />
          <XAxis
            dataKey="sku"
            tick={{ fontSize: 11, fill: CHART.ink }}
            interval={0}
            angle={-30}
            textAnchor="end"
            height={48}
          />
          <YAxis tick={{ fontSize: 12, fill: CHART.ink }} allowDecimals width={36} />
          <Tooltip />
          <Legend wrapperStyle={{ fontSize: 12 }} />
          <Bar
            dataKey="perWeek"
            name="Cases a week"
            stackId="d"
            fill={CHART.olive}
            isAnimationActive={false}
          />
          <Bar
            dataKey="preorders"
            name="Open pre-orders (cases)"
            stackId="d"
            fill={CHART.honey}
            isAnimationActive={false}
          />
        </BarChart>
      }
      table={
        <NumbersTable
          caption="Demand per product"
          head={['Product', 'Cases a week', 'Open pre-orders (cases)']}
          rows={data.map((d) => [`${d.name} (${d.sku})`, d.perWeek, d.preorders])}
        />
      }
    />
  )
}
