import { zodResolver } from '@hookform/resolvers/zod'
import { useEffect, useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { ApproveShopSchema } from '@shared/schemas/shops'
import type { ApproveShopInput, ShopAccount } from '@shared/schemas/shops'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useApproveShop, useTierOptions } from '@/features/shops/api/accounts'
import { TermsFields } from '@/features/shops/components/terms-fields'
import { applyApiErrors } from '@/lib/form-errors'

type FormIn = z.input<typeof ApproveShopSchema>
const FIELDS = ['tierId', 'paymentTerms', 'certificateExpiresOn', 'buyerName', 'buyerEmail']

const defaults = (shop: ShopAccount): FormIn => ({
  tierId: '',
  paymentTerms: 'prepay',
  certificateExpiresOn: shop.certificateExpiresOn ?? '',
  buyerName: shop.contactName,
  buyerEmail: shop.contactEmail,
})

/** Opens the account: tier, terms, the certificate's expiry, and who is invited as its first buyer. */
export function ApproveDialog({
  shop,
  open,
  onClose,
}: {
  shop: ShopAccount
  open: boolean
  onClose: () => void
}) {
  const approve = useApproveShop(shop.id)
  const tiers = useTierOptions()
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<FormIn, unknown, ApproveShopInput>({
    resolver: zodResolver(ApproveShopSchema),
    defaultValues: defaults(shop),
  })
  const { errors } = form.formState

  useEffect(() => {
    if (open) form.reset(defaults(shop))
    // Reset only when the dialog opens.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [open])

  const close = () => {
    setFormError(null)
    onClose()
  }
  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      const { buyer } = await approve.mutateAsync(values)
      toast.success(`${shop.tradingName} is open. Invitation sent to ${buyer.email}.`)
      close()
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, FIELDS))
    }
  })

  return (
    <Dialog
      open={open}
      onClose={close}
      title={`Approve ${shop.tradingName}`}
      description="The account opens at once; the buyer gets an e-mail with a link to set a password."
      dismissible={!approve.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={approve.isPending}>
            Cancel
          </Button>
          <Button type="submit" form="approve-form" loading={approve.isPending}>
            Approve and invite
          </Button>
        </>
      }
    >
      <form id="approve-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        {formError ? <FormError message={formError} /> : null}
        <div className="grid gap-4 sm:grid-cols-2">
          <TermsFields
            register={form.register}
            errors={errors}
            tiers={tiers.data ?? []}
            loading={tiers.isPending}
          />
        </div>
        <Field
          label="Certificate valid until"
          optional
          hint="From the certificate the shop sent; leave empty if it states no date."
          error={errors.certificateExpiresOn?.message}
        >
          <Input type="date" {...form.register('certificateExpiresOn')} />
        </Field>
        <fieldset className="flex flex-col gap-4">
          <legend className="mb-1 text-sm font-medium text-ink-900">First buyer</legend>
          <div className="grid gap-4 sm:grid-cols-2">
            <Field label="Buyer name" error={errors.buyerName?.message}>
              <Input autoComplete="off" {...form.register('buyerName')} />
            </Field>
            <Field label="Buyer e-mail" error={errors.buyerEmail?.message}>
              <Input type="email" autoComplete="off" {...form.register('buyerEmail')} />
            </Field>
          </div>
        </fieldset>
      </form>
    </Dialog>
  )
}
