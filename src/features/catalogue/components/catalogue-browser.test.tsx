import { render, screen, within } from '@testing-library/react'
import userEvent from '@testing-library/user-event'
import { beforeEach, describe, expect, it } from 'vitest'
import type { CatalogueItem } from '@shared/schemas/catalogue'
import { CatalogueBrowser } from '@/features/catalogue/components/catalogue-browser'

const item = (
  over: Partial<CatalogueItem> & Pick<CatalogueItem, 'productId' | 'sku' | 'name'>,
): CatalogueItem => ({
  casePack: 12,
  netWeightG: 113,
  msrpCents: 1000,
  priceBreaks: [{ minCases: 1, unitPriceCents: 500 }],
  readyBars: 0,
  readyCases: 0,
  nextReady: null,
  scentNotes: null,
  description: null,
  photoUrl: null,
  ...over,
})

const items: CatalogueItem[] = [
  item({
    productId: 1,
    sku: 'LAV',
    name: 'Lavender Field',
    scentNotes: 'Lavender, soft herbal',
    readyBars: 48,
    readyCases: 4,
    priceBreaks: [{ minCases: 1, unitPriceCents: 465 }],
  }),
  item({
    productId: 2,
    sku: 'CDR',
    name: 'Cedar & Sage',
    readyBars: 0,
    nextReady: { date: '2026-12-22', bars: 60 },
    priceBreaks: [{ minCases: 1, unitPriceCents: 520 }],
  }),
  item({
    productId: 3,
    sku: 'HNY',
    name: 'Honey Oat',
    scentNotes: 'Warm honey',
    readyBars: 120,
    readyCases: 10,
    nextReady: { date: '2026-12-30', bars: 36 },
    priceBreaks: [{ minCases: 1, unitPriceCents: 410 }],
  }),
]

function names() {
  return within(screen.getByRole('list', { name: 'Products you can order' }))
    .getAllByRole('heading')
    .map((h) => h.textContent)
}

/** The screen width the component asks `matchMedia` about: phones get cards, wide screens a table. */
function screenIsWide(wide: boolean) {
  window.matchMedia = ((query: string) => ({
    matches: wide,
    media: query,
    onchange: null,
    addEventListener: () => {},
    removeEventListener: () => {},
    addListener: () => {},
    removeListener: () => {},
    dispatchEvent: () => false,
  })) as typeof window.matchMedia
}

function renderBrowser() {
  render(
    <CatalogueBrowser
      items={items}
      currency="USD"
      renderTile={(i) => <span>{i.sku} tile</span>}
      renderAction={(i) => <button type="button">Order {i.name}</button>}
    />,
  )
}

describe('CatalogueBrowser', () => {
  beforeEach(() => screenIsWide(false))

  it('lists every product by name, with prices, badges and the action', () => {
    renderBrowser()
    expect(names()).toEqual(['Cedar & Sage', 'Honey Oat', 'Lavender Field'])
    expect(screen.getByText('3 products')).toBeInTheDocument()
    expect(screen.getByText('Ready now: 4 cases')).toBeInTheDocument()
    expect(screen.getByText(/Next: 60 bars on Dec 22/)).toBeInTheDocument()
    expect(screen.getByRole('button', { name: 'Order Honey Oat' })).toBeInTheDocument()
  })

  it.each([
    ['lavender', ['Lavender Field']],
    ['HNY', ['Honey Oat']],
    ['warm honey', ['Honey Oat']],
    ['sage', ['Cedar & Sage']],
  ])('searches name, SKU and scent: “%s”', async (text, expected) => {
    renderBrowser()
    await userEvent.setup().type(screen.getByLabelText('Search'), text)
    expect(names()).toEqual(expected)
  })

  it.each([
    ['ready', ['Honey Oat', 'Lavender Field']],
    ['curing', ['Cedar & Sage', 'Honey Oat']],
  ])('filters to %s', async (show, expected) => {
    renderBrowser()
    await userEvent.setup().selectOptions(screen.getByLabelText('Show'), show)
    expect(names()).toEqual(expected)
    expect(screen.getByText(`${expected.length} of 3 products`)).toBeInTheDocument()
  })

  it.each([
    ['price-asc', ['Honey Oat', 'Lavender Field', 'Cedar & Sage']],
    ['price-desc', ['Cedar & Sage', 'Lavender Field', 'Honey Oat']],
    ['ready-desc', ['Honey Oat', 'Lavender Field', 'Cedar & Sage']],
    ['name-desc', ['Lavender Field', 'Honey Oat', 'Cedar & Sage']],
  ])('sorts by %s', async (sort, expected) => {
    renderBrowser()
    await userEvent.setup().selectOptions(screen.getByLabelText('Sort by'), sort)
    expect(names()).toEqual(expected)
  })

  it('says so when nothing matches', async () => {
    renderBrowser()
    const user = userEvent.setup()
    await user.selectOptions(screen.getByLabelText('Show'), 'ready')
    await user.type(screen.getByLabelText('Search'), 'cedar')
    expect(screen.getByText('No product matches')).toBeInTheDocument()
  })

  it('draws a table on wide screens, with the same rows', async () => {
    screenIsWide(true)
    renderBrowser()
    const table = screen.getByRole('table', { name: 'Products you can order' })
    const rows = within(table).getAllByRole('row').slice(1)
    expect(rows.map((r) => within(r).getAllByRole('cell')[0]!.querySelector('p')?.textContent)).toEqual([
      'Cedar & Sage',
      'Honey Oat',
      'Lavender Field',
    ])
    await userEvent.setup().selectOptions(screen.getByLabelText('Show'), 'ready')
    expect(within(table).getAllByRole('row')).toHaveLength(3)
  })
})
