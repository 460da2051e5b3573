import type { AgeingBucketDto } from '@shared/schemas/payments'
import { formatMoney } from '@/components/ui/money'

const FILL: Record<AgeingBucketDto['bucket'], string> = {
  current: 'fill-olive-500',
  '1_30': 'fill-honey-500',
  '31_60': 'fill-clay-300',
  '61_90': 'fill-clay-500',
  over_90: 'fill-clay-700',
}

/**
 * What is owed by how late it is, as horizontal bars drawn in inline SVG. The figures are also
 * written beside each bar and in the table below, so the chart is never the only way to read them.
 */
export function AgeingChart({ buckets, currency }: { buckets: AgeingBucketDto[]; currency: string }) {
  const max = Math.max(1, ...buckets.map((b) => b.cents))
  const row = 36
  const labelW = 110
  const barW = 400
  const valueW = 130
  const height = buckets.length * row
  return (
    <svg
      role="img"
      aria-label={`Amount owed by age: ${buckets.map((b) => `${b.label} ${formatMoney(b.cents, currency)}`).join(', ')}`}
      viewBox={`0 0 ${labelW + barW + valueW} ${height}`}
      className="h-auto w-full max-w-3xl"
    >
      {buckets.map((b, i) => {
        const y = i * row
        const w = b.cents === 0 ? 0 : Math.max(3, (b.cents / max) * barW)
        return (
          <g key={b.bucket}>
            <text x={0} y={y + row / 2 + 5} className="fill-ink-700 text-[13px]">
              {b.label}
            </text>
            <rect x={labelW} y={y + 7} width={barW} height={row - 14} rx={4} className="fill-cream-200" />
            <rect x={labelW} y={y + 7} width={w} height={row - 14} rx={4} className={FILL[b.bucket]} />
            <text x={labelW + barW + 10} y={y + row / 2 + 5} className="fill-ink-900 text-[13px] font-medium">
              {formatMoney(b.cents, currency)}
            </text>
          </g>
        )
      })}
    </svg>
  )
}
