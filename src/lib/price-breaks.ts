import type { PriceBreakDto } from '@shared/schemas/orders'

/** The case counts a break covers, for people: "1–4 cases", "5+ cases", "1 case". */
export function breakRange(breaks: readonly PriceBreakDto[], index: number): string {
  const from = breaks[index]!.minCases
  const next = breaks[index + 1]
  if (!next) return `${from}+ ${from === 1 ? 'case' : 'cases'}`
  const to = next.minCases - 1
  if (to === from) return `${from} ${from === 1 ? 'case' : 'cases'}`
  return `${from}–${to} cases`
}
