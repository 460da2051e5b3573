import { QueryClient, QueryClientProvider } from '@tanstack/react-query'
import { render, screen, waitFor } from '@testing-library/react'
import userEvent from '@testing-library/user-event'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { PayByCardButton } from '@/features/card-payments/components/pay-by-card-button'
import { RefundDialog } from '@/features/card-payments/components/refund-dialog'

function jsonResponse(status: number, body: unknown) {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } })
}

function withClient(ui: React.ReactNode) {
  const client = new QueryClient({
    defaultOptions: { queries: { retry: false }, mutations: { retry: false } },
  })
  return render(<QueryClientProvider client={client}>{ui}</QueryClientProvider>)
}

afterEach(() => vi.unstubAllGlobals())

const open = { id: 7, number: 'LC-2026-000007', status: 'open', kind: 'invoice', outstandingCents: 4000 }

describe('PayByCardButton', () => {
  it('shows for an open invoice when the studio takes cards', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => jsonResponse(200, { enabled: true })),
    )
    withClient(<PayByCardButton invoice={open} />)
    expect(
      await screen.findByRole('button', { name: 'Pay by card: invoice LC-2026-000007' }),
    ).toBeInTheDocument()
  })

  it.each([
    ['cards are off', { enabled: false }, open],
    ['the invoice is paid', { enabled: true }, { ...open, status: 'paid', outstandingCents: 0 }],
    ['it is a credit note', { enabled: true }, { ...open, kind: 'credit_note', status: 'credit' }],
  ])('stays hidden when %s', async (_why, status, invoice) => {
    const fetchMock = vi.fn(async () => jsonResponse(200, status))
    vi.stubGlobal('fetch', fetchMock)
    withClient(<PayByCardButton invoice={invoice} />)
    await waitFor(() => expect(fetchMock).toHaveBeenCalled())
    await new Promise((r) => setTimeout(r, 20))
    expect(screen.queryByRole('button')).not.toBeInTheDocument()
  })
})

describe('RefundDialog', () => {
  const payment = { id: 3, amountCents: 40000, refundedCents: 1250, receivedOn: '2026-12-02' }

  it('offers what is left, checks the amount, and shows the server’s limit on the amount field', async () => {
    const calls: { url: string; body: unknown }[] = []
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string, init?: RequestInit) => {
        if (url.endsWith('/auth/csrf')) return jsonResponse(200, { csrfToken: 't' })
        calls.push({ url, body: JSON.parse(String(init?.body)) })
        return jsonResponse(422, {
          error: {
            code: 'refund_too_large',
            message: 'At most $387.50 of this payment can be refunded.',
            details: [{ field: 'amountCents', message: 'At most $387.50 of this payment can be refunded.' }],
          },
        })
      }),
    )
    const onRefunded = vi.fn()
    withClient(
      <RefundDialog
        payment={payment}
        invoiceNumber="LC-2026-000007"
        currency="USD"
        onClose={vi.fn()}
        onRefunded={onRefunded}
      />,
    )
    const amount = screen.getByLabelText('Amount to refund')
    expect(amount).toHaveValue('387.50')
    await userEvent.clear(amount)
    await userEvent.type(amount, 'ten')
    await userEvent.click(screen.getByRole('button', { name: 'Refund to card' }))
    expect(await screen.findByText('Enter an amount like 25.00.')).toBeInTheDocument()
    expect(calls).toHaveLength(0)

    await userEvent.clear(amount)
    await userEvent.type(amount, '500')
    await userEvent.click(screen.getByRole('button', { name: 'Refund to card' }))
    expect(await screen.findByText('At most $387.50 of this payment can be refunded.')).toBeInTheDocument()
    expect(calls).toEqual([{ url: '/api/payments/3/refunds', body: { amountCents: 50000, reason: null } }])
    expect(onRefunded).not.toHaveBeenCalled()
  })
})
