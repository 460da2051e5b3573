import { render, screen } from '@testing-library/react'
import userEvent from '@testing-library/user-event'
import { describe, expect, it, vi } from 'vitest'
import { Tabs } from '@/components/ui/tabs'

const items = [
  { id: 'lines', label: 'Lines', content: <p>Six cases of Lavender Oat</p> },
  { id: 'shipping', label: 'Shipping', content: <p>Two cartons, 14 kg</p> },
  { id: 'invoice', label: 'Invoice', content: <p>Net 30, due 4 June</p> },
]

describe('Tabs', () => {
  it('shows the first panel, labelled by its tab', () => {
    render(<Tabs label="Order sections" items={items} />)
    expect(screen.getByRole('tablist', { name: 'Order sections' })).toBeInTheDocument()
    expect(screen.getByRole('tab', { name: 'Lines' })).toHaveAttribute('aria-selected', 'true')
    expect(screen.getByRole('tabpanel', { name: 'Lines' })).toHaveTextContent('Six cases of Lavender Oat')
    expect(screen.queryByText('Two cartons, 14 kg')).not.toBeVisible()
  })

  it('moves with the arrow keys, Home and End, keeping one tab in the Tab order', async () => {
    const user = userEvent.setup()
    const onSelect = vi.fn()
    render(<Tabs label="Order sections" items={items} onSelect={onSelect} />)
    await user.tab()
    expect(screen.getByRole('tab', { name: 'Lines' })).toHaveFocus()

    await user.keyboard('{ArrowRight}')
    const shipping = screen.getByRole('tab', { name: 'Shipping' })
    expect(shipping).toHaveFocus()
    expect(shipping).toHaveAttribute('aria-selected', 'true')
    expect(shipping).toHaveAttribute('tabindex', '0')
    expect(screen.getByRole('tab', { name: 'Lines' })).toHaveAttribute('tabindex', '-1')
    expect(screen.getByRole('tabpanel', { name: 'Shipping' })).toHaveTextContent('Two cartons, 14 kg')

    await user.keyboard('{End}')
    expect(screen.getByRole('tab', { name: 'Invoice' })).toHaveFocus()
    await user.keyboard('{ArrowRight}')
    expect(screen.getByRole('tab', { name: 'Lines' })).toHaveFocus()
    await user.keyboard('{ArrowLeft}')
    expect(screen.getByRole('tab', { name: 'Invoice' })).toHaveFocus()
    await user.keyboard('{Home}')
    expect(screen.getByRole('tab', { name: 'Lines' })).toHaveAttribute('aria-selected', 'true')
    expect(onSelect.mock.calls.map(([id]) => id)).toEqual([
      'shipping',
      'invoice',
      'lines',
      'invoice',
      'lines',
    ])
  })
})
