import { forwardRef } from 'react'
import type { ButtonHTMLAttributes } from 'react'
import { Link } from 'react-router-dom'
import type { LinkProps } from 'react-router-dom'
import { cn } from '@/lib/cn'
import { Spinner } from '@/components/ui/spinner'

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'ghost'
export type ButtonSize = 'sm' | 'md'

const base =
  'inline-flex shrink-0 items-center justify-center gap-2 rounded-md font-medium whitespace-nowrap no-underline ' +
  'transition-colors select-none disabled:cursor-not-allowed disabled:opacity-60 ' +
  'aria-disabled:cursor-not-allowed aria-disabled:opacity-60'

const variants: Record<ButtonVariant, string> = {
  primary:
    'bg-olive-700 text-white shadow-sm hover:bg-olive-800 active:bg-olive-900 disabled:hover:bg-olive-700',
  secondary:
    'border border-ink-300 bg-white text-ink-800 shadow-sm hover:border-ink-400 hover:bg-cream-50 ' +
    'active:bg-cream-200 disabled:hover:bg-white',
  danger: 'bg-clay-600 text-white shadow-sm hover:bg-clay-700 active:bg-clay-700 disabled:hover:bg-clay-600',
  ghost: 'text-olive-800 hover:bg-olive-50 active:bg-olive-100 disabled:hover:bg-transparent',
}

const sizes: Record<ButtonSize, string> = {
  sm: 'h-8 px-3 text-sm',
  md: 'h-10 px-4 text-sm',
}

/** The classes of a button, for the odd element that must look like one (a file input's label). */
export function buttonClasses(
  variant: ButtonVariant = 'primary',
  size: ButtonSize = 'md',
  className?: string,
) {
  return cn(base, variants[variant], sizes[size], className)
}

export type ButtonProps = ButtonHTMLAttributes<HTMLButtonElement> & {
  variant?: ButtonVariant
  size?: ButtonSize
  /** Shows a spinner, disables the button and marks it busy while an action runs. */
  loading?: boolean
}

/**
 * A button. `type` defaults to "button": a form's submit button says `type="submit"`, so that no
 * other button in the form submits it by accident.
 */
export const Button = forwardRef<HTMLButtonElement, ButtonProps>(function Button(
  {
    variant = 'primary',
    size = 'md',
    loading = false,
    disabled,
    type = 'button',
    className,
    children,
    ...rest
  },
  ref,
) {
  return (
    <button
      ref={ref}
      type={type}
      disabled={disabled || loading}
      aria-busy={loading || undefined}
      className={buttonClasses(variant, size, className)}
      {...rest}
    >
      {loading ? <Spinner size="sm" /> : null}
      {children}
    </button>
  )
})

export type LinkButtonProps = LinkProps & {
  variant?: ButtonVariant
  size?: ButtonSize
}

/** A router link that looks like a button, for actions that go somewhere ("New order"). */
export const LinkButton = forwardRef<HTMLAnchorElement, LinkButtonProps>(function LinkButton(
  { variant = 'primary', size = 'md', className, ...rest },
  ref,
) {
  return <Link ref={ref} className={buttonClasses(variant, size, className)} {...rest} />
})
