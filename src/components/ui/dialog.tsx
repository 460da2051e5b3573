import { useEffect, useId, useRef, useState } from 'react'
import type { KeyboardEvent, MouseEvent, ReactNode, RefObject } from 'react'
import { cn } from '@/lib/cn'
import { Button } from '@/components/ui/button'
import { FormError } from '@/components/ui/form-error'

// Some environments (older browsers, test DOMs) lack the modal API; the dialog then simply shows
// in place, which is still usable, just without the inert backdrop.
function openModal(dialog: HTMLDialogElement) {
  if (dialog.open) return
  if (typeof dialog.showModal === 'function') dialog.showModal()
  else dialog.setAttribute('open', '')
}

function closeDialog(dialog: HTMLDialogElement) {
  if (!dialog.open) return
  if (typeof dialog.close === 'function') dialog.close()
  else dialog.removeAttribute('open')
}

const focusable =
  'a[href], button:not([disabled]), input:not([disabled]):not([type="hidden"]), select:not([disabled]), ' +
  'textarea:not([disabled]), [tabindex]:not([tabindex="-1"])'

function focusFirst(
  dialog: HTMLDialogElement,
  panel: HTMLElement | null,
  initial?: RefObject<HTMLElement | null>,
) {
  const target =
    initial?.current ??
    dialog.querySelector<HTMLElement>('[autofocus], [data-autofocus]') ??
    dialog.querySelector<HTMLElement>(`[data-dialog-body] :is(${focusable})`) ??
    dialog.querySelector<HTMLElement>(`[data-dialog-footer] :is(${focusable})`) ??
    panel
  target?.focus()
}

const widths = { sm: 'max-w-md', md: 'max-w-lg', lg: 'max-w-2xl' } as const

export type DialogProps = {
  open: boolean
  /** Called when the person asks to close (Escape, the close button, a click on the backdrop). */
  onClose: () => void
  title: ReactNode
  description?: ReactNode
  children?: ReactNode
  /** The dialog's buttons, end-aligned (stacked full width on phones). */
  footer?: ReactNode
  size?: keyof typeof widths
  /** While false (e.g. during a save), Escape, the close button and the backdrop do nothing. */
  dismissible?: boolean
  /** The element to focus on opening; otherwise the first control in the body, then the footer. */
  initialFocusRef?: RefObject<HTMLElement | null>
  className?: string
}

/**
 * A modal dialog on the native `<dialog>` element: the page behind it is inert, it is named by its
 * title, Escape closes it, and focus goes back to whatever opened it. It is controlled by `open`.
 */
export function Dialog({
  open,
  onClose,
  title,
  description,
  children,
  footer,
  size = 'md',
  dismissible = true,
  initialFocusRef,
  className,
}: DialogProps) {
  const dialogRef = useRef<HTMLDialogElement>(null)
  const panelRef = useRef<HTMLDivElement>(null)
  const openerRef = useRef<HTMLElement | null>(null)
  const pressedOnBackdrop = useRef(false)
  const titleId = useId()
  const descriptionId = useId()

  const latest = useRef({ open, onClose, dismissible })
  useEffect(() => {
    latest.current = { open, onClose, dismissible }
  })

  useEffect(() => {
    const dialog = dialogRef.current
    if (!dialog) return
    if (open) {
      if (dialog.open) return
      const active = document.activeElement
      openerRef.current = active instanceof HTMLElement && active !== document.body ? active : null
      openModal(dialog)
      focusFirst(dialog, panelRef.current, initialFocusRef)
    } else if (dialog.open) {
      closeDialog(dialog)
      returnFocus(openerRef)
    }
    // initialFocusRef is read once, on opening.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [open])

  // Unmounting while open (say, the page moved on after a delete) must still hand focus back.
  useEffect(() => {
    const dialog = dialogRef.current
    return () => {
      if (dialog?.open || latest.current.open) returnFocus(openerRef)
    }
  }, [])

  function requestClose() {
    if (latest.current.dismissible) latest.current.onClose()
  }

  function onKeyDown(event: KeyboardEvent<HTMLDialogElement>) {
    if (event.key !== 'Escape') return
    // Handled here rather than by the browser's cancel, so the parent's `open` stays the truth.
    event.preventDefault()
    event.stopPropagation()
    requestClose()
  }

  function onMouseDown(event: MouseEvent<HTMLDialogElement>) {
    pressedOnBackdrop.current = event.target === event.currentTarget
  }

  function onClick(event: MouseEvent<HTMLDialogElement>) {
    // The panel fills the dialog box, so a click whose target is the dialog itself hit the backdrop.
    if (pressedOnBackdrop.current && event.target === event.currentTarget) requestClose()
    pressedOnBackdrop.current = false
  }

  return (
    <dialog
      ref={dialogRef}
      aria-labelledby={titleId}
      aria-describedby={description ? descriptionId : undefined}
      onKeyDown={onKeyDown}
      onCancel={(event) => {
        event.preventDefault()
        requestClose()
      }}
      onClose={() => {
        // Closed by the browser itself (not by us): tell the parent so its state agrees.
        if (latest.current.open) latest.current.onClose()
      }}
      onMouseDown={onMouseDown}
      onClick={onClick}
      className={cn(
        'm-auto w-[calc(100%-1.5rem)] rounded-card bg-white p-0 text-ink-800 shadow-xl',
        'max-h-[calc(100dvh-1.5rem)] sm:w-[calc(100%-3rem)]',
        widths[size],
        className,
      )}
    >
      <div ref={panelRef} tabIndex={-1} className="flex max-h-[calc(100dvh-1.5rem)] flex-col outline-none">
        <div className="flex items-start justify-between gap-4 px-5 pt-5 pb-3 sm:px-6">
          <div className="min-w-0">
            <h2 id={titleId} className="text-lg font-medium text-ink-900">
              {title}
            </h2>
            {description ? (
              <div id={descriptionId} className="mt-1 text-sm text-ink-700">
                {description}
              </div>
            ) : null}
          </div>
          <button
            type="button"
            aria-label="Close"
            onClick={requestClose}
            disabled={!dismissible}
            className="-m-1.5 shrink-0 rounded-md p-1.5 text-ink-600 hover:bg-cream-200 hover:text-ink-900 disabled:opacity-50"
          >
            <svg aria-hidden="true" viewBox="0 0 20 20" className="size-5 fill-current">
              <path d="M5.28 4.22a.75.75 0 0 0-1.06 1.06L8.94 10l-4.72 4.72a.75.75 0 1 0 1.06 1.06L10 11.06l4.72 4.72a.75.75 0 1 0 1.06-1.06L11.06 10l4.72-4.72a.75.75 0 0 0-1.06-1.06L10 8.94 5.28 4.22Z" />
            </svg>
          </button>
        </div>
        {children ? (
          <div data-dialog-body className="min-h-0 overflow-y-auto px-5 py-2 sm:px-6">
            {children}
          </div>
        ) : null}
        {footer ? (
          <div
            data-dialog-footer
            className="flex flex-col-reverse gap-2 px-5 pt-4 pb-5 sm:flex-row sm:justify-end sm:px-6 [&>*]:w-full sm:[&>*]:w-auto"
          >
            {footer}
          </div>
        ) : (
          <div className="pb-3" />
        )}
      </div>
    </dialog>
  )
}

function returnFocus(openerRef: RefObject<HTMLElement | null>) {
  const opener = openerRef.current
  openerRef.current = null
  if (opener?.isConnected) opener.focus()
}

export type ConfirmDialogProps = {
  open: boolean
  onClose: () => void
  title: ReactNode
  message: ReactNode
  confirmLabel: string
  cancelLabel?: string
  /** For destructive or irreversible steps: a clay confirm button, and focus starts on Cancel. */
  danger?: boolean
  /**
   * Runs on confirm. While its promise is pending the buttons are busy and the dialog stays put;
   * once it resolves the dialog closes; if it rejects, the error's message shows in the dialog.
   */
  onConfirm: () => void | Promise<unknown>
}

/** Asks "are you sure?" before a step, e.g. cancelling an order or writing off bars. */
export function ConfirmDialog({
  open,
  onClose,
  title,
  message,
  confirmLabel,
  cancelLabel = 'Cancel',
  danger = false,
  onConfirm,
}: ConfirmDialogProps) {
  const [pending, setPending] = useState(false)
  const [error, setError] = useState<string | null>(null)
  const cancelRef = useRef<HTMLButtonElement>(null)
  const confirmRef = useRef<HTMLButtonElement>(null)

  function close() {
    setError(null)
    onClose()
  }

  async function confirm() {
    setPending(true)
    setError(null)
    try {
      await onConfirm()
      setPending(false)
      onClose()
    } catch (err) {
      setPending(false)
      setError(err instanceof Error && err.message ? err.message : 'That did not work. Please try again.')
    }
  }

  return (
    <Dialog
      open={open}
      onClose={close}
      title={title}
      description={message}
      size="sm"
      dismissible={!pending}
      initialFocusRef={danger ? cancelRef : confirmRef}
      footer={
        <>
          <Button ref={cancelRef} variant="secondary" onClick={close} disabled={pending}>
            {cancelLabel}
          </Button>
          <Button
            ref={confirmRef}
            variant={danger ? 'danger' : 'primary'}
            loading={pending}
            onClick={confirm}
          >
            {confirmLabel}
          </Button>
        </>
      }
    >
      {error ? <FormError message={error} className="mt-2" /> : null}
    </Dialog>
  )
}
