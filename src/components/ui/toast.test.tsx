import { act, render, screen, within } from '@testing-library/react'
import userEvent from '@testing-library/user-event'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { TOAST_DURATION_MS, ToastProvider, toast, useToast } from '@/components/ui/toast'

function SaveButton() {
  const notify = useToast()
  return (
    <>
      <button type="button" onClick={() => notify.success('Order 1042 placed')}>
        Place order
      </button>
      <button type="button" onClick={() => notify.error('Not enough ready bars')}>
        Try order
      </button>
    </>
  )
}

function region() {
  return screen.getByRole('region', { name: 'Notifications' })
}

describe('ToastProvider', () => {
  it('shows a toast in a polite live region and dismisses it with its button', async () => {
    const user = userEvent.setup()
    render(
      <ToastProvider>
        <SaveButton />
      </ToastProvider>,
    )
    expect(within(region()).queryAllByRole('listitem')).toHaveLength(0)
    expect(region().querySelector('[aria-live]')).toHaveAttribute('aria-live', 'polite')

    await user.click(screen.getByRole('button', { name: 'Place order' }))
    await user.click(screen.getByRole('button', { name: 'Try order' }))
    const items = within(region()).getAllByRole('listitem')
    expect(items.map((li) => li.textContent)).toEqual([
      'Done: Order 1042 placed',
      'Problem: Not enough ready bars',
    ])

    await user.click(within(items[0]!).getByRole('button', { name: 'Dismiss notification' }))
    expect(
      within(region())
        .getAllByRole('listitem')
        .map((li) => li.textContent),
    ).toEqual(['Problem: Not enough ready bars'])
  })

  it('shows one toast for the same message sent twice', async () => {
    const user = userEvent.setup()
    render(
      <ToastProvider>
        <SaveButton />
      </ToastProvider>,
    )
    await user.click(screen.getByRole('button', { name: 'Try order' }))
    await user.click(screen.getByRole('button', { name: 'Try order' }))
    expect(within(region()).getAllByRole('listitem')).toHaveLength(1)
  })

  describe('timing', () => {
    beforeEach(() => {
      vi.useFakeTimers()
    })
    afterEach(() => {
      vi.useRealTimers()
    })

    it('dismisses a toast by itself after six seconds', () => {
      render(
        <ToastProvider>
          <SaveButton />
        </ToastProvider>,
      )
      act(() => screen.getByRole('button', { name: 'Place order' }).click())
      expect(within(region()).getByText('Order 1042 placed')).toBeInTheDocument()

      act(() => vi.advanceTimersByTime(TOAST_DURATION_MS - 100))
      expect(within(region()).getByText('Order 1042 placed')).toBeInTheDocument()
      act(() => vi.advanceTimersByTime(100))
      expect(within(region()).queryByText('Order 1042 placed')).not.toBeInTheDocument()
    })

    it('waits while the pointer rests on the toasts', () => {
      render(
        <ToastProvider>
          <SaveButton />
        </ToastProvider>,
      )
      act(() => screen.getByRole('button', { name: 'Place order' }).click())
      act(() => {
        region().dispatchEvent(new MouseEvent('mouseover', { bubbles: true, relatedTarget: document.body }))
      })
      act(() => vi.advanceTimersByTime(TOAST_DURATION_MS * 2))
      expect(within(region()).getByText('Order 1042 placed')).toBeInTheDocument()

      act(() => {
        region().dispatchEvent(new MouseEvent('mouseout', { bubbles: true, relatedTarget: document.body }))
      })
      act(() => vi.advanceTimersByTime(TOAST_DURATION_MS))
      expect(within(region()).queryByText('Order 1042 placed')).not.toBeInTheDocument()
    })
  })

  it('shows messages sent from outside React through the module-level toast', () => {
    render(
      <ToastProvider>
        <p>Orders</p>
      </ToastProvider>,
    )
    act(() => toast.error('Signed out: please sign in again'))
    act(() => toast.info('A newer version is available'))
    expect(
      within(region())
        .getAllByRole('listitem')
        .map((li) => li.textContent),
    ).toEqual(['Problem: Signed out: please sign in again', 'Note: A newer version is available'])
  })

  it('keeps a message sent before the provider mounts and shows it once it does', () => {
    toast.success('Settings saved')
    render(
      <ToastProvider>
        <p>Settings</p>
      </ToastProvider>,
    )
    expect(within(region()).getByText('Settings saved')).toBeInTheDocument()
  })
})
