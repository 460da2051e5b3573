import { formatGrams } from '@shared/domain/units/units'

export function formatQuantity(q: number, unit: 'g' | 'each'): string {
  if (unit === 'each') return `${q.toLocaleString('en-US')} ${q === 1 ? 'piece' : 'pieces'}`
  return q >= 1000 ? `${(q / 1000).toLocaleString('en-US', { maximumFractionDigits: 2 })} kg` : formatGrams(q)
}

export const bars = (n: number) => `${n.toLocaleString('en-US')} ${Math.abs(n) === 1 ? 'bar' : 'bars'}`

export function daysLeftText(daysLeft: number): string {
  if (daysLeft <= 0) return 'Ready'
  return daysLeft === 1 ? '1 day left' : `${daysLeft} days left`
}

/** "Day 21 of 28": how far through its cure a batch is. */
export function cureText(b: { cureDays: number; daysLeft: number }): string {
  const day = Math.min(b.cureDays, b.cureDays - b.daysLeft)
  return `Day ${Math.max(0, day)} of ${b.cureDays}`
}

/** The browser's own calendar date (forms only; the server judges with the studio's time zone). */
export function localToday(): string {
  const d = new Date()
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`
}
