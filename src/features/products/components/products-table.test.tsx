import { render, screen, within } from '@testing-library/react'
import { MemoryRouter } from 'react-router-dom'
import { describe, expect, it } from 'vitest'
import type { ProductRow } from '@shared/schemas/products'
import { ProductsTable } from '@/features/products/components/products-table'

const product: ProductRow = {
  id: 3,
  sku: 'LAV',
  name: 'Lavender Field',
  scentNotes: null,
  description: null,
  recipeId: 1,
  recipeName: 'Olive and shea',
  netWeightG: 113,
  cutWeightG: 130,
  casePack: 12,
  msrpCents: 950,
  gtin: null,
  active: true,
  photo: null,
  costPerBarCents: 187,
  missingCosts: [],
  priceBreakCount: 3,
  pricedTierCount: 3,
  declarationConfirmedAt: null,
  updatedAt: '2026-11-30T10:00:00.000Z',
}

describe('ProductsTable', () => {
  it('gives the MSRP and the cost per bar in the studio currency (Intl.NumberFormat en-US)', () => {
    render(
      <MemoryRouter>
        <ProductsTable products={[product]} currency="GBP" />
      </MemoryRouter>,
    )
    const row = screen.getByRole('row', { name: /LAV/ })
    expect(within(row).getByText('£9.50')).toBeInTheDocument()
    expect(within(row).getByText('£1.87')).toBeInTheDocument()
    expect(within(row).queryByText(/\$/)).toBeNull()
  })
})
