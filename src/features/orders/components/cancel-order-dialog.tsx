import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { CancelOrderSchema } from '@shared/schemas/orders'
import type { OrderDto } from '@shared/schemas/orders'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useCancelOrder } from '@/features/orders/api/orders'
import { applyApiErrors } from '@/lib/form-errors'

type FormIn = z.input<typeof CancelOrderSchema>
type FormOut = z.output<typeof CancelOrderSchema>

/** Cancelling gives every bar the order holds back to stock; the shop and the studio are e-mailed. */
export function CancelOrderDialog({
  order,
  open,
  onClose,
}: {
  order: OrderDto
  open: boolean
  onClose: () => void
}) {
  const cancel = useCancelOrder(order.id)
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(CancelOrderSchema),
    defaultValues: { reason: '' },
  })
  const close = () => {
    form.reset()
    setFormError(null)
    onClose()
  }
  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      await cancel.mutateAsync(values)
      toast.success(`Order ${order.number} is cancelled.`)
      close()
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['reason']))
    }
  })
  return (
    <Dialog
      open={open}
      onClose={close}
      title={`Cancel order ${order.number}?`}
      description="Its bars go back to stock at once, and nothing is packed or invoiced for it. This cannot be undone."
      dismissible={!cancel.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={cancel.isPending}>
            Keep the order
          </Button>
          <Button type="submit" form={`cancel-${order.id}`} variant="danger" loading={cancel.isPending}>
            Cancel the order
          </Button>
        </>
      }
    >
      <form id={`cancel-${order.id}`} onSubmit={submit} noValidate className="flex flex-col gap-4">
        {formError ? <FormError message={formError} /> : null}
        <Field
          label="Reason"
          optional
          hint="Shown on the order and in the e-mail."
          error={form.formState.errors.reason?.message}
        >
          <Textarea rows={3} {...form.register('reason')} />
        </Field>
      </form>
    </Dialog>
  )
}
