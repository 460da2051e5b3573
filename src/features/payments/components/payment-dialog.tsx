import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { formatCents } from '@shared/domain/money/money'
import { PAYMENT_METHODS, PAYMENT_METHOD_LABELS, PaymentFormSchema } from '@shared/schemas/payments'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Input, Select } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useRecordPayment } from '@/features/payments/api/payments'
import { ApiError } from '@/lib/api-client'
import { applyApiErrors } from '@/lib/form-errors'

type FormIn = z.input<typeof PaymentFormSchema>
type FormOut = z.output<typeof PaymentFormSchema>

/** Money received against an invoice, whole or part; more than is owed is refused. Mount it when it opens. */
export function PaymentDialog({
  invoice,
  today,
  open,
  onClose,
  onRecorded,
}: {
  invoice: { id: number; number: string; outstandingCents: number; currency: string }
  today: string
  open: boolean
  onClose: () => void
  onRecorded: () => void
}) {
  const record = useRecordPayment(invoice.id)
  const [formError, setFormError] = useState<string | null>(null)
  const owed = (invoice.outstandingCents / 100).toFixed(2)
  const form = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(PaymentFormSchema),
    defaultValues: { method: 'bank_transfer', amount: owed, receivedOn: today, reference: '' },
  })
  const { errors } = form.formState
  const close = () => {
    form.reset()
    setFormError(null)
    onClose()
  }
  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      await record.mutateAsync(values)
      toast.success(
        `${formatCents(values.amountCents, invoice.currency)} recorded against ${invoice.number}.`,
      )
      onRecorded()
      close()
    } catch (err) {
      // The API names amountCents; the form calls it amount.
      if (err instanceof ApiError) {
        const amount = err.fieldErrors.find((d) => d.field === 'amountCents')
        if (amount) form.setError('amount', { type: 'server', message: amount.message })
      }
      setFormError(applyApiErrors(err, form.setError, ['method', 'receivedOn', 'reference', 'amountCents']))
    }
  })
  return (
    <Dialog
      open={open}
      onClose={close}
      title={`Record a payment on ${invoice.number}`}
      description={`${formatCents(invoice.outstandingCents, invoice.currency)} is still owed.`}
      dismissible={!record.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={record.isPending}>
            Cancel
          </Button>
          <Button type="submit" form="payment-form" loading={record.isPending}>
            Record payment
          </Button>
        </>
      }
    >
      <form id="payment-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        {formError && !errors.amount ? <FormError message={formError} /> : null}
        <Field
          label="Amount"
          hint="Whole or part of what is owed, e.g. 125.50"
          error={errors.amount?.message}
        >
          <Input inputMode="decimal" autoComplete="off" {...form.register('amount')} />
        </Field>
        <Field label="Method" error={errors.method?.message}>
          <Select {...form.register('method')}>
            {PAYMENT_METHODS.map((m) => (
              <option key={m} value={m}>
                {PAYMENT_METHOD_LABELS[m]}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Received on" error={errors.receivedOn?.message}>
          <Input type="date" max={today} {...form.register('receivedOn')} />
        </Field>
        <Field
          label="Reference"
          optional
          hint="Cheque number, transfer reference…"
          error={errors.reference?.message}
        >
          <Input autoComplete="off" {...form.register('reference')} />
        </Field>
      </form>
    </Dialog>
  )
}
