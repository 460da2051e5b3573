import { QueryClient, QueryClientProvider } from '@tanstack/react-query'
import { render, screen, waitFor, within } from '@testing-library/react'
import userEvent from '@testing-library/user-event'
import { MemoryRouter } from 'react-router-dom'
import { afterEach, describe, expect, it, vi } from 'vitest'
import type { UnsentMailDto } from '@shared/schemas/mail'
import { UnsentMailList } from '@/features/mail/components/unsent-mail-list'

function jsonResponse(status: number, body?: unknown) {
  return status === 204
    ? new Response(null, { status })
    : new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } })
}

const givenUp: UnsentMailDto = {
  id: 7,
  kind: 'invoice',
  about: 'Invoice LC-2026-000031',
  orderId: 12,
  invoiceId: 31,
  shopName: 'Fernhollow Goods',
  attempts: 6,
  lastError: '550 5.1.1 mailbox unavailable',
  gaveUp: true,
  nextAttemptAt: null,
  createdAt: '2026-12-01T09:30:00.000Z',
}
const retrying: UnsentMailDto = {
  ...givenUp,
  id: 8,
  kind: 'shipment',
  about: 'Order O26-00012 shipped',
  invoiceId: null,
  attempts: 1,
  lastError: '421 relay busy',
  gaveUp: false,
  nextAttemptAt: '2026-12-01T09:31:00.000Z',
}

/** A fake API: the list as `items` holds it, and the posts it was sent. */
function fakeApi(items: UnsentMailDto[], send: (id: number) => unknown) {
  const posts: string[] = []
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init?: RequestInit) => {
      if (url.endsWith('/auth/csrf')) return jsonResponse(200, { csrfToken: 't' })
      if (init?.method === 'POST') {
        posts.push(url.replace(/^.*\/api/, ''))
        const id = Number(/unsent-mail\/(\d+)/.exec(url)![1])
        if (url.endsWith('/dismiss')) {
          items.splice(
            items.findIndex((m) => m.id === id),
            1,
          )
          return jsonResponse(204)
        }
        return jsonResponse(200, send(id))
      }
      return jsonResponse(200, { items: [...items] })
    }),
  )
  return posts
}

function renderList() {
  const client = new QueryClient({
    defaultOptions: { queries: { retry: false }, mutations: { retry: false } },
  })
  return render(
    <QueryClientProvider client={client}>
      <MemoryRouter>
        <UnsentMailList
          orderHref={(id) => `/studio/orders/${id}`}
          invoiceHref={(id) => `/studio/invoices/${id}`}
        />
      </MemoryRouter>
    </QueryClientProvider>,
  )
}

afterEach(() => vi.unstubAllGlobals())

describe('UnsentMailList', () => {
  it('shows nothing while every e-mail went out', async () => {
    const fetchMock = vi.fn(async () => jsonResponse(200, { items: [] }))
    vi.stubGlobal('fetch', fetchMock)
    const { container } = renderList()
    await waitFor(() => expect(fetchMock).toHaveBeenCalled())
    await new Promise((r) => setTimeout(r, 20))
    expect(container).toBeEmptyDOMElement()
  })

  it('names each e-mail with its shop, state and the relay’s answer, linking to what it is about', async () => {
    fakeApi([givenUp, retrying], () => ({ sent: true }))
    renderList()
    const list = await screen.findByRole('list', { name: 'E-mails not sent' })
    const [first, second] = within(list).getAllByRole('listitem')
    expect(within(first!).getByRole('link', { name: 'Invoice LC-2026-000031' })).toHaveAttribute(
      'href',
      '/studio/invoices/31',
    )
    expect(first).toHaveTextContent('Fernhollow Goods')
    expect(first).toHaveTextContent('Given up')
    expect(first).toHaveTextContent('550 5.1.1 mailbox unavailable')
    expect(first).toHaveTextContent('Refused 6 times')
    expect(first).not.toHaveTextContent('next try')
    expect(within(second!).getByRole('link', { name: 'Order O26-00012 shipped' })).toHaveAttribute(
      'href',
      '/studio/orders/12',
    )
    expect(second).toHaveTextContent('Will try again')
    expect(second).toHaveTextContent('Refused once')
    expect(second).toHaveTextContent('next try')
  })

  it('sends one now and reads the list again: the sent one is gone', async () => {
    const items = [givenUp, retrying]
    const posts = fakeApi(items, (id) => {
      items.splice(
        items.findIndex((m) => m.id === id),
        1,
      )
      return { sent: true }
    })
    renderList()
    const list = await screen.findByRole('list', { name: 'E-mails not sent' })
    await userEvent.click(
      within(within(list).getAllByRole('listitem')[0]!).getByRole('button', { name: 'Send now' }),
    )
    await waitFor(() => expect(screen.getAllByRole('listitem')).toHaveLength(1))
    expect(posts).toEqual(['/unsent-mail/7/send'])
    expect(screen.queryByText('Invoice LC-2026-000031')).not.toBeInTheDocument()
  })

  it('asks before dismissing: Cancel sends nothing, confirming dismisses it', async () => {
    const posts = fakeApi([givenUp], () => ({ sent: true }))
    renderList()
    await userEvent.click(await screen.findByRole('button', { name: 'Dismiss' }))
    const dialog = await screen.findByRole('dialog', { name: 'Dismiss this e-mail?' })
    expect(dialog).toHaveTextContent('“Invoice LC-2026-000031” will not be sent to Fernhollow Goods')
    await userEvent.click(within(dialog).getByRole('button', { name: 'Cancel' }))
    expect(posts).toEqual([])
    await userEvent.click(screen.getByRole('button', { name: 'Dismiss' }))
    await userEvent.click(
      within(await screen.findByRole('dialog')).getByRole('button', { name: 'Dismiss it' }),
    )
    await waitFor(() =>
      expect(screen.queryByRole('list', { name: 'E-mails not sent' })).not.toBeInTheDocument(),
    )
    expect(posts).toEqual(['/unsent-mail/7/dismiss'])
  })
})
