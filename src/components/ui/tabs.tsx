import { useId, useRef, useState } from 'react'
import type { KeyboardEvent, ReactNode } from 'react'
import { cn } from '@/lib/cn'

export type TabItem = {
  id: string
  label: ReactNode
  content: ReactNode
}

type TabsProps = {
  items: TabItem[]
  /** Names the tab list for screen readers ("Order sections"). */
  label: string
  /** Controlled selection; pair it with `onSelect`. */
  selectedId?: string
  defaultSelectedId?: string
  onSelect?: (id: string) => void
  className?: string
}

/**
 * Tabs that follow the ARIA tabs pattern: one tab in the Tab order, arrow keys (and Home/End) move
 * between tabs and select as they go. Hidden panels stay mounted so their form state survives.
 */
export function Tabs({ items, label, selectedId, defaultSelectedId, onSelect, className }: TabsProps) {
  const baseId = useId()
  const [ownSelected, setOwnSelected] = useState(defaultSelectedId ?? items[0]?.id)
  const requested = selectedId ?? ownSelected
  const current = items.some((item) => item.id === requested) ? requested : items[0]?.id
  const tabRefs = useRef(new Map<string, HTMLButtonElement>())

  const tabId = (id: string) => `${baseId}-tab-${id}`
  const panelId = (id: string) => `${baseId}-panel-${id}`

  function select(id: string) {
    if (selectedId === undefined) setOwnSelected(id)
    onSelect?.(id)
  }

  function onKeyDown(event: KeyboardEvent<HTMLDivElement>) {
    const index = items.findIndex((item) => item.id === current)
    if (index < 0 || items.length === 0) return
    let next: number
    switch (event.key) {
      case 'ArrowRight':
        next = (index + 1) % items.length
        break
      case 'ArrowLeft':
        next = (index - 1 + items.length) % items.length
        break
      case 'Home':
        next = 0
        break
      case 'End':
        next = items.length - 1
        break
      default:
        return
    }
    event.preventDefault()
    const target = items[next]
    if (!target) return
    select(target.id)
    tabRefs.current.get(target.id)?.focus()
  }

  return (
    <div className={className}>
      <div
        role="tablist"
        aria-label={label}
        onKeyDown={onKeyDown}
        className="flex gap-1 overflow-x-auto border-b border-cream-300 no-print"
      >
        {items.map((item) => {
          const isSelected = item.id === current
          return (
            <button
              key={item.id}
              ref={(el) => {
                if (el) tabRefs.current.set(item.id, el)
                else tabRefs.current.delete(item.id)
              }}
              type="button"
              role="tab"
              id={tabId(item.id)}
              aria-selected={isSelected}
              aria-controls={panelId(item.id)}
              tabIndex={isSelected ? 0 : -1}
              onClick={() => select(item.id)}
              className={cn(
                '-mb-px shrink-0 border-b-2 px-3 py-2.5 text-sm font-medium whitespace-nowrap transition-colors',
                'focus-visible:outline-offset-[-2px]',
                isSelected
                  ? 'border-olive-700 text-olive-800'
                  : 'border-transparent text-ink-700 hover:border-ink-300 hover:text-ink-900',
              )}
            >
              {item.label}
            </button>
          )
        })}
      </div>
      {items.map((item) => (
        <div
          key={item.id}
          role="tabpanel"
          id={panelId(item.id)}
          aria-labelledby={tabId(item.id)}
          hidden={item.id !== current}
          tabIndex={0}
          className="pt-5 focus-visible:outline-offset-4"
        >
          {item.content}
        </div>
      ))}
    </div>
  )
}
