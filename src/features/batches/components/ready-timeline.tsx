import { useId } from 'react'
import type { BatchRow } from '@shared/schemas/batches'
import { addDays, formatDate } from '@shared/domain/dates/dates'

const WEEKS = 8
const W = 640
const H = 200
const PAD = { top: 24, right: 8, bottom: 36, left: 8 }

export type WeekBucket = { from: string; to: string; bars: number; batches: number }

/**
 * Free bars of curing batches by the week they turn ready: days 1–7 from today are the first
 * week, 8–14 the second, and so on for eight weeks. The days left come from the server, which
 * counts them in the studio's time zone.
 */
export function readyByWeek(batches: readonly BatchRow[], today: string): WeekBucket[] {
  const weeks: WeekBucket[] = Array.from({ length: WEEKS }, (_, i) => ({
    from: addDays(today, 1 + 7 * i),
    to: addDays(today, 7 + 7 * i),
    bars: 0,
    batches: 0,
  }))
  for (const b of batches) {
    if (b.status !== 'curing' || b.daysLeft < 1) continue
    const week = weeks[Math.floor((b.daysLeft - 1) / 7)]
    if (!week) continue
    week.bars += b.free
    week.batches += 1
  }
  return weeks
}

const shortDate = (iso: string) => formatDate(iso).replace(/, \d{4}$/, '')

/**
 * An inline bar chart of the next eight weeks of ready dates: columns on wider screens, rows on a
 * phone (where eight columns would shrink their labels out of reach). A table with the same
 * figures is there for screen readers; the drawings are hidden from them.
 */
export function ReadyTimeline({ batches, today }: { batches: readonly BatchRow[]; today: string }) {
  const titleId = useId()
  const weeks = readyByWeek(batches, today)
  const max = Math.max(1, ...weeks.map((w) => w.bars))
  const total = weeks.reduce((s, w) => s + w.bars, 0)
  return (
    <figure className="m-0" aria-labelledby={titleId}>
      <figcaption id={titleId} className="mb-2 text-sm text-ink-700">
        {total > 0
          ? `${total.toLocaleString('en-US')} bars turn ready over the next eight weeks.`
          : 'No curing batch turns ready in the next eight weeks.'}
      </figcaption>
      <Columns weeks={weeks} max={max} />
      <Rows weeks={weeks} max={max} />
      <div className="sr-only">
        <table>
          <caption>Bars turning ready per week</caption>
          <thead>
            <tr>
              <th scope="col">Week</th>
              <th scope="col">Bars</th>
              <th scope="col">Batches</th>
            </tr>
          </thead>
          <tbody>
            {weeks.map((w) => (
              <tr key={w.from}>
                <th scope="row">
                  {formatDate(w.from)} to {formatDate(w.to)}
                </th>
                <td>{w.bars}</td>
                <td>{w.batches}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </figure>
  )
}

function Columns({ weeks, max }: { weeks: WeekBucket[]; max: number }) {
  const slot = (W - PAD.left - PAD.right) / WEEKS
  const barW = Math.min(48, slot * 0.6)
  const plotH = H - PAD.top - PAD.bottom
  return (
    <svg
      viewBox={`0 0 ${W} ${H}`}
      className="hidden h-auto w-full sm:block"
      aria-hidden="true"
      focusable="false"
    >
      <line
        x1={PAD.left}
        x2={W - PAD.right}
        y1={H - PAD.bottom}
        y2={H - PAD.bottom}
        className="stroke-cream-300"
        strokeWidth={1}
      />
      {weeks.map((w, i) => {
        const h = (w.bars / max) * plotH
        const x = PAD.left + slot * i + (slot - barW) / 2
        const y = H - PAD.bottom - h
        return (
          <g key={w.from}>
            {w.bars > 0 ? (
              <rect x={x} y={y} width={barW} height={h} rx={4} className="fill-olive-600" />
            ) : null}
            <text
              x={x + barW / 2}
              y={w.bars > 0 ? y - 6 : H - PAD.bottom - 6}
              textAnchor="middle"
              className="fill-ink-800 text-[13px] tabular-nums"
            >
              {w.bars > 0 ? w.bars : '–'}
            </text>
            <text
              x={x + barW / 2}
              y={H - PAD.bottom + 16}
              textAnchor="middle"
              className="fill-ink-700 text-[12px]"
            >
              {shortDate(w.from)}
            </text>
            <text
              x={x + barW / 2}
              y={H - PAD.bottom + 30}
              textAnchor="middle"
              className="fill-ink-600 text-[11px]"
            >
              {w.batches ? `${w.batches} ${w.batches === 1 ? 'batch' : 'batches'}` : ''}
            </text>
          </g>
        )
      })}
    </svg>
  )
}

const ROW_H = 26
const LABEL_W = 64
const ROWS_W = 320

function Rows({ weeks, max }: { weeks: WeekBucket[]; max: number }) {
  const barMax = ROWS_W - LABEL_W - 40
  return (
    <svg
      viewBox={`0 0 ${ROWS_W} ${ROW_H * WEEKS}`}
      className="h-auto w-full sm:hidden"
      aria-hidden="true"
      focusable="false"
    >
      {weeks.map((w, i) => {
        const y = i * ROW_H
        const len = (w.bars / max) * barMax
        return (
          <g key={w.from}>
            <text x={0} y={y + ROW_H / 2 + 5} className="fill-ink-700 text-[13px]">
              {shortDate(w.from)}
            </text>
            {w.bars > 0 ? (
              <rect x={LABEL_W} y={y + 5} width={len} height={ROW_H - 10} rx={3} className="fill-olive-600" />
            ) : null}
            <text
              x={LABEL_W + len + 6}
              y={y + ROW_H / 2 + 5}
              className="fill-ink-800 text-[13px] tabular-nums"
            >
              {w.bars > 0 ? w.bars : '–'}
            </text>
          </g>
        )
      })}
    </svg>
  )
}
