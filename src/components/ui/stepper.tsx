import { useEffect, useState } from 'react'
import { cn } from '@/lib/cn'

type StepperProps = {
  /** The whole number shown; the stepper never goes below `min` or above `max`. */
  value: number
  onChange: (value: number) => void
  min?: number
  max?: number
  /** Names the number for assistive technology ("Cases of Lavender Field"). */
  label: string
  /** What one step is, for the buttons' names: "case" → "One case fewer", "One case more". */
  unit?: string
  id?: string
  disabled?: boolean
  'aria-describedby'?: string
  'aria-invalid'?: true
  className?: string
}

const button =
  'inline-flex size-10 shrink-0 items-center justify-center text-lg font-medium text-ink-800 hover:bg-cream-200 ' +
  'disabled:cursor-not-allowed disabled:opacity-40 disabled:hover:bg-transparent sm:size-9'

/**
 * A whole-number field with − and + buttons on either side. Typing is allowed too; what is typed
 * counts once it is a whole number in range (on blur it snaps back to the last good value).
 */
export function Stepper({
  value,
  onChange,
  min = 1,
  max = 10000,
  label,
  unit = 'step',
  id,
  disabled,
  className,
  ...aria
}: StepperProps) {
  const [text, setText] = useState(String(value))
  useEffect(() => setText(String(value)), [value])
  const set = (n: number) => {
    const clamped = Math.min(max, Math.max(min, n))
    setText(String(clamped))
    if (clamped !== value) onChange(clamped)
  }
  return (
    <div
      className={cn(
        'inline-flex h-10 items-stretch overflow-hidden rounded-md border border-ink-400 bg-white shadow-sm sm:h-9',
        'focus-within:border-olive-600',
        className,
      )}
    >
      <button
        type="button"
        className={button}
        aria-label={`One ${unit} fewer`}
        onClick={() => set(value - 1)}
        disabled={disabled || value <= min}
      >
        −
      </button>
      <input
        id={id}
        type="text"
        inputMode="numeric"
        pattern="[0-9]*"
        aria-label={label}
        value={text}
        disabled={disabled}
        aria-describedby={aria['aria-describedby']}
        aria-invalid={aria['aria-invalid']}
        onChange={(e) => {
          const t = e.target.value.replace(/[^0-9]/g, '')
          setText(t)
          const n = Number(t)
          if (t !== '' && Number.isSafeInteger(n) && n >= min && n <= max) onChange(n)
        }}
        onBlur={() => setText(String(value))}
        onKeyDown={(e) => {
          if (e.key === 'ArrowUp') {
            e.preventDefault()
            set(value + 1)
          } else if (e.key === 'ArrowDown') {
            e.preventDefault()
            set(value - 1)
          }
        }}
        className="w-12 min-w-0 border-x border-cream-300 text-center text-base text-ink-900 tabular-nums outline-none sm:text-sm"
      />
      <button
        type="button"
        className={button}
        aria-label={`One ${unit} more`}
        onClick={() => set(value + 1)}
        disabled={disabled || value >= max}
      >
        +
      </button>
    </div>
  )
}
