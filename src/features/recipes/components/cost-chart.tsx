import type { CostShare } from '@shared/domain/costing/costing'
import { roundHalfUp } from '@shared/domain/money/money'
import type { CostCategory } from '@shared/schemas/recipes'
import { formatMoney } from '@/components/ui/money'

export const COST_CATEGORY_LABELS: Record<CostCategory, string> = {
  oil: 'Oils and butters',
  lye: 'Lye',
  liquid: 'Water',
  fragrance: 'Fragrance',
  colourant: 'Colourants',
  additive: 'Additives',
  packaging: 'Packaging',
  labour: 'Labour',
}

// Our palette (tailwind.config.ts), darkest first so neighbouring bars differ.
const COLOURS: Record<CostCategory, string> = {
  oil: '#3b5b2d',
  labour: '#8a3f24',
  packaging: '#c8951b',
  fragrance: '#5e8a4c',
  lye: '#57514a',
  additive: '#c4643f',
  colourant: '#9dba8d',
  liquid: '#b9b3aa',
}

/**
 * Where a batch's cost goes: one horizontal bar per category, longest first, drawn as inline SVG.
 * The figures are written beside the bars, so the chart reads without colour.
 */
export function CostChart({
  breakdown,
  currency,
}: {
  breakdown: CostShare<CostCategory>[]
  currency: string
}) {
  const shown = breakdown.filter((b) => b.cents > 0)
  const rowH = 30
  const labelW = 132
  const valueW = 112
  const width = 560
  const barW = width - labelW - valueW
  const max = Math.max(...shown.map((b) => b.pct), 1)
  const height = shown.length * rowH + 4
  const summary = shown
    .map(
      (b) =>
        `${COST_CATEGORY_LABELS[b.category]} ${formatMoney(roundHalfUp(b.cents), currency)} (${Math.round(b.pct)} %)`,
    )
    .join(', ')
  return (
    <figure className="flex flex-col gap-2">
      <svg
        role="img"
        aria-label={`Where the batch cost goes: ${summary}`}
        viewBox={`0 0 ${width} ${height}`}
        className="h-auto w-full max-w-2xl"
      >
        {shown.map((b, i) => {
          const y = i * rowH + 4
          const w = Math.max(2, (b.pct / max) * (barW - 8))
          return (
            <g key={b.category}>
              <text x={0} y={y + 17} fontSize="13" fill="#413c37">
                {COST_CATEGORY_LABELS[b.category]}
              </text>
              <rect x={labelW} y={y + 4} width={barW - 8} height={18} rx={4} fill="#f2ece1" />
              <rect x={labelW} y={y + 4} width={w} height={18} rx={4} fill={COLOURS[b.category]} />
              <text
                x={width}
                y={y + 17}
                fontSize="13"
                fill="#2d2a26"
                textAnchor="end"
                className="tabular-nums"
              >
                {formatMoney(roundHalfUp(b.cents), currency)} · {Math.round(b.pct)} %
              </text>
            </g>
          )
        })}
      </svg>
      <figcaption className="text-sm text-ink-600">
        Share of the whole batch cost, by kind of ingredient, packaging and labour.
      </figcaption>
    </figure>
  )
}
