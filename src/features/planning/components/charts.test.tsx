import { render, screen, within } from '@testing-library/react'
import { describe, expect, it, vi } from 'vitest'
import type { PlanProduct } from '@shared/schemas/planning'
import type { SalesReport } from '@shared/schemas/sales'
import { DemandChart } from '@/features/planning/components/demand-chart'
import { OutlookChart } from '@/features/planning/components/outlook-chart'
import { SalesChart } from '@/features/sales/components/sales-chart'

const product = (over: Partial<PlanProduct>): PlanProduct =>
  ({
    productId: 1,
    sku: 'LAV',
    name: 'Lavender Field',
    casePack: 12,
    weeklyDemandBars: 18,
    weeklyDemandCases: 1.5,
    preorderBars: 24,
    plannedBars: 0,
    outlook: [
      { weekStart: '2026-12-01', readyBars: 30, curingBars: 20 },
      { weekStart: '2026-12-08', readyBars: 12, curingBars: 20 },
    ],
    ...over,
  }) as PlanProduct

describe('plan and sales charts', () => {
  it('give each chart a title and a table of the same numbers, without warnings', () => {
    const warn = vi.spyOn(console, 'warn')
    render(
      <>
        <DemandChart
          products={[
            product({}),
            product({ productId: 2, sku: 'CDR', name: 'Cedar', weeklyDemandCases: 0, preorderBars: 0 }),
          ]}
          windowWeeks={8}
        />
        <OutlookChart product={product({})} />
      </>,
    )
    const demand = screen.getByRole('figure', { name: 'Demand per product' })
    const rows = within(demand).getAllByRole('row')
    expect(rows.map((r) => r.textContent)).toEqual([
      'ProductCases a weekOpen pre-orders (cases)',
      'Lavender Field (LAV)1.52',
      'Cedar (CDR)00',
    ])
    const outlook = screen.getByRole('figure', { name: 'Stock outlook: Lavender Field' })
    expect(
      within(outlook)
        .getAllByRole('row')
        .map((r) => r.textContent),
    ).toEqual(['Week ofReady barsCuring bars', 'Dec 1, 20263020', 'Dec 8, 20261220'])
    expect(warn).not.toHaveBeenCalled()
    warn.mockRestore()
  })

  it('names the sales chart by its grouping', () => {
    const report: SalesReport = {
      from: '2026-11-01',
      to: '2026-11-30',
      by: 'tier',
      rows: [
        {
          key: 1,
          label: 'Preferred',
          orders: 2,
          bars: 48,
          revenueCents: 25_560,
          costCents: 8_352,
          marginCents: 17_208,
          marginPct: 67.3,
        },
      ],
      totals: {
        orders: 2,
        bars: 48,
        revenueCents: 25_560,
        costCents: 8_352,
        marginCents: 17_208,
        marginPct: 67.3,
      },
    }
    render(<SalesChart report={report} currency="USD" />)
    expect(screen.getByRole('figure', { name: 'Revenue and margin by price tier' })).toBeDefined()
  })
})
