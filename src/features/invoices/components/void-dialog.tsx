import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { VoidInvoiceSchema } from '@shared/schemas/invoices'
import type { InvoiceDto, VoidInvoiceInput } from '@shared/schemas/invoices'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useVoidInvoice } from '@/features/invoices/api/invoices'
import { applyApiErrors } from '@/lib/form-errors'

/** Voids an invoice: it stays on file, marked void, and a credit note of the same totals takes the next number. */
export function VoidDialog({
  invoice,
  open,
  onClose,
}: {
  invoice: InvoiceDto
  open: boolean
  onClose: () => void
}) {
  const voiding = useVoidInvoice(invoice.id)
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<VoidInvoiceInput>({
    resolver: zodResolver(VoidInvoiceSchema),
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
      const r = await voiding.mutateAsync(values)
      toast.success(`Invoice ${invoice.number} is void; credit note ${r.creditNote.number} issued.`)
      close()
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['reason']))
    }
  })
  return (
    <Dialog
      open={open}
      onClose={close}
      title={`Void invoice ${invoice.number}?`}
      description="The invoice stays on file with its number, marked void. A credit note for the same amount is issued and e-mailed to the shop. This cannot be undone."
      dismissible={!voiding.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={voiding.isPending}>
            Keep the invoice
          </Button>
          <Button type="submit" form="void-form" variant="danger" loading={voiding.isPending}>
            Void and issue credit note
          </Button>
        </>
      }
    >
      <form id="void-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        {formError ? <FormError message={formError} /> : null}
        <Field
          label="Reason"
          hint="Kept with the invoice and shown on it."
          error={form.formState.errors.reason?.message}
        >
          <Textarea rows={3} {...form.register('reason')} />
        </Field>
      </form>
    </Dialog>
  )
}
