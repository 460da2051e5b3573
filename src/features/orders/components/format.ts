const dateTime = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short' })
const dateOnly = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium' })

/** When something happened, in the reader's own clock: "Dec 1, 2026, 4:05 PM". */
export const formatMoment = (iso: string) => dateTime.format(new Date(iso))
export const formatDay = (iso: string) => dateOnly.format(new Date(iso))

export const casesText = (n: number) => `${n.toLocaleString('en-US')} ${n === 1 ? 'case' : 'cases'}`
