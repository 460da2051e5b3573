import { useId } from 'react'
import type { ReactNode } from 'react'

/**
 * A chart with its title and the same numbers as a table, so the picture is never the only way
 * to read them: the table sits under "The numbers", open or closed as the reader likes.
 */
export function ChartFigure({
  title,
  description,
  chart,
  table,
}: {
  title: string
  description?: string
  chart: ReactNode
  table: ReactNode
}) {
  const id = useId()
  return (
    <figure aria-labelledby={`${id}-title`} className="flex min-w-0 flex-col gap-3">
      <figcaption>
        <span id={`${id}-title`} className="block font-medium text-ink-900">
          {title}
        </span>
        {description ? <span className="block text-sm text-ink-700">{description}</span> : null}
      </figcaption>
      <div aria-hidden="true" className="min-w-0">
        {chart}
      </div>
      <details className="text-sm">
        <summary className="cursor-pointer text-ink-700">The numbers</summary>
        <div className="mt-2 overflow-x-auto">{table}</div>
      </details>
    </figure>
  )
}

export function NumbersTable({
  caption,
  head,
  rows,
}: {
  caption: string
  head: string[]
  rows: (string | number)[][]
}) {
  return (
    <table className="min-w-full text-left text-sm">
      <caption className="sr-only">{caption}</caption>
      <thead>
        <tr className="border-b border-cream-300">
          {head.map((h, i) => (
            <th key={h} scope="col" className={`px-2 py-1 font-medium ${i ? 'text-right' : ''}`}>
              {h}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {rows.map((r, i) => (
          <tr key={i} className="border-b border-cream-200">
            {r.map((v, j) =>
              j === 0 ? (
                <th key={j} scope="row" className="px-2 py-1 font-normal">
                  {v}
                </th>
              ) : (
                <td key={j} className="px-2 py-1 text-right tabular-nums">
                  {v}
                </td>
              ),
            )}
          </tr>
        ))}
      </tbody>
    </table>
  )
}
