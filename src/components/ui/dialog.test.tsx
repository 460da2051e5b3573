import { useState } from 'react'
import { act, render, screen, waitFor } from '@testing-library/react'
import userEvent from '@testing-library/user-event'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { ConfirmDialog, Dialog } from '@/components/ui/dialog'
import { Input } from '@/components/ui/field'

function NoteDialog() {
  const [open, setOpen] = useState(false)
  return (
    <>
      <button type="button" onClick={() => setOpen(true)}>
        Add a note
      </button>
      <Dialog
        open={open}
        onClose={() => setOpen(false)}
        title="Note for the packer"
        description="Printed on the packing slip."
      >
        <label>
          Note <Input />
        </label>
      </Dialog>
    </>
  )
}

function dialogEl() {
  const el = document.querySelector('dialog')
  if (!el) throw new Error('no dialog element')
  return el
}

describe('Dialog', () => {
  it('opens named by its title, focuses its first field, and closes on Escape with focus back on the opener', async () => {
    const user = userEvent.setup()
    render(<NoteDialog />)
    expect(dialogEl().open).toBe(false)

    const opener = screen.getByRole('button', { name: 'Add a note' })
    await user.click(opener)
    const dialog = screen.getByRole('dialog', { name: 'Note for the packer' })
    expect(dialogEl().open).toBe(true)
    expect(dialog).toHaveAccessibleDescription('Printed on the packing slip.')
    expect(screen.getByLabelText('Note')).toHaveFocus()

    await user.keyboard('{Escape}')
    expect(dialogEl().open).toBe(false)
    expect(opener).toHaveFocus()
  })

  it('closes from its close button', async () => {
    const user = userEvent.setup()
    render(<NoteDialog />)
    await user.click(screen.getByRole('button', { name: 'Add a note' }))
    await user.click(screen.getByRole('button', { name: 'Close' }))
    expect(dialogEl().open).toBe(false)
    expect(screen.getByRole('button', { name: 'Add a note' })).toHaveFocus()
  })

  describe('where the browser has no showModal', () => {
    const original = HTMLDialogElement.prototype.showModal
    afterEach(() => {
      HTMLDialogElement.prototype.showModal = original
    })

    it('still opens by setting the open attribute', async () => {
      // @ts-expect-error -- simulating an environment without the modal API
      delete HTMLDialogElement.prototype.showModal
      expect(typeof HTMLDialogElement.prototype.showModal).toBe('undefined')
      const user = userEvent.setup()
      render(<NoteDialog />)
      await user.click(screen.getByRole('button', { name: 'Add a note' }))
      expect(dialogEl()).toHaveAttribute('open')
      await user.keyboard('{Escape}')
      expect(dialogEl()).not.toHaveAttribute('open')
    })
  })
})

function DeleteLot({ onConfirm }: { onConfirm: () => Promise<void> }) {
  const [open, setOpen] = useState(false)
  return (
    <>
      <button type="button" onClick={() => setOpen(true)}>
        Write off lot
      </button>
      <ConfirmDialog
        open={open}
        onClose={() => setOpen(false)}
        title="Write off lot L-0412?"
        message="Its 36 bars leave stock for good."
        confirmLabel="Write off"
        danger
        onConfirm={onConfirm}
      />
    </>
  )
}

describe('ConfirmDialog', () => {
  it('starts on Cancel for a dangerous step, and Cancel closes without confirming', async () => {
    const user = userEvent.setup()
    const onConfirm = vi.fn(() => Promise.resolve())
    render(<DeleteLot onConfirm={onConfirm} />)
    await user.click(screen.getByRole('button', { name: 'Write off lot' }))
    expect(screen.getByRole('dialog', { name: 'Write off lot L-0412?' })).toHaveAccessibleDescription(
      'Its 36 bars leave stock for good.',
    )
    expect(screen.getByRole('button', { name: 'Cancel' })).toHaveFocus()
    await user.click(screen.getByRole('button', { name: 'Cancel' }))
    expect(dialogEl().open).toBe(false)
    expect(onConfirm).not.toHaveBeenCalled()
  })

  it('calls onConfirm, is busy while it runs, and closes when it is done', async () => {
    const user = userEvent.setup()
    let finish: () => void = () => {}
    const onConfirm = vi.fn(
      () =>
        new Promise<void>((resolve) => {
          finish = resolve
        }),
    )
    render(<DeleteLot onConfirm={onConfirm} />)
    await user.click(screen.getByRole('button', { name: 'Write off lot' }))
    await user.click(screen.getByRole('button', { name: 'Write off' }))

    expect(onConfirm).toHaveBeenCalledTimes(1)
    const confirm = screen.getByRole('button', { name: 'Write off' })
    expect(confirm).toBeDisabled()
    expect(confirm).toHaveAttribute('aria-busy', 'true')
    expect(screen.getByRole('button', { name: 'Cancel' })).toBeDisabled()
    // While the step runs, Escape does not abandon it.
    await user.keyboard('{Escape}')
    expect(dialogEl().open).toBe(true)

    await act(async () => finish())
    await waitFor(() => expect(dialogEl().open).toBe(false))
  })

  it('stays open and shows the error when onConfirm fails', async () => {
    const user = userEvent.setup()
    const onConfirm = vi.fn(() => Promise.reject(new Error('This lot has bars reserved for order 1042.')))
    render(<DeleteLot onConfirm={onConfirm} />)
    await user.click(screen.getByRole('button', { name: 'Write off lot' }))
    await user.click(screen.getByRole('button', { name: 'Write off' }))

    expect(await screen.findByRole('alert')).toHaveTextContent('This lot has bars reserved for order 1042.')
    expect(dialogEl().open).toBe(true)
    expect(screen.getByRole('button', { name: 'Write off' })).toBeEnabled()
  })
})
