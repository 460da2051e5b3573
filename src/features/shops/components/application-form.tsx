import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import type { FieldErrors, Resolver } from 'react-hook-form'
import {
  ApplicationSchema,
  CERTIFICATE_ACCEPT,
  CERTIFICATE_FIELD,
  CERTIFICATE_MAX_BYTES,
  HONEYPOT_FIELD,
  STORE_TYPES,
} from '@shared/schemas/shops'
import type { Address, ApplicationReceipt } from '@shared/schemas/shops'
import { Button } from '@/components/ui/button'
import { Checkbox, Field, Input, Select } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { useSubmitApplication } from '@/features/shops/api/applications'
import { ADDRESS_FIELD_NAMES, AddressFields, emptyAddress } from '@/features/shops/components/address-fields'
import { applyApiErrors } from '@/lib/form-errors'

type FormValues = {
  legalName: string
  tradingName: string
  contactName: string
  contactEmail: string
  contactPhone: string
  billingAddress: Address
  shippingSameAsBilling: boolean
  shippingAddress: Address
  taxId: string
  storeType: string
  website: string
  [HONEYPOT_FIELD]: string
  [CERTIFICATE_FIELD]: FileList | undefined
}

const FIELD_NAMES = [
  'legalName',
  'tradingName',
  'contactName',
  'contactEmail',
  'contactPhone',
  'taxId',
  'storeType',
  'website',
  CERTIFICATE_FIELD,
  ...ADDRESS_FIELD_NAMES('billingAddress'),
  ...ADDRESS_FIELD_NAMES('shippingAddress'),
]

function certificateProblem(files: FileList | undefined): string | null {
  const file = files?.[0]
  if (!file) return 'Attach the resale certificate (PDF, JPEG or PNG).'
  if (file.size === 0) return 'The file is empty.'
  if (file.size > CERTIFICATE_MAX_BYTES)
    return 'The certificate is larger than 5 MB. Send a smaller scan or a PDF.'
  return null
}

// The shared schema checks the text fields; the file is checked here (and, by its bytes, on the server).
const schemaResolver = zodResolver(ApplicationSchema) as unknown as Resolver<FormValues>
const resolver: Resolver<FormValues> = async (values, context, options) => {
  const result = await schemaResolver(values, context, options)
  const problem = certificateProblem(values[CERTIFICATE_FIELD])
  if (!problem) return Object.keys(result.errors).length ? result : { values, errors: {} }
  const errors: FieldErrors<FormValues> = {
    ...result.errors,
    [CERTIFICATE_FIELD]: { type: 'client', message: problem },
  }
  return { values: {}, errors }
}

/** Multipart fields as the server reads them: `billingAddress[line1]` and so on. */
function toFormData(v: FormValues): FormData {
  const form = new FormData()
  const put = (k: string, value: string) => form.append(k, value)
  for (const k of [
    'legalName',
    'tradingName',
    'contactName',
    'contactEmail',
    'contactPhone',
    'taxId',
    'storeType',
    'website',
  ] as const)
    put(k, v[k])
  for (const [k, value] of Object.entries(v.billingAddress)) put(`billingAddress[${k}]`, value)
  put('shippingSameAsBilling', String(v.shippingSameAsBilling))
  if (!v.shippingSameAsBilling)
    for (const [k, value] of Object.entries(v.shippingAddress)) put(`shippingAddress[${k}]`, value)
  put(HONEYPOT_FIELD, v[HONEYPOT_FIELD])
  const file = v[CERTIFICATE_FIELD]?.[0]
  if (file) form.append(CERTIFICATE_FIELD, file)
  return form
}

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="flex flex-col gap-4 border-t border-cream-200 pt-6 first:border-t-0 first:pt-0">
      <h2 className="text-lg font-medium text-ink-900">{title}</h2>
      {children}
    </section>
  )
}

/** The public wholesale application. */
export function ApplicationForm({ onSubmitted }: { onSubmitted: (receipt: ApplicationReceipt) => void }) {
  const submit = useSubmitApplication()
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<FormValues>({
    resolver,
    defaultValues: {
      legalName: '',
      tradingName: '',
      contactName: '',
      contactEmail: '',
      contactPhone: '',
      billingAddress: emptyAddress(),
      shippingSameAsBilling: true,
      shippingAddress: emptyAddress(),
      taxId: '',
      storeType: '',
      website: '',
      [HONEYPOT_FIELD]: '',
      [CERTIFICATE_FIELD]: undefined,
    },
  })
  const { errors } = form.formState
  const sameAsBilling = form.watch('shippingSameAsBilling')

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      const { application } = await submit.mutateAsync(toFormData(values))
      onSubmitted(application)
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, FIELD_NAMES))
    }
  })

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-6">
      {formError ? <FormError message={formError} /> : null}
      {Object.keys(errors).length > 1 && !formError ? (
        <FormError message="Some fields need attention; each says what is missing." />
      ) : null}

      <Section title="Your business">
        <div className="grid gap-4 sm:grid-cols-2">
          <Field label="Shop name" hint="The name your customers know" error={errors.tradingName?.message}>
            <Input autoComplete="organization" {...form.register('tradingName')} />
          </Field>
          <Field
            label="Legal business name"
            hint="As on your resale certificate"
            error={errors.legalName?.message}
          >
            <Input autoComplete="off" {...form.register('legalName')} />
          </Field>
          <Field label="Kind of store" error={errors.storeType?.message}>
            <Select {...form.register('storeType')}>
              <option value="">Choose…</option>
              {STORE_TYPES.map((t) => (
                <option key={t} value={t}>
                  {t}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Website" optional error={errors.website?.message}>
            <Input
              type="url"
              inputMode="url"
              autoComplete="url"
              placeholder="https://"
              {...form.register('website')}
            />
          </Field>
        </div>
      </Section>

      <Section title="Contact">
        <div className="grid gap-4 sm:grid-cols-2">
          <Field label="Contact name" error={errors.contactName?.message} className="sm:col-span-2">
            <Input autoComplete="name" {...form.register('contactName')} />
          </Field>
          <Field label="Contact e-mail" hint="We write to you here" error={errors.contactEmail?.message}>
            <Input type="email" autoComplete="email" {...form.register('contactEmail')} />
          </Field>
          <Field label="Contact phone" error={errors.contactPhone?.message}>
            <Input type="tel" autoComplete="tel" {...form.register('contactPhone')} />
          </Field>
        </div>
      </Section>

      <Section title="Addresses">
        <AddressFields
          legend="Billing address"
          prefix="billingAddress"
          autoCompleteSection="billing"
          register={form.register}
          errors={errors.billingAddress}
        />
        <Checkbox label="Ship to the billing address" {...form.register('shippingSameAsBilling')} />
        {!sameAsBilling ? (
          <AddressFields
            legend="Shipping address"
            prefix="shippingAddress"
            autoCompleteSection="shipping"
            register={form.register}
            errors={errors.shippingAddress}
          />
        ) : null}
      </Section>

      <Section title="Resale certificate">
        <p className="text-sm text-ink-700">
          Wholesale prices are for resale. Send your state’s resale or exemption certificate so your orders
          can go out without sales tax.
        </p>
        <div className="grid gap-4 sm:grid-cols-2">
          <Field label="Resale or tax number" error={errors.taxId?.message}>
            <Input autoComplete="off" {...form.register('taxId')} />
          </Field>
          <Field
            label="Certificate file"
            hint="PDF, JPEG or PNG, up to 5 MB"
            error={errors[CERTIFICATE_FIELD]?.message}
          >
            <Input
              type="file"
              accept={CERTIFICATE_ACCEPT}
              className="h-auto py-1.5 file:mr-3 file:rounded file:border-0 file:bg-olive-100 file:px-3 file:py-1 file:text-sm file:font-medium file:text-olive-900"
              {...form.register(CERTIFICATE_FIELD)}
            />
          </Field>
        </div>
      </Section>

      {/* Hidden from people and from assistive technology; a robot filling every field fills this one too. */}
      <div aria-hidden="true" className="absolute -left-[10000px] h-px w-px overflow-hidden">
        <label htmlFor="company-fax-field">Company fax</label>
        <input
          id="company-fax-field"
          type="text"
          tabIndex={-1}
          autoComplete="off"
          {...form.register(HONEYPOT_FIELD)}
        />
      </div>

      <div className="flex flex-col gap-3 border-t border-cream-200 pt-6 sm:flex-row sm:items-center sm:justify-between">
        <p className="text-sm text-ink-700">We read every application and answer by e-mail.</p>
        <Button type="submit" loading={submit.isPending}>
          Send application
        </Button>
      </div>
    </form>
  )
}
