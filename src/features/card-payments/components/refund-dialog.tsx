import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { formatCents } from '@shared/domain/money/money'
import { RefundFormSchema } from '@shared/schemas/card-payments'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useRefundPayment } from '@/features/card-payments/api/card-payments'
import { ApiError } from '@/lib/api-client'
import { applyApiErrors } from '@/lib/form-errors'

type FormIn = z.input<typeof RefundFormSchema>
type FormOut = z.output<typeof RefundFormSchema>

/** Gives back all or part of a card payment through the card service. Mount it when it opens. */
export function RefundDialog({
  payment,
  invoiceNumber,
  currency,
  onClose,
  onRefunded,
}: {
  payment: { id: number; amountCents: number; refundedCents: number; receivedOn: string }
  invoiceNumber: string
  currency: string
  onClose: () => void
  onRefunded: () => void
}) {
  const refund = useRefundPayment(payment.id)
  const [formError, setFormError] = useState<string | null>(null)
  const left = payment.amountCents - payment.refundedCents
  const form = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(RefundFormSchema),
    defaultValues: { amount: (left / 100).toFixed(2), reason: '' },
  })
  const { errors } = form.formState
  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      await refund.mutateAsync(values)
      toast.success(`${formatCents(values.amountCents, currency)} refunded to the card (${invoiceNumber}).`)
      onRefunded()
      onClose()
    } catch (err) {
      // The API names amountCents; the form calls it amount.
      if (err instanceof ApiError) {
        const amount = err.fieldErrors.find((d) => d.field === 'amountCents')
        if (amount) form.setError('amount', { type: 'server', message: amount.message })
      }
      setFormError(applyApiErrors(err, form.setError, ['reason', 'amountCents']))
    }
  })
  return (
    <Dialog
      open
      onClose={onClose}
      title={`Refund a card payment on ${invoiceNumber}`}
      description={`${formatCents(payment.amountCents, currency)} paid by card${
        payment.refundedCents ? `, ${formatCents(payment.refundedCents, currency)} refunded already` : ''
      }: up to ${formatCents(left, currency)} can go back to the card.`}
      dismissible={!refund.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={onClose} disabled={refund.isPending}>
            Cancel
          </Button>
          <Button type="submit" form="refund-form" variant="danger" loading={refund.isPending}>
            Refund to card
          </Button>
        </>
      }
    >
      <form id="refund-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        {formError && !errors.amount ? <FormError message={formError} /> : null}
        <Field label="Amount to refund" hint="Whole or part, e.g. 25.00" error={errors.amount?.message}>
          <Input inputMode="decimal" autoComplete="off" {...form.register('amount')} />
        </Field>
        <Field
          label="Reason"
          optional
          hint="Kept with the refund and shown in the export"
          error={errors.reason?.message}
        >
          <Input autoComplete="off" {...form.register('reason')} />
        </Field>
        <p className="text-sm text-ink-700">
          The invoice owes the refunded amount again, and the shop gets an e-mail saying so.
        </p>
      </form>
    </Dialog>
  )
}
