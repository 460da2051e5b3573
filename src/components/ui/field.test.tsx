import { render, screen } from '@testing-library/react'
import userEvent from '@testing-library/user-event'
import { useForm } from 'react-hook-form'
import { describe, expect, it } from 'vitest'
import { Checkbox, Field, Input, Select, Textarea } from '@/components/ui/field'

describe('Field', () => {
  it('labels its input and describes it with the hint', () => {
    render(
      <Field label="PO number" hint="As printed on your purchase order">
        <Input />
      </Field>,
    )
    const input = screen.getByLabelText('PO number')
    expect(input.tagName).toBe('INPUT')
    expect(input).toHaveAccessibleDescription('As printed on your purchase order')
    expect(input).not.toHaveAttribute('aria-invalid')
  })

  it('marks the input invalid and adds the error to its description', () => {
    render(
      <Field label="Cases" hint="Whole cases only" error="Order at least one case">
        <Input type="number" />
      </Field>,
    )
    const input = screen.getByLabelText('Cases')
    expect(input).toHaveAttribute('aria-invalid', 'true')
    expect(input).toBeInvalid()
    expect(input).toHaveAccessibleDescription('Whole cases only Order at least one case')
    // Announced politely when it appears, not as an interrupting alert.
    expect(screen.getByText('Order at least one case').closest('[aria-live]')).toHaveAttribute(
      'aria-live',
      'polite',
    )
    expect(screen.queryByRole('alert')).not.toBeInTheDocument()
  })

  it('keeps an id and description the control already has', () => {
    render(
      <>
        <p id="extra">Shown on the invoice</p>
        <Field label="Note" error="Too long">
          <Textarea id="order-note" aria-describedby="extra" />
        </Field>
      </>,
    )
    const note = screen.getByLabelText('Note')
    expect(note).toHaveAttribute('id', 'order-note')
    expect(note).toHaveAccessibleDescription('Shown on the invoice Too long')
  })

  it('hands the wiring to a render function', () => {
    render(
      <Field label="Tier" error="Pick a tier">
        {(control) => (
          <Select {...control} defaultValue="">
            <option value="">Choose…</option>
            <option value="standard">Standard</option>
          </Select>
        )}
      </Field>,
    )
    const select = screen.getByLabelText('Tier')
    expect(select.tagName).toBe('SELECT')
    expect(select).toHaveAttribute('aria-invalid', 'true')
    expect(select).toHaveAccessibleDescription('Pick a tier')
  })

  it('works with react-hook-form: register reaches the input and focus goes to the first error', async () => {
    const user = userEvent.setup()
    let submitted: { email: string; exempt: boolean } | null = null

    function ShopForm() {
      const {
        register,
        handleSubmit,
        formState: { errors },
      } = useForm<{ email: string; exempt: boolean }>({ defaultValues: { email: '', exempt: false } })
      return (
        <form
          onSubmit={handleSubmit((values) => {
            submitted = values
          })}
        >
          <Field label="Buyer e-mail" error={errors.email?.message}>
            <Input type="email" {...register('email', { required: 'Enter the buyer’s e-mail' })} />
          </Field>
          <Checkbox label="Tax exempt" hint="Certificate on file" {...register('exempt')} />
          <button type="submit">Save</button>
        </form>
      )
    }

    render(<ShopForm />)
    await user.click(screen.getByRole('button', { name: 'Save' }))

    const email = screen.getByLabelText('Buyer e-mail')
    expect(await screen.findByText('Enter the buyer’s e-mail')).toBeInTheDocument()
    expect(email).toHaveAttribute('aria-invalid', 'true')
    expect(email).toHaveFocus()
    expect(submitted).toBeNull()

    await user.type(email, 'buyer@corner-shop.test')
    await user.click(screen.getByLabelText('Tax exempt'))
    await user.click(screen.getByRole('button', { name: 'Save' }))

    expect(submitted).toEqual({ email: 'buyer@corner-shop.test', exempt: true })
    expect(email).not.toHaveAttribute('aria-invalid')
    expect(screen.getByLabelText('Tax exempt')).toHaveAccessibleDescription('Certificate on file')
  })
})
