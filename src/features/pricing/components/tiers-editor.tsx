import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { TierCreateSchema } from '@shared/schemas/pricing'
import type { TierCreateInput, TierRow } from '@shared/schemas/pricing'
import { Button } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useCreateTier, useUpdateTier } from '@/features/pricing/api/tiers'
import { applyApiErrors } from '@/lib/form-errors'

function TierForm({
  tier,
  onSave,
  saving,
  submitLabel,
}: {
  tier: TierRow | null
  onSave: (values: TierCreateInput) => Promise<unknown>
  saving: boolean
  submitLabel: string
}) {
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<TierCreateInput>({
    resolver: zodResolver(TierCreateSchema),
    defaultValues: tier
      ? { name: tier.name, targetMarginPct: tier.targetMarginPct }
      : { name: '', targetMarginPct: Number.NaN },
  })
  const { errors, isDirty } = form.formState
  const label = tier ? tier.name : 'new tier'
  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      await onSave(values)
      if (!tier) form.reset({ name: '', targetMarginPct: Number.NaN })
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['name', 'targetMarginPct']))
    }
  })
  return (
    <form
      onSubmit={submit}
      noValidate
      aria-label={tier ? `Tier ${tier.name}` : 'Add a tier'}
      className="grid items-start gap-3 sm:grid-cols-[minmax(0,1fr)_10rem_auto]"
    >
      {formError ? <FormError message={formError} className="sm:col-span-3" /> : null}
      <Field
        label={
          <>
            Name<span className="sr-only"> of {label}</span>
          </>
        }
        error={errors.name?.message}
      >
        <Input autoComplete="off" {...form.register('name')} />
      </Field>
      <Field
        label={
          <>
            Target margin, %<span className="sr-only"> ({label})</span>
          </>
        }
        error={errors.targetMarginPct?.message}
      >
        <Input
          type="number"
          inputMode="decimal"
          min={0}
          max={99.99}
          step="0.01"
          {...form.register('targetMarginPct', { valueAsNumber: true })}
        />
      </Field>
      <div className="sm:pt-6.5">
        <Button
          type="submit"
          variant={tier ? 'secondary' : 'primary'}
          loading={saving}
          disabled={tier ? !isDirty : false}
        >
          {submitLabel}
        </Button>
      </div>
    </form>
  )
}

function ExistingTier({ tier }: { tier: TierRow }) {
  const update = useUpdateTier(tier.id)
  return (
    <li className="border-b border-cream-200 pb-4 last:border-0 last:pb-0">
      <TierForm
        key={`${tier.name}|${tier.targetMarginPct}`}
        tier={tier}
        saving={update.isPending}
        submitLabel="Save"
        onSave={async (values) => {
          await update.mutateAsync(values)
          toast.success(`${values.name} saved.`)
        }}
      />
      <p className="mt-1 text-xs text-ink-700">
        {tier.shopCount === 0
          ? 'No shop buys at this tier yet.'
          : `${tier.shopCount} ${tier.shopCount === 1 ? 'shop buys' : 'shops buy'} at this tier.`}
      </p>
    </li>
  )
}

/** The price tiers and their target margins; a margin change moves every suggestion of its tier. */
export function TiersEditor({ tiers }: { tiers: TierRow[] }) {
  const create = useCreateTier()
  return (
    <Card>
      <CardHeader
        title="Price tiers"
        description="Each shop buys at one tier. The target margin is a share of the price, below 100 %."
      />
      <CardBody className="flex flex-col gap-6">
        <ul className="flex flex-col gap-4">
          {tiers.map((t) => (
            <ExistingTier key={t.id} tier={t} />
          ))}
        </ul>
        <div className="rounded-md bg-cream-50 p-4">
          <h3 className="mb-3 text-sm font-medium text-ink-900">Add a tier</h3>
          <TierForm
            tier={null}
            saving={create.isPending}
            submitLabel="Add tier"
            onSave={async (values) => {
              await create.mutateAsync(values)
              toast.success(`${values.name} added.`)
            }}
          />
        </div>
      </CardBody>
    </Card>
  )
}
