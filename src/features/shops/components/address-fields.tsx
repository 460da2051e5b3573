import type { FieldError, FieldValues, Path, UseFormRegister } from 'react-hook-form'
import type { Address } from '@shared/schemas/shops'
import { Field, Input } from '@/components/ui/field'

export type AddressErrors = Partial<Record<keyof Address, FieldError | undefined>> | undefined

/** The six lines of a postal address under one legend; `prefix` is the form's address field. */
export function AddressFields<T extends FieldValues>({
  legend,
  prefix,
  register,
  errors,
  autoCompleteSection,
}: {
  legend: string
  prefix: string
  register: UseFormRegister<T>
  errors?: AddressErrors
  /** "billing" or "shipping", so browsers fill the right address. */
  autoCompleteSection: 'billing' | 'shipping'
}) {
  const name = (k: keyof Address) => `${prefix}.${k}` as Path<T>
  const ac = (token: string) => `section-${prefix} ${autoCompleteSection} ${token}`
  return (
    <fieldset className="flex min-w-0 flex-col gap-4">
      <legend className="mb-1 text-base font-medium text-ink-900">{legend}</legend>
      <Field label="Street address" error={errors?.line1?.message}>
        <Input autoComplete={ac('address-line1')} {...register(name('line1'))} />
      </Field>
      <Field label="Address line 2" optional error={errors?.line2?.message}>
        <Input autoComplete={ac('address-line2')} {...register(name('line2'))} />
      </Field>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="City" error={errors?.city?.message}>
          <Input autoComplete={ac('address-level2')} {...register(name('city'))} />
        </Field>
        <Field label="State or region" error={errors?.region?.message}>
          <Input autoComplete={ac('address-level1')} {...register(name('region'))} />
        </Field>
        <Field label="Postal code" error={errors?.postalCode?.message}>
          <Input autoComplete={ac('postal-code')} {...register(name('postalCode'))} />
        </Field>
        <Field label="Country" hint="Two-letter code, e.g. US" error={errors?.country?.message}>
          <Input
            autoComplete={ac('country')}
            maxLength={2}
            className="uppercase"
            {...register(name('country'))}
          />
        </Field>
      </div>
    </fieldset>
  )
}

export const ADDRESS_FIELD_NAMES = (prefix: string) =>
  (['line1', 'line2', 'city', 'region', 'postalCode', 'country'] as const).map((k) => `${prefix}.${k}`)

export const emptyAddress = (): Address => ({
  line1: '',
  line2: '',
  city: '',
  region: '',
  postalCode: '',
  country: 'US',
})
