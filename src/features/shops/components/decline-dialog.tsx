import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { DeclineShopSchema } from '@shared/schemas/shops'
import type { DeclineShopInput, ShopAccount } from '@shared/schemas/shops'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useDeclineShop } from '@/features/shops/api/accounts'
import { applyApiErrors } from '@/lib/form-errors'

/** Declines an application; the reason is e-mailed to the applicant as written. */
export function DeclineDialog({
  shop,
  open,
  onClose,
}: {
  shop: ShopAccount
  open: boolean
  onClose: () => void
}) {
  const decline = useDeclineShop(shop.id)
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<DeclineShopInput>({
    resolver: zodResolver(DeclineShopSchema),
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
      await decline.mutateAsync(values)
      toast.success(
        `The application from ${shop.tradingName} is declined; ${shop.contactEmail} has the reason.`,
      )
      close()
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['reason']))
    }
  })

  return (
    <Dialog
      open={open}
      onClose={close}
      title={`Decline ${shop.tradingName}?`}
      description={`${shop.contactName} receives your reason by e-mail.`}
      dismissible={!decline.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={decline.isPending}>
            Cancel
          </Button>
          <Button type="submit" form="decline-form" variant="danger" loading={decline.isPending}>
            Decline application
          </Button>
        </>
      }
    >
      <form id="decline-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        {formError ? <FormError message={formError} /> : null}
        <Field
          label="Reason"
          hint="Written to the applicant: kind and clear."
          error={form.formState.errors.reason?.message}
        >
          <Textarea rows={4} {...form.register('reason')} />
        </Field>
      </form>
    </Dialog>
  )
}
