import { render, screen, within } from '@testing-library/react'
import { MemoryRouter } from 'react-router-dom'
import { describe, expect, it } from 'vitest'
import type { InvoiceListItem } from '@shared/schemas/invoices'
import { InvoicesTable } from '@/features/invoices/components/invoices-table'

const invoice: InvoiceListItem = {
  id: 4,
  number: 'LC-2026-000041',
  orderId: 9,
  shopId: 2,
  status: 'part_paid',
  issueDate: '2026-11-20',
  dueDate: '2026-12-20',
  totalCents: 123450,
  paidCents: 20000,
  orderNumber: 'O26-00009',
  shopName: 'Harbor Lane General',
  kind: 'invoice',
  outstandingCents: 103450,
}

describe('InvoicesTable', () => {
  it.each([
    // Intl.NumberFormat en-US renderings (ECMA-402 with CLDR data): the studio's currency decides the sign.
    ['EUR', ['€1,234.50', '€200.00', '€1,034.50']],
    ['CAD', ['CA$1,234.50', 'CA$200.00', 'CA$1,034.50']],
    ['USD', ['$1,234.50', '$200.00', '$1,034.50']],
  ])('gives every amount in the studio currency %s', (currency, expected) => {
    render(
      <MemoryRouter>
        <InvoicesTable items={[invoice]} currency={currency} showShop />
      </MemoryRouter>,
    )
    const row = screen.getByRole('row', { name: /LC-2026-000041/ })
    for (const text of expected) expect(within(row).getByText(text)).toBeInTheDocument()
    if (currency !== 'USD') expect(within(row).queryByText(/^\$/)).toBeNull()
  })
})
