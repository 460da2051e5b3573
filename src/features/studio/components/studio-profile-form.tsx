import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { z } from 'zod'
import { StudioProfileSchema } from '@shared/schemas/settings-form'
import type { Settings } from '@shared/schemas/settings'
import { Button } from '@/components/ui/button'
import { Field, Input, Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useSaveStudioProfile } from '@/features/studio/api/studio'
import { applyApiErrors } from '@/lib/form-errors'

// The form edits the address as one text block; the shared schema checks the lines it becomes.
const FormSchema = StudioProfileSchema.omit({ address: true }).extend({
  addressText: z.string().max(600, 'At most 600 characters.'),
})
type Values = z.infer<typeof FormSchema>

export function StudioProfileForm({ studio }: { studio: Settings['studio'] }) {
  const save = useSaveStudioProfile()
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<Values>({
    resolver: zodResolver(FormSchema),
    defaultValues: { ...studio, addressText: studio.address.join('\n') },
  })
  const { errors } = form.formState

  const submit = form.handleSubmit(async ({ addressText, ...rest }) => {
    setFormError(null)
    const address = addressText
      .split('\n')
      .map((l) => l.trim())
      .filter(Boolean)
    const parsed = StudioProfileSchema.safeParse({ ...rest, address })
    if (!parsed.success) {
      form.setError('addressText', { message: parsed.error.issues[0]?.message ?? 'Check the address.' })
      return
    }
    try {
      await save.mutateAsync(parsed.data)
      toast.success('Studio profile saved.')
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['name', 'legalName', 'email', 'phone', 'taxId']))
    }
  })

  return (
    <form onSubmit={submit} noValidate className="grid gap-4 sm:grid-cols-2">
      {formError ? <FormError message={formError} className="sm:col-span-2" /> : null}
      <Field label="Studio name" hint="Shown to shops and on documents." error={errors.name?.message}>
        <Input {...form.register('name')} />
      </Field>
      <Field label="Legal name" error={errors.legalName?.message}>
        <Input {...form.register('legalName')} />
      </Field>
      <Field label="E-mail" error={errors.email?.message}>
        <Input type="email" {...form.register('email')} />
      </Field>
      <Field label="Phone" optional error={errors.phone?.message}>
        <Input type="tel" {...form.register('phone')} />
      </Field>
      <Field
        label="Address"
        hint="One line per row, up to five."
        error={errors.addressText?.message}
        className="sm:col-span-2"
      >
        <Textarea rows={4} {...form.register('addressText')} />
      </Field>
      <Field label="Tax ID" optional error={errors.taxId?.message}>
        <Input {...form.register('taxId')} />
      </Field>
      <div className="flex items-end sm:col-span-2">
        <Button type="submit" loading={save.isPending}>
          Save profile
        </Button>
      </div>
    </form>
  )
}
