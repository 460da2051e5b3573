// The palette of tailwind.config.ts, for the charts (recharts takes colours, not classes).
export const CHART = {
  olive: '#5e8a4c',
  oliveDark: '#3b5b2d',
  honey: '#c8951b',
  clay: '#c4643f',
  sky: '#5b8db8',
  grid: '#e6dccb',
  ink: '#413c37',
} as const
