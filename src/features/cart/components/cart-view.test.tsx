import { QueryClient, QueryClientProvider } from '@tanstack/react-query'
import { render, screen, waitFor } from '@testing-library/react'
import userEvent from '@testing-library/user-event'
import { MemoryRouter } from 'react-router-dom'
import { afterEach, describe, expect, it, vi } from 'vitest'
import type { CartDto, CartLineDto } from '@shared/schemas/orders'
import { CartView } from '@/features/cart/components/cart-view'

const line = (over: Partial<CartLineDto> = {}): CartLineDto => ({
  productId: 7,
  sku: 'LAV',
  name: 'Lavender Field',
  casePack: 12,
  netWeightG: 113,
  photoUrl: null,
  cases: 4,
  bars: 48,
  preorder: false,
  priceBreaks: [{ minCases: 1, unitPriceCents: 465 }],
  priceBreak: { minCases: 1, unitPriceCents: 465 },
  nextBreak: null,
  unitPriceCents: 465,
  lineTotalCents: 22320,
  readyBars: 96,
  readyCases: 8,
  nextReady: null,
  stock: 'ready',
  promisedDate: null,
  ...over,
})

const cart = (over: Partial<CartDto> = {}): CartDto => ({
  lines: [line()],
  cases: 4,
  subtotalCents: 22320,
  weightG: 5424,
  shippingCents: 2800,
  taxCents: 0,
  totalCents: 25120,
  taxRatePct: 0,
  taxExempt: true,
  minimumKind: 'reorder',
  minimumCents: 15000,
  belowMinimumByCents: 0,
  canPlace: true,
  accountOrderable: true,
  currency: 'USD',
  ...over,
})

function json(status: number, body: unknown) {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } })
}

/** The POSTs to /api/orders the page made, with their Idempotency-Key headers. */
function serve(answer: (call: number) => Response | Promise<Response>) {
  const posts: { key: string; body: unknown }[] = []
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init: RequestInit = {}) => {
      if (url.endsWith('/auth/csrf')) return json(200, { csrfToken: 't' })
      if (url.endsWith('/cart')) return json(200, { cart: cart() })
      const headers = init.headers as Record<string, string>
      posts.push({ key: headers['Idempotency-Key']!, body: JSON.parse(String(init.body)) })
      return answer(posts.length)
    }),
  )
  return posts
}

function renderCart(value: CartDto, onPlaced = vi.fn()) {
  const client = new QueryClient({
    defaultOptions: { mutations: { retry: false }, queries: { retry: false } },
  })
  render(
    <QueryClientProvider client={client}>
      <MemoryRouter>
        <CartView cart={value} onPlaced={onPlaced} />
      </MemoryRouter>
    </QueryClientProvider>,
  )
  return onPlaced
}

const order = { id: 31, number: 'O26-00031' }

afterEach(() => vi.unstubAllGlobals())

describe('CartView', () => {
  it('shows the totals, the tax exemption and that the minimum is met', () => {
    serve(() => json(201, { order }))
    renderCart(cart())
    expect(screen.getByText('Tax exempt (certificate on file)')).toBeInTheDocument()
    expect(screen.getByText('Your order meets the minimum.')).toBeInTheDocument()
    expect(screen.getByText('$251.20')).toBeInTheDocument()
  })

  it('says how much more the minimum needs, and does not offer to place the order', () => {
    serve(() => json(201, { order }))
    renderCart(
      cart({
        subtotalCents: 5580,
        belowMinimumByCents: 9420,
        canPlace: false,
        minimumKind: 'opening',
        minimumCents: 15000,
      }),
    )
    expect(screen.getByText('Opening order minimum')).toBeInTheDocument()
    expect(screen.getByText(/Add/).textContent).toMatch(/Add \$94\.20 more merchandise/)
    expect(screen.getByRole('button', { name: 'Place order' })).toBeDisabled()
  })

  it('places the order with its PO number; a double click sends one key, once', async () => {
    const posts = serve(() => new Promise((resolve) => setTimeout(() => resolve(json(201, { order })), 50)))
    const onPlaced = renderCart(cart())
    const user = userEvent.setup()
    await user.type(screen.getByLabelText(/PO number/), 'JV-7781')
    await user.dblClick(screen.getByRole('button', { name: 'Place order' }))
    await waitFor(() => expect(onPlaced).toHaveBeenCalledWith(order))
    expect(posts).toHaveLength(1)
    expect(posts[0]!.key).toMatch(/^[0-9a-f-]{36}$/)
    expect(posts[0]!.body).toEqual({
      lines: [{ productId: 7, cases: 4, preorder: false }],
      poNumber: 'JV-7781',
      note: undefined,
    })
  })

  it('keeps the key when the connection fails, so trying again cannot make a second order', async () => {
    const posts = serve((call) => {
      if (call === 1) throw new TypeError('Failed to fetch')
      return json(201, { order })
    })
    const onPlaced = renderCart(cart())
    const user = userEvent.setup()
    await user.click(screen.getByRole('button', { name: 'Place order' }))
    expect(await screen.findByText(/could not be sent/)).toBeInTheDocument()
    await user.click(screen.getByRole('button', { name: 'Place order' }))
    await waitFor(() => expect(onPlaced).toHaveBeenCalled())
    expect(posts.map((p) => p.key)).toEqual([posts[0]!.key, posts[0]!.key])
  })

  it('puts a stock shortfall on its line and takes a new key for the next attempt', async () => {
    const posts = serve(() =>
      json(409, {
        error: {
          code: 'insufficient_stock',
          message: 'Ready stock cannot cover one of the lines.',
          details: [{ productId: 7, requestedBars: 48, readyBars: 30 }],
        },
      }),
    )
    renderCart(cart())
    const user = userEvent.setup()
    await user.click(screen.getByRole('button', { name: 'Place order' }))
    expect(
      await screen.findByText(/Only 30 bars \(2 cases\) are ready now; you asked for 48/),
    ).toBeInTheDocument()
    await user.click(screen.getByRole('button', { name: 'Place order' }))
    await waitFor(() => expect(posts).toHaveLength(2))
    expect(posts[1]!.key).not.toBe(posts[0]!.key)
  })

  it('shows the server’s field error beside the PO number', async () => {
    serve(() =>
      json(400, {
        error: {
          code: 'invalid_input',
          message: 'poNumber: too long',
          details: [{ field: 'poNumber', message: 'A PO number has at most 40 characters.' }],
        },
      }),
    )
    renderCart(cart())
    await userEvent.setup().click(screen.getByRole('button', { name: 'Place order' }))
    expect(await screen.findByText('A PO number has at most 40 characters.')).toBeInTheDocument()
    expect(screen.getByLabelText(/PO number/)).toHaveAttribute('aria-invalid', 'true')
  })
})
