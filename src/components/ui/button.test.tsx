import { createRef } from 'react'
import { render, screen } from '@testing-library/react'
import userEvent from '@testing-library/user-event'
import { MemoryRouter } from 'react-router-dom'
import { describe, expect, it, vi } from 'vitest'
import { Button, LinkButton } from '@/components/ui/button'

describe('Button', () => {
  it('runs its action when clicked', async () => {
    const onClick = vi.fn()
    render(<Button onClick={onClick}>Place order</Button>)
    await userEvent.click(screen.getByRole('button', { name: 'Place order' }))
    expect(onClick).toHaveBeenCalledTimes(1)
  })

  it('while loading is disabled, busy and ignores clicks', async () => {
    const onClick = vi.fn()
    render(
      <Button loading onClick={onClick}>
        Place order
      </Button>,
    )
    const button = screen.getByRole('button', { name: 'Place order' })
    expect(button).toBeDisabled()
    expect(button).toHaveAttribute('aria-busy', 'true')
    await userEvent.click(button)
    expect(onClick).not.toHaveBeenCalled()
  })

  it('does not submit a form unless it says type="submit"', async () => {
    const onSubmit = vi.fn((event: { preventDefault: () => void }) => event.preventDefault())
    render(
      <form onSubmit={onSubmit}>
        <Button variant="secondary">Add a line</Button>
        <Button type="submit">Save</Button>
      </form>,
    )
    await userEvent.click(screen.getByRole('button', { name: 'Add a line' }))
    expect(onSubmit).not.toHaveBeenCalled()
    await userEvent.click(screen.getByRole('button', { name: 'Save' }))
    expect(onSubmit).toHaveBeenCalledTimes(1)
  })

  it('forwards its ref to the button element', () => {
    const ref = createRef<HTMLButtonElement>()
    render(
      <Button ref={ref} variant="danger">
        Write off
      </Button>,
    )
    expect(ref.current).toBe(screen.getByRole('button', { name: 'Write off' }))
  })
})

describe('LinkButton', () => {
  it('is a link styled as a button', () => {
    render(
      <MemoryRouter>
        <LinkButton to="/orders/new" variant="secondary">
          New order
        </LinkButton>
      </MemoryRouter>,
    )
    const link = screen.getByRole('link', { name: 'New order' })
    expect(link).toHaveAttribute('href', '/orders/new')
    expect(link).toHaveClass('inline-flex')
  })
})
