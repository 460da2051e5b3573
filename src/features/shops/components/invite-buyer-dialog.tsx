import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { InviteBuyerSchema } from '@shared/schemas/shops'
import type { InviteBuyerInput, ShopAccount } from '@shared/schemas/shops'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useInviteBuyer } from '@/features/shops/api/accounts'
import { applyApiErrors } from '@/lib/form-errors'

export function InviteBuyerDialog({
  shop,
  open,
  onClose,
}: {
  shop: ShopAccount
  open: boolean
  onClose: () => void
}) {
  const invite = useInviteBuyer(shop.id)
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<InviteBuyerInput>({
    resolver: zodResolver(InviteBuyerSchema),
    defaultValues: { name: '', email: '' },
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
      const { buyer } = await invite.mutateAsync(values)
      toast.success(`Invitation sent to ${buyer.email}.`)
      close()
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['name', 'email']))
    }
  })

  return (
    <Dialog
      open={open}
      onClose={close}
      title="Invite another buyer"
      description={`They can order for ${shop.tradingName} once they set a password from the e-mail.`}
      dismissible={!invite.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={invite.isPending}>
            Cancel
          </Button>
          <Button type="submit" form="invite-buyer-form" loading={invite.isPending}>
            Send invitation
          </Button>
        </>
      }
    >
      <form id="invite-buyer-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        {formError ? <FormError message={formError} /> : null}
        <Field label="Name" error={errors.name?.message}>
          <Input autoComplete="off" {...form.register('name')} />
        </Field>
        <Field label="E-mail" error={errors.email?.message}>
          <Input type="email" autoComplete="off" {...form.register('email')} />
        </Field>
      </form>
    </Dialog>
  )
}
