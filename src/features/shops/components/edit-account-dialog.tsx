import { zodResolver } from '@hookform/resolvers/zod'
import { useEffect, useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { STORE_TYPES, ShopUpdateSchema } from '@shared/schemas/shops'
import type { ShopAccount, ShopUpdateInput } from '@shared/schemas/shops'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Input, Select, Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useTierOptions, useUpdateShop } from '@/features/shops/api/accounts'
import { ADDRESS_FIELD_NAMES, AddressFields } from '@/features/shops/components/address-fields'
import { TermsFields } from '@/features/shops/components/terms-fields'
import { applyApiErrors } from '@/lib/form-errors'

type FormIn = z.input<typeof ShopUpdateSchema>

const FIELDS = [
  'tierId',
  'paymentTerms',
  'notes',
  'certificateExpiresOn',
  'legalName',
  'tradingName',
  'contactName',
  'contactEmail',
  'contactPhone',
  'taxId',
  'storeType',
  'website',
  ...ADDRESS_FIELD_NAMES('billingAddress'),
  ...ADDRESS_FIELD_NAMES('shippingAddress'),
]

function defaults(shop: ShopAccount, isOpen: boolean): FormIn {
  return {
    ...(isOpen ? { tierId: shop.tierId ?? '', paymentTerms: shop.paymentTerms } : {}),
    notes: shop.notes ?? '',
    certificateExpiresOn: shop.certificateExpiresOn ?? '',
    legalName: shop.legalName,
    tradingName: shop.tradingName,
    contactName: shop.contactName,
    contactEmail: shop.contactEmail,
    contactPhone: shop.contactPhone ?? '',
    taxId: shop.taxId ?? '',
    storeType: (STORE_TYPES as readonly string[]).includes(shop.storeType ?? '')
      ? (shop.storeType as (typeof STORE_TYPES)[number])
      : 'Other',
    website: shop.website ?? '',
    billingAddress: shop.billingAddress,
    shippingAddress: shop.shippingAddress,
  }
}

/** Edits an account's terms, tier, names, contact, addresses and notes in one form. */
export function EditAccountDialog({
  shop,
  open,
  onClose,
}: {
  shop: ShopAccount
  open: boolean
  onClose: () => void
}) {
  const update = useUpdateShop(shop.id)
  const tiers = useTierOptions()
  const isOpen = shop.status === 'active' || shop.status === 'on_hold' || shop.status === 'closed'
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<FormIn, unknown, ShopUpdateInput>({
    resolver: zodResolver(ShopUpdateSchema),
    defaultValues: defaults(shop, isOpen),
  })
  const { errors } = form.formState

  useEffect(() => {
    if (open) form.reset(defaults(shop, isOpen))
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
      await update.mutateAsync(values)
      toast.success(`${values.tradingName ?? shop.tradingName} is saved.`)
      close()
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, FIELDS))
    }
  })

  return (
    <Dialog
      open={open}
      onClose={close}
      title={`Edit ${shop.tradingName}`}
      size="lg"
      dismissible={!update.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={update.isPending}>
            Cancel
          </Button>
          <Button type="submit" form="edit-account-form" loading={update.isPending}>
            Save changes
          </Button>
        </>
      }
    >
      <form id="edit-account-form" onSubmit={submit} noValidate className="flex flex-col gap-6 pb-2">
        {formError ? <FormError message={formError} /> : null}
        {isOpen ? (
          <fieldset className="grid gap-4 sm:grid-cols-2">
            <legend className="mb-1 text-base font-medium text-ink-900">Terms</legend>
            <TermsFields register={form.register} errors={errors} tiers={tiers.data ?? []} />
          </fieldset>
        ) : null}
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-1 text-base font-medium text-ink-900">Business</legend>
          <Field label="Shop name" error={errors.tradingName?.message}>
            <Input {...form.register('tradingName')} />
          </Field>
          <Field label="Legal business name" error={errors.legalName?.message}>
            <Input {...form.register('legalName')} />
          </Field>
          <Field label="Kind of store" error={errors.storeType?.message}>
            <Select {...form.register('storeType')}>
              {STORE_TYPES.map((t) => (
                <option key={t} value={t}>
                  {t}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Website" optional error={errors.website?.message}>
            <Input type="url" {...form.register('website')} />
          </Field>
          <Field label="Resale or tax number" error={errors.taxId?.message}>
            <Input {...form.register('taxId')} />
          </Field>
          <Field label="Certificate valid until" optional error={errors.certificateExpiresOn?.message}>
            <Input type="date" {...form.register('certificateExpiresOn')} />
          </Field>
        </fieldset>
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-1 text-base font-medium text-ink-900">Contact</legend>
          <Field label="Contact name" error={errors.contactName?.message} className="sm:col-span-2">
            <Input {...form.register('contactName')} />
          </Field>
          <Field label="Contact e-mail" error={errors.contactEmail?.message}>
            <Input type="email" {...form.register('contactEmail')} />
          </Field>
          <Field label="Contact phone" error={errors.contactPhone?.message}>
            <Input type="tel" {...form.register('contactPhone')} />
          </Field>
        </fieldset>
        <AddressFields
          legend="Billing address"
          prefix="billingAddress"
          autoCompleteSection="billing"
          register={form.register}
          errors={errors.billingAddress}
        />
        <AddressFields
          legend="Shipping address"
          prefix="shippingAddress"
          autoCompleteSection="shipping"
          register={form.register}
          errors={errors.shippingAddress}
        />
        <Field
          label="Notes"
          optional
          hint="For the studio only; the shop never sees them."
          error={errors.notes?.message}
        >
          <Textarea rows={3} {...form.register('notes')} />
        </Field>
      </form>
    </Dialog>
  )
}
