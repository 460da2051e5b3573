/** Pure helpers of the benchmark: summaries of repeated rounds, ratios and the goals they are judged by. */

export type Summary = { median: number; min: number; max: number; spreadPct: number; rounds: number[] }

/** The median of the values (the mean of the middle two for an even count). */
export function median(values: readonly number[]): number {
  if (values.length === 0) throw new Error('median of nothing')
  const s = [...values].sort((a, b) => a - b)
  const mid = Math.floor(s.length / 2)
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2
}

/** Median of the rounds and their spread: (max − min) ÷ median, in percent (0 when the median is 0). */
export function summarize(values: readonly number[]): Summary {
  const m = median(values)
  const min = Math.min(...values)
  const max = Math.max(...values)
  return { median: m, min, max, spreadPct: m === 0 ? 0 : ((max - min) / m) * 100, rounds: [...values] }
}

/**
 * The ratio of the app's figure to the bare one, each round paired with the bare round run beside
 * it (so both saw the same machine), then the median of those ratios.
 */
export function pairedRatio(app: readonly number[], bare: readonly number[]): number {
  if (app.length !== bare.length || app.length === 0) throw new Error('rounds do not pair up')
  return median(app.map((a, i) => (bare[i] === 0 ? 0 : a / bare[i]!)))
}

export type Goal = {
  id: string
  label: string
  /** 'min': the figure must be at least the limit; 'max': at most (strictly under for `under`). */
  kind: 'atLeast' | 'under' | 'within'
  limit: number
  value: number
  unit: string
}

export type GoalResult = Goal & { met: boolean }

/** atLeast: value ≥ limit; under: value < limit; within: value ≤ limit. */
export function checkGoal(goal: Goal): GoalResult {
  const met =
    Number.isFinite(goal.value) &&
    (goal.kind === 'atLeast'
      ? goal.value >= goal.limit
      : goal.kind === 'under'
        ? goal.value < goal.limit
        : goal.value <= goal.limit)
  return { ...goal, met }
}

/** A plain-text table: the first row is the header; columns padded to the widest cell. */
export function table(rows: readonly (readonly string[])[]): string {
  const widths = rows[0]!.map((_, c) => Math.max(...rows.map((r) => (r[c] ?? '').length)))
  const line = (r: readonly string[]) =>
    r
      .map((cell, c) => cell.padEnd(widths[c]!))
      .join('  ')
      .trimEnd()
  return [line(rows[0]!), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.slice(1).map(line)].join('\n')
}
