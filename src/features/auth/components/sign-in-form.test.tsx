import { QueryClient, QueryClientProvider } from '@tanstack/react-query'
import { render, screen, waitFor } from '@testing-library/react'
import userEvent from '@testing-library/user-event'
import { MemoryRouter } from 'react-router-dom'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { SignInForm } from '@/features/auth/components/sign-in-form'

function renderForm(onSignedIn = vi.fn()) {
  const client = new QueryClient({ defaultOptions: { mutations: { retry: false } } })
  render(
    <QueryClientProvider client={client}>
      <MemoryRouter>
        <SignInForm onSignedIn={onSignedIn} />
      </MemoryRouter>
    </QueryClientProvider>,
  )
  return onSignedIn
}

function jsonResponse(status: number, body: unknown) {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } })
}

afterEach(() => vi.unstubAllGlobals())

describe('SignInForm', () => {
  it('shows field errors from the shared schema without calling the server', async () => {
    const fetchMock = vi.fn()
    vi.stubGlobal('fetch', fetchMock)
    renderForm()
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }))
    expect(await screen.findByText('Enter a valid e-mail address.')).toBeInTheDocument()
    expect(screen.getByText('Enter your password.')).toBeInTheDocument()
    expect(screen.getByLabelText('E-mail')).toHaveAttribute('aria-invalid', 'true')
    expect(fetchMock).not.toHaveBeenCalled()
  })

  it("shows the server's message for wrong credentials", async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string) =>
        url.endsWith('/auth/csrf')
          ? jsonResponse(200, { csrfToken: 't' })
          : jsonResponse(401, {
              error: {
                code: 'invalid_credentials',
                message: 'That e-mail and password do not match an active account.',
              },
            }),
      ),
    )
    const onSignedIn = renderForm()
    await userEvent.type(screen.getByLabelText('E-mail'), 'maren@brindlewick.test')
    await userEvent.type(screen.getByLabelText('Password'), 'wrong-one')
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }))
    expect(await screen.findByRole('alert')).toHaveTextContent('do not match an active account')
    expect(onSignedIn).not.toHaveBeenCalled()
  })

  it('hands the signed-in user on', async () => {
    const user = { id: 1, email: 'maren@brindlewick.test', name: 'Maren Oakes', role: 'owner', shopId: null }
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string) =>
        url.endsWith('/auth/csrf')
          ? jsonResponse(200, { csrfToken: 't' })
          : jsonResponse(200, { user, csrfToken: 't2' }),
      ),
    )
    const onSignedIn = renderForm()
    await userEvent.type(screen.getByLabelText('E-mail'), user.email)
    await userEvent.type(screen.getByLabelText('Password'), 'brindle-owner-2026')
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }))
    await waitFor(() => expect(onSignedIn).toHaveBeenCalledWith(user))
  })
})
