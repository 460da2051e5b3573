import { render, screen, within } from '@testing-library/react'
import userEvent from '@testing-library/user-event'
import { MemoryRouter, Route, Routes } from 'react-router-dom'
import { describe, expect, it, vi } from 'vitest'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { Money } from '@/components/ui/money'

type ProductRow = { id: string; sku: string; name: string; readyBars: number; priceCents: number }

const products: ProductRow[] = [
  { id: 'p1', sku: 'LAV-01', name: 'Lavender Oat', readyBars: 120, priceCents: 450 },
  { id: 'p2', sku: 'CED-02', name: 'Cedar Smoke', readyBars: 0, priceCents: 525 },
  { id: 'p3', sku: 'ROS-03', name: 'Rose Clay', readyBars: 48, priceCents: 480 },
]

const col = dataTableColumnHelper<ProductRow>()
const columns = col.columns([
  col.accessor('name', { header: 'Name' }),
  col.accessor('sku', { header: 'SKU' }),
  col.accessor('readyBars', { header: 'Ready bars', meta: { align: 'end' } }),
  col.accessor('priceCents', {
    header: 'Price',
    meta: { align: 'end' },
    enableGlobalFilter: false,
    cell: (info) => <Money cents={info.getValue()} currency="USD" />,
  }),
])

function bodyRows() {
  const [, body] = screen.getAllByRole('rowgroup')
  if (!body) throw new Error('table has no body')
  return within(body).getAllByRole('row')
}

function firstColumn() {
  return bodyRows().map((row) => within(row).getAllByRole('cell')[0]?.textContent)
}

describe('DataTable', () => {
  it('renders the caller’s columns and cells under its label', () => {
    render(<DataTable label="Products" columns={columns} data={products} getRowId={(p) => p.id} />)
    expect(screen.getByRole('table', { name: 'Products' })).toBeInTheDocument()
    expect(screen.getAllByRole('columnheader').map((h) => h.textContent)).toEqual([
      'Name',
      'SKU',
      'Ready bars',
      'Price',
    ])
    expect(firstColumn()).toEqual(['Lavender Oat', 'Cedar Smoke', 'Rose Clay'])
    expect(within(bodyRows()[1]!).getByText('$5.25')).toBeInTheDocument()
  })

  it('sorts when a header is clicked, and says so with aria-sort', async () => {
    const user = userEvent.setup()
    render(<DataTable label="Products" columns={columns} data={products} />)
    const nameHeader = screen.getByRole('columnheader', { name: 'Name' })
    expect(nameHeader).not.toHaveAttribute('aria-sort')

    await user.click(within(nameHeader).getByRole('button', { name: 'Name' }))
    expect(firstColumn()).toEqual(['Cedar Smoke', 'Lavender Oat', 'Rose Clay'])
    expect(nameHeader).toHaveAttribute('aria-sort', 'ascending')

    await user.click(within(nameHeader).getByRole('button', { name: 'Name' }))
    expect(firstColumn()).toEqual(['Rose Clay', 'Lavender Oat', 'Cedar Smoke'])
    expect(nameHeader).toHaveAttribute('aria-sort', 'descending')
  })

  it('sorts from the keyboard, numbers largest first', async () => {
    const user = userEvent.setup()
    render(<DataTable label="Products" columns={columns} data={products} />)
    const readyHeader = screen.getByRole('columnheader', { name: 'Ready bars' })
    within(readyHeader).getByRole('button').focus()
    await user.keyboard('{Enter}')
    expect(firstColumn()).toEqual(['Lavender Oat', 'Rose Clay', 'Cedar Smoke'])
    expect(readyHeader).toHaveAttribute('aria-sort', 'descending')
    expect(screen.getByRole('columnheader', { name: 'Name' })).not.toHaveAttribute('aria-sort')
  })

  it('filters rows with the search box, and says when nothing matches', async () => {
    const user = userEvent.setup()
    render(<DataTable label="Products" columns={columns} data={products} searchable />)
    const search = screen.getByLabelText('Search')

    await user.type(search, 'clay')
    expect(firstColumn()).toEqual(['Rose Clay'])
    expect(screen.getByRole('status')).toHaveTextContent('1 matching row')

    await user.clear(search)
    await user.type(search, 'ced-0')
    expect(firstColumn()).toEqual(['Cedar Smoke'])

    await user.clear(search)
    await user.type(search, 'patchouli')
    expect(bodyRows()).toHaveLength(1)
    expect(screen.getByText('No rows match “patchouli”.')).toBeInTheDocument()

    await user.clear(search)
    expect(bodyRows()).toHaveLength(3)
  })

  it('shows the empty message when there are no rows', () => {
    render(<DataTable label="Products" columns={columns} data={[]} emptyMessage="No products yet." />)
    const cell = screen.getByRole('cell', { name: 'No products yet.' })
    expect(cell).toHaveAttribute('colspan', '4')
  })

  it('pages through rows 25 at a time', async () => {
    const user = userEvent.setup()
    const many = Array.from({ length: 30 }, (_, i) => ({
      id: `p${i}`,
      sku: `BAR-${String(i + 1).padStart(2, '0')}`,
      name: `Bar ${String(i + 1).padStart(2, '0')}`,
      readyBars: i,
      priceCents: 400,
    }))
    render(<DataTable label="Products" columns={columns} data={many} paginate />)
    expect(bodyRows()).toHaveLength(25)
    expect(screen.getByText('Page 1 of 2')).toBeInTheDocument()
    expect(screen.getByRole('button', { name: 'Previous page' })).toBeDisabled()

    await user.click(screen.getByRole('button', { name: 'Next page' }))
    expect(firstColumn()).toEqual(['Bar 26', 'Bar 27', 'Bar 28', 'Bar 29', 'Bar 30'])
    expect(screen.getByText('26–30 of 30')).toBeInTheDocument()
    expect(screen.getByRole('button', { name: 'Next page' })).toBeDisabled()
  })

  it('calls onRowClick for a click or Enter on a row', async () => {
    const user = userEvent.setup()
    const onRowClick = vi.fn()
    render(<DataTable label="Products" columns={columns} data={products} onRowClick={onRowClick} />)
    await user.click(screen.getByText('Rose Clay'))
    expect(onRowClick).toHaveBeenLastCalledWith(products[2])

    bodyRows()[0]!.focus()
    await user.keyboard('{Enter}')
    expect(onRowClick).toHaveBeenLastCalledWith(products[0])
    expect(onRowClick).toHaveBeenCalledTimes(2)
  })

  it('links each row, and a click anywhere on the row follows it', async () => {
    const user = userEvent.setup()
    render(
      <MemoryRouter initialEntries={['/products']}>
        <Routes>
          <Route
            path="/products"
            element={
              <DataTable
                label="Products"
                columns={columns}
                data={products}
                rowHref={(p) => `/products/${p.id}`}
              />
            }
          />
          <Route path="/products/:id" element={<p>Product page</p>} />
        </Routes>
      </MemoryRouter>,
    )
    expect(screen.getByRole('link', { name: 'Cedar Smoke' })).toHaveAttribute('href', '/products/p2')
    await user.click(screen.getByText('ROS-03'))
    expect(screen.getByText('Product page')).toBeInTheDocument()
  })
})
