import type { FieldError, FieldValues, Path, UseFormRegister } from 'react-hook-form'
import { PAYMENT_TERMS, PAYMENT_TERMS_LABELS } from '@shared/schemas/shops'
import { Field, Select } from '@/components/ui/field'

/**
 * An account's price tier and payment terms, the two fields approving an application and editing
 * an account share. The caller lays them out; `loading` says the tiers are still on their way (the
 * tier list stays disabled until they are).
 */
export function TermsFields<T extends FieldValues & { tierId?: unknown; paymentTerms?: unknown }>({
  register,
  errors,
  tiers,
  loading = false,
}: {
  register: UseFormRegister<T>
  errors: { tierId?: FieldError; paymentTerms?: FieldError }
  tiers: readonly { id: number; name: string }[]
  loading?: boolean
}) {
  return (
    <>
      <Field label="Price tier" error={errors.tierId?.message}>
        <Select {...register('tierId' as Path<T>)} disabled={loading || undefined}>
          <option value="">{loading ? 'Loading tiers…' : 'Choose a tier…'}</option>
          {tiers.map((t) => (
            <option key={t.id} value={t.id}>
              {t.name}
            </option>
          ))}
        </Select>
      </Field>
      <Field label="Payment terms" error={errors.paymentTerms?.message}>
        <Select {...register('paymentTerms' as Path<T>)}>
          {PAYMENT_TERMS.map((t) => (
            <option key={t} value={t}>
              {PAYMENT_TERMS_LABELS[t]}
            </option>
          ))}
        </Select>
      </Field>
    </>
  )
}
