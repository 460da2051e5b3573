import { Children, cloneElement, forwardRef, isValidElement, useId } from 'react'
import type {
  InputHTMLAttributes,
  ReactElement,
  ReactNode,
  SelectHTMLAttributes,
  TextareaHTMLAttributes,
} from 'react'
import { cn } from '@/lib/cn'

/** What a `Field` hands to its control so the label, hint and error belong to it. */
export type FieldControlProps = {
  id: string
  'aria-describedby'?: string
  'aria-invalid'?: true
  'aria-required'?: true
}

type FieldProps = {
  label: ReactNode
  hint?: ReactNode
  /** The field's error message, e.g. react-hook-form's `errors.email?.message`. */
  error?: string | null
  /** Marks the control as required for assistive technology (validation stays with the form's schema). */
  required?: boolean
  /** Shows "(optional)" after the label: the calmer way to say which fields may stay empty. */
  optional?: boolean
  /** The control's id; by default one is made up. An `id` already on the child wins. */
  id?: string
  className?: string
  /** A single control element (`<Input {...register('name')} />`) or a render function for anything else. */
  children: ReactElement<Partial<FieldControlProps>> | ((control: FieldControlProps) => ReactNode)
}

function joinIds(...ids: Array<string | null | undefined | false>): string | undefined {
  const joined = ids.filter(Boolean).join(' ')
  return joined || undefined
}

/** A labelled form control with an optional hint and error message, wired for assistive technology. */
export function Field({ label, hint, error, required, optional, id, className, children }: FieldProps) {
  const autoId = useId()
  const child = typeof children === 'function' ? null : Children.only(children)
  const childProps = child && isValidElement(child) ? child.props : {}
  const controlId = childProps.id ?? id ?? `field${autoId}`
  const hintId = `${controlId}-hint`
  const errorId = `${controlId}-error`

  const control: FieldControlProps = {
    id: controlId,
    'aria-describedby': joinIds(childProps['aria-describedby'], hint != null && hintId, error && errorId),
    ...(error ? { 'aria-invalid': true as const } : {}),
    ...(required ? { 'aria-required': true as const } : {}),
  }

  return (
    <div className={cn('flex flex-col gap-1.5', className)}>
      <label htmlFor={controlId} className="text-sm font-medium text-ink-800">
        {label}
        {optional ? <span className="ml-1 font-normal text-ink-600">(optional)</span> : null}
      </label>
      {typeof children === 'function' ? children(control) : child ? cloneElement(child, control) : null}
      {hint != null ? (
        <p id={hintId} className="text-sm text-ink-600">
          {hint}
        </p>
      ) : null}
      <FieldError id={errorId} message={error} />
    </div>
  )
}

/**
 * The error line under a control. Its live region stays in the page while empty, so a message that
 * appears later is announced (politely, after whatever is being read).
 */
function FieldError({ id, message }: { id: string; message?: string | null }) {
  return (
    <div aria-live="polite">
      {message ? (
        <p id={id} className="flex items-start gap-1.5 text-sm text-clay-700">
          <svg aria-hidden="true" viewBox="0 0 16 16" className="mt-0.5 size-4 shrink-0 fill-current">
            <path d="M8 1.5a6.5 6.5 0 1 0 0 13 6.5 6.5 0 0 0 0-13Zm-.75 3.25h1.5v4.5h-1.5v-4.5Zm0 5.75h1.5V12h-1.5v-1.5Z" />
          </svg>
          <span>{message}</span>
        </p>
      ) : null}
    </div>
  )
}

const controlBase =
  'block w-full min-w-0 rounded-md border border-ink-400 bg-white text-base text-ink-900 shadow-sm ' +
  'placeholder:text-ink-500 hover:border-ink-500 focus-visible:border-olive-600 ' +
  'disabled:cursor-not-allowed disabled:bg-cream-200 disabled:text-ink-600 ' +
  'read-only:bg-cream-50 aria-invalid:border-clay-600 sm:text-sm'

export type InputProps = InputHTMLAttributes<HTMLInputElement>

export const Input = forwardRef<HTMLInputElement, InputProps>(function Input(
  { className, type = 'text', ...rest },
  ref,
) {
  return <input ref={ref} type={type} className={cn(controlBase, 'h-10 px-3', className)} {...rest} />
})

export type TextareaProps = TextareaHTMLAttributes<HTMLTextAreaElement>

export const Textarea = forwardRef<HTMLTextAreaElement, TextareaProps>(function Textarea(
  { className, rows = 3, ...rest },
  ref,
) {
  return (
    <textarea ref={ref} rows={rows} className={cn(controlBase, 'resize-y px-3 py-2', className)} {...rest} />
  )
})

export type SelectProps = SelectHTMLAttributes<HTMLSelectElement> & {
  /** Classes for the wrapper, which sets the width (the select fills it). */
  className?: string
}

/** A native select with our border and chevron; options are its children. */
export const Select = forwardRef<HTMLSelectElement, SelectProps>(function Select(
  { className, children, ...rest },
  ref,
) {
  return (
    <div className={cn('relative', className)}>
      <select ref={ref} className={cn(controlBase, 'h-10 appearance-none pr-9 pl-3')} {...rest}>
        {children}
      </select>
      <svg
        aria-hidden="true"
        viewBox="0 0 16 16"
        className="pointer-events-none absolute top-1/2 right-3 size-4 -translate-y-1/2 fill-current text-ink-600"
      >
        <path d="M4.2 6.2a.75.75 0 0 1 1.06 0L8 8.94l2.74-2.74a.75.75 0 1 1 1.06 1.06L8.53 10.53a.75.75 0 0 1-1.06 0L4.2 7.26a.75.75 0 0 1 0-1.06Z" />
      </svg>
    </div>
  )
})

export type CheckboxProps = Omit<InputHTMLAttributes<HTMLInputElement>, 'type'> & {
  label: ReactNode
  hint?: ReactNode
  error?: string | null
}

/** A checkbox with its label beside it (and optional hint and error below), for yes/no settings. */
export const Checkbox = forwardRef<HTMLInputElement, CheckboxProps>(function Checkbox(
  { label, hint, error, id, className, 'aria-describedby': describedBy, ...rest },
  ref,
) {
  const autoId = useId()
  const controlId = id ?? `checkbox${autoId}`
  const hintId = `${controlId}-hint`
  const errorId = `${controlId}-error`
  return (
    <div className={cn('flex flex-col gap-1', className)}>
      <div className="flex items-start gap-2.5">
        <input
          ref={ref}
          type="checkbox"
          id={controlId}
          aria-describedby={joinIds(describedBy, hint != null && hintId, error && errorId)}
          aria-invalid={error ? true : undefined}
          className="mt-0.5 size-5 shrink-0 cursor-pointer accent-olive-700 disabled:cursor-not-allowed sm:size-4"
          {...rest}
        />
        <label htmlFor={controlId} className="cursor-pointer text-sm text-ink-800">
          {label}
        </label>
      </div>
      {hint != null ? (
        <p id={hintId} className="pl-7.5 text-sm text-ink-600 sm:pl-6.5">
          {hint}
        </p>
      ) : null}
      <div className="pl-7.5 sm:pl-6.5">
        <FieldError id={errorId} message={error} />
      </div>
    </div>
  )
})
