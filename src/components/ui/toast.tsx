import { createContext, useCallback, useContext, useEffect, useMemo, useRef, useState } from 'react'
import type { FocusEvent, ReactNode } from 'react'
import { cn } from '@/lib/cn'

export type ToastTone = 'success' | 'error' | 'info'
export type ToastMessage = { tone: ToastTone; message: string }

type Listener = (toast: ToastMessage) => void

/** How long a toast stays, unless the pointer or focus is on the toasts. */
export const TOAST_DURATION_MS = 6000
const MAX_VISIBLE = 4
const MAX_BACKLOG = 10

const listeners = new Set<Listener>()
let backlog: ToastMessage[] = []

/**
 * The channel between code outside React (the api client) and the `ToastProvider`. Messages sent
 * before a provider has mounted wait, a few at most, and show once it subscribes.
 */
export const toastBus = {
  emit(toast: ToastMessage): void {
    if (listeners.size === 0) {
      backlog = [...backlog, toast].slice(-MAX_BACKLOG)
      return
    }
    for (const listener of listeners) listener(toast)
  },
  subscribe(listener: Listener): () => void {
    listeners.add(listener)
    const waiting = backlog
    backlog = []
    for (const toast of waiting) listener(toast)
    return () => {
      listeners.delete(listener)
    }
  },
}

export type ToastApi = {
  success: (message: string) => void
  error: (message: string) => void
  info: (message: string) => void
}

/** For non-React code: `toast.error('The server is not answering.')`. */
export const toast: ToastApi = {
  success: (message) => toastBus.emit({ tone: 'success', message }),
  error: (message) => toastBus.emit({ tone: 'error', message }),
  info: (message) => toastBus.emit({ tone: 'info', message }),
}

const ToastContext = createContext<ToastApi | null>(null)

/** Inside components: `const notify = useToast(); notify.success('Order placed')`. */
export function useToast(): ToastApi {
  const api = useContext(ToastContext)
  if (!api) throw new Error('useToast must be used inside a ToastProvider')
  return api
}

type ShownToast = ToastMessage & { id: number; shownAt: number }

let nextId = 1

export function ToastProvider({ children }: { children: ReactNode }) {
  const [toasts, setToasts] = useState<ShownToast[]>([])
  const [hovered, setHovered] = useState(false)
  const [focused, setFocused] = useState(false)
  const regionRef = useRef<HTMLElement>(null)

  const push = useCallback((incoming: ToastMessage) => {
    const shownAt = nextId++
    setToasts((list) => {
      // The same message again (say, several requests failing together) refreshes one toast.
      const same = list.find((t) => t.tone === incoming.tone && t.message === incoming.message)
      if (same) return list.map((t) => (t === same ? { ...t, shownAt } : t))
      return [...list, { ...incoming, id: shownAt, shownAt }].slice(-MAX_VISIBLE)
    })
  }, [])

  const dismiss = useCallback((id: number) => {
    setToasts((list) => list.filter((t) => t.id !== id))
  }, [])

  useEffect(() => toastBus.subscribe(push), [push])

  // A removed toast fires no mouseleave or blur, so the pause would outlive it: recheck whenever
  // the list changes.
  useEffect(() => {
    if (toasts.length === 0) setHovered(false)
    if (!regionRef.current?.contains(document.activeElement)) setFocused(false)
  }, [toasts])

  const api = useMemo<ToastApi>(
    () => ({
      success: (message) => push({ tone: 'success', message }),
      error: (message) => push({ tone: 'error', message }),
      info: (message) => push({ tone: 'info', message }),
    }),
    [push],
  )

  function onBlur(event: FocusEvent<HTMLElement>) {
    if (!event.currentTarget.contains(event.relatedTarget)) setFocused(false)
  }

  return (
    <ToastContext.Provider value={api}>
      {children}
      <section
        ref={regionRef}
        aria-label="Notifications"
        onMouseEnter={() => setHovered(true)}
        onMouseLeave={() => setHovered(false)}
        onFocus={() => setFocused(true)}
        onBlur={onBlur}
        className="pointer-events-none fixed inset-x-0 bottom-0 z-50 p-3 sm:inset-x-auto sm:right-0 sm:w-96 sm:p-4 no-print"
      >
        <ol aria-live="polite" className="flex flex-col gap-2">
          {toasts.map((t) => (
            <ToastItem key={t.id} toast={t} paused={hovered || focused} onDismiss={dismiss} />
          ))}
        </ol>
      </section>
    </ToastContext.Provider>
  )
}

const toneStyles: Record<ToastTone, { bar: string; icon: string; word: string; path: string }> = {
  success: {
    bar: 'bg-olive-600',
    icon: 'text-olive-700',
    word: 'Done:',
    path: 'M10 2a8 8 0 1 0 0 16 8 8 0 0 0 0-16Zm3.7 6.2-4.5 4.5a.75.75 0 0 1-1.06 0l-2-2a.75.75 0 1 1 1.06-1.06l1.47 1.47 3.97-3.97a.75.75 0 1 1 1.06 1.06Z',
  },
  error: {
    bar: 'bg-clay-600',
    icon: 'text-clay-600',
    word: 'Problem:',
    path: 'M10 2a8 8 0 1 0 0 16 8 8 0 0 0 0-16Zm-.9 4h1.8v5.5H9.1V6Zm0 7h1.8v1.8H9.1V13Z',
  },
  info: {
    bar: 'bg-sky-600',
    icon: 'text-sky-700',
    word: 'Note:',
    path: 'M10 2a8 8 0 1 0 0 16 8 8 0 0 0 0-16Zm.9 12.5H9.1V9h1.8v5.5ZM10 7.6a1.1 1.1 0 1 1 0-2.2 1.1 1.1 0 0 1 0 2.2Z',
  },
}

function ToastItem({
  toast,
  paused,
  onDismiss,
}: {
  toast: ShownToast
  paused: boolean
  onDismiss: (id: number) => void
}) {
  const style = toneStyles[toast.tone]
  const dismissRef = useRef(onDismiss)
  useEffect(() => {
    dismissRef.current = onDismiss
  })

  useEffect(() => {
    if (paused) return
    const timer = setTimeout(() => dismissRef.current(toast.id), TOAST_DURATION_MS)
    return () => clearTimeout(timer)
  }, [paused, toast.id, toast.shownAt])

  return (
    <li className="pointer-events-auto relative flex items-start gap-3 overflow-hidden rounded-card bg-white py-3 pr-2 pl-4 shadow-lg ring-1 ring-cream-300">
      <span aria-hidden="true" className={cn('absolute inset-y-0 left-0 w-1', style.bar)} />
      <svg
        aria-hidden="true"
        viewBox="0 0 20 20"
        className={cn('mt-0.5 size-5 shrink-0 fill-current', style.icon)}
      >
        <path d={style.path} />
      </svg>
      <p className="min-w-0 flex-1 py-0.5 text-sm text-ink-800">
        <span className="sr-only">{style.word} </span>
        {toast.message}
      </p>
      <button
        type="button"
        aria-label="Dismiss notification"
        onClick={() => onDismiss(toast.id)}
        className="shrink-0 rounded-md p-1.5 text-ink-600 hover:bg-cream-200 hover:text-ink-900"
      >
        <svg aria-hidden="true" viewBox="0 0 20 20" className="size-4 fill-current">
          <path d="M5.28 4.22a.75.75 0 0 0-1.06 1.06L8.94 10l-4.72 4.72a.75.75 0 1 0 1.06 1.06L10 11.06l4.72 4.72a.75.75 0 1 0 1.06-1.06L11.06 10l4.72-4.72a.75.75 0 0 0-1.06-1.06L10 8.94 5.28 4.22Z" />
        </svg>
      </button>
    </li>
  )
}
