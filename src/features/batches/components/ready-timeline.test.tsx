import { render, screen, within } from '@testing-library/react'
import { describe, expect, it } from 'vitest'
import type { BatchRow } from '@shared/schemas/batches'
import { ReadyTimeline, readyByWeek } from '@/features/batches/components/ready-timeline'

const batch = (over: Partial<BatchRow>): BatchRow =>
  ({ id: 1, lotCode: 'X', status: 'curing', daysLeft: 10, free: 10, reserved: 0, ...over }) as BatchRow

describe('readyByWeek', () => {
  it.each([
    { daysLeft: 1, week: 0, source: 'tomorrow is in the first week (hand calculation)' },
    { daysLeft: 7, week: 0, source: 'day 7 still the first week' },
    { daysLeft: 8, week: 1, source: 'day 8 opens the second week' },
    { daysLeft: 56, week: 7, source: 'day 56 closes the eighth week' },
  ])('$source', ({ daysLeft, week }) => {
    const weeks = readyByWeek([batch({ daysLeft, free: 12 })], '2026-12-01')
    expect(weeks.map((w) => w.bars)).toEqual(Array.from({ length: 8 }, (_, i) => (i === week ? 12 : 0)))
  })

  it('adds up batches of one week, and leaves out ready, used-up and far-off batches (hand calculation)', () => {
    const weeks = readyByWeek(
      [
        batch({ daysLeft: 3, free: 20 }),
        batch({ daysLeft: 5, free: 10 }),
        batch({ status: 'ready', daysLeft: 0, free: 99 }),
        batch({ status: 'used_up', daysLeft: 4, free: 0 }),
        batch({ daysLeft: 57, free: 50 }),
      ],
      '2026-12-01',
    )
    expect(weeks[0]).toEqual({ from: '2026-12-02', to: '2026-12-08', bars: 30, batches: 2 })
    expect(weeks.reduce((s, w) => s + w.bars, 0)).toBe(30)
    expect(weeks[7]).toMatchObject({ from: '2027-01-20', to: '2027-01-26' })
  })
})

describe('ReadyTimeline', () => {
  it('says the total and gives screen readers the weeks as a table', () => {
    render(<ReadyTimeline batches={[batch({ daysLeft: 9, free: 44 })]} today="2026-12-01" />)
    expect(
      screen.getByRole('figure', { name: '44 bars turn ready over the next eight weeks.' }),
    ).toBeInTheDocument()
    const table = screen.getByRole('table', { name: 'Bars turning ready per week' })
    const second = within(table).getByRole('row', { name: /Dec 9, 2026 to Dec 15, 2026/ })
    expect(
      within(second)
        .getAllByRole('cell')
        .map((c) => c.textContent),
    ).toEqual(['44', '1'])
  })

  it('says when nothing turns ready', () => {
    render(<ReadyTimeline batches={[]} today="2026-12-01" />)
    expect(screen.getByText('No curing batch turns ready in the next eight weeks.')).toBeInTheDocument()
  })
})
