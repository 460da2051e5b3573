import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { PlanningSettingsSchema } from '@shared/schemas/planning'
import type { PlanningSettingsInput } from '@shared/schemas/planning'
import { Button } from '@/components/ui/button'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useSavePlanningSettings } from '@/features/planning/api/plan'
import { applyApiErrors } from '@/lib/form-errors'

/** The days the pour plan keeps to spare between a batch's cure and the day stock would run out. */
export function LeadTimeForm({ pourLeadTimeDays }: { pourLeadTimeDays: number }) {
  const save = useSavePlanningSettings()
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<z.input<typeof PlanningSettingsSchema>, unknown, PlanningSettingsInput>({
    resolver: zodResolver(PlanningSettingsSchema),
    defaultValues: { pourLeadTimeDays },
  })
  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      await save.mutateAsync(values)
      toast.success(`Pour lead time saved: ${values.pourLeadTimeDays} days.`)
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['pourLeadTimeDays']))
    }
  })
  return (
    <form onSubmit={submit} noValidate className="flex max-w-md flex-col gap-4" aria-label="Pour planning">
      <FormError message={formError} />
      <Field
        label="Pour lead time (days)"
        hint="Latest pour date = the day ready stock runs out − the recipe's cure days − this lead time (labelling, packing, a slow cure)."
        error={form.formState.errors.pourLeadTimeDays?.message}
      >
        <Input
          type="number"
          inputMode="numeric"
          min={0}
          max={60}
          step={1}
          {...form.register('pourLeadTimeDays')}
        />
      </Field>
      <div>
        <Button type="submit" loading={save.isPending}>
          Save lead time
        </Button>
      </div>
    </form>
  )
}
