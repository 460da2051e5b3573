import { Bar, BarChart, CartesianGrid, Legend, Tooltip, XAxis, YAxis } from 'recharts'
import type { SalesReport } from '@shared/schemas/sales'
import { SALES_GROUP_LABELS } from '@shared/schemas/sales'
import { formatMoney } from '@/components/ui/money'

const OLIVE = '#5e8a4c'
const HONEY = '#c8951b'
const GRID = '#e6dccb'
const INK = '#413c37'

/**
 * Revenue and margin per row of the report, in dollars. The chart is hidden from screen readers:
 * the table beside it carries the same numbers, with its own caption.
 */
export function SalesChart({
  report,
  currency,
  width = 640,
}: {
  report: SalesReport
  currency: string
  width?: number
}) {
  const data = report.rows.map((r) => ({
    label: r.label.length > 22 ? `${r.label.slice(0, 21)}…` : r.label,
    revenue: r.revenueCents / 100,
    margin: r.marginCents / 100,
  }))
  const height = Math.max(160, 48 + data.length * 44)
  return (
    <figure className="flex min-w-0 flex-col gap-2" aria-labelledby="sales-chart-title">
      <figcaption id="sales-chart-title" className="font-medium text-ink-900">
        Revenue and margin by {SALES_GROUP_LABELS[report.by].toLowerCase()}
      </figcaption>
      <div aria-hidden="true" className="min-w-0">
        <BarChart
          responsive
          accessibilityLayer={false}
          style={{ width: '100%', maxWidth: width, height: height }}
          data={data}
          layout="vertical"
          margin={{ top: 4, right: 16, bottom: 4, left: 8 }}
        >
          <CartesianGrid stroke={GRID} horizontal={false} />
          <XAxis
            type="number"
            tick={{ fontSize: 11, fill: INK }}
            tickFormatter={(v: number) => formatMoney(v * 100, currency).replace(/\.00$/, '')}
          />
          <YAxis type="category" dataKey="label" width={170} tick={{ fontSize: 12, fill: INK }} />
          <Tooltip formatter={(v) => formatMoney(Math.round(Number(v) * 100), currency)} />
          <Legend wrapperStyle={{ fontSize: 12 }} />
          <Bar dataKey="revenue" name="Revenue" fill={OLIVE} isAnimationActive={false} />
          <Bar dataKey="margin" name="Margin" fill={HONEY} isAnimationActive={false} />
        </BarChart>
      </div>
    </figure>
  )
}
