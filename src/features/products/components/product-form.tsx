import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import type { UseFormSetError } from 'react-hook-form'
import { z } from 'zod'
import { formatCents, parseMoneyToCents } from '@shared/domain/money/money'
import { gramsTo } from '@shared/domain/units/units'
import { NET_OVER_CUT_MESSAGE, ProductBaseSchema, gtinProblem } from '@shared/schemas/products'
import type { ProductCreateInput, ProductRow, RecipeOption } from '@shared/schemas/products'
import { Button } from '@/components/ui/button'
import { Checkbox, Field, Input, Select, Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { applyApiErrors } from '@/lib/form-errors'

// The form edits the MSRP as typed money; the shared schema checks the cents it becomes.
const FormSchema = ProductBaseSchema.omit({ msrpCents: true })
  .extend({
    msrp: z
      .string()
      .trim()
      .min(1, 'Enter the suggested retail price.')
      .refine((v) => parseMoneyToCents(v) !== null, 'Enter an amount such as 10.00.'),
  })
  .refine((p) => p.netWeightG <= p.cutWeightG, { path: ['netWeightG'], message: NET_OVER_CUT_MESSAGE })
type FormIn = z.input<typeof FormSchema>
type FormOut = z.output<typeof FormSchema>

const FIELDS = [
  'sku',
  'name',
  'scentNotes',
  'description',
  'recipeId',
  'netWeightG',
  'cutWeightG',
  'casePack',
  'gtin',
  'active',
] as const

function defaults(product: ProductRow | null, currency: string): FormIn {
  if (!product) {
    return {
      sku: '',
      name: '',
      scentNotes: '',
      description: '',
      recipeId: Number.NaN,
      netWeightG: Number.NaN,
      cutWeightG: Number.NaN,
      casePack: 12,
      msrp: '',
      gtin: '',
      active: true,
    }
  }
  return {
    sku: product.sku,
    name: product.name,
    scentNotes: product.scentNotes ?? '',
    description: product.description ?? '',
    recipeId: product.recipeId,
    netWeightG: product.netWeightG,
    cutWeightG: product.cutWeightG,
    casePack: product.casePack,
    msrp: formatCents(product.msrpCents, currency).replace(/^[^\d]+/, ''),
    gtin: product.gtin ?? '',
    active: product.active,
  }
}

/** What the typed GTIN is, as the person types it. */
function GtinStatus({ value }: { value: string }) {
  const code = value.replace(/\s+/g, '')
  if (code === '') return <>Optional. 8, 12, 13 or 14 digits; the last one is the check digit.</>
  const problem = gtinProblem(code)
  if (problem) return <span className="text-clay-700">{problem}</span>
  return <span className="font-medium text-olive-800">Check digit is right (GTIN-{code.length}).</span>
}

export function ProductForm({
  product,
  recipes,
  currency,
  onSave,
  saving,
}: {
  product: ProductRow | null
  recipes: RecipeOption[]
  currency: string
  onSave: (values: ProductCreateInput) => Promise<unknown>
  saving: boolean
}) {
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(FormSchema),
    defaultValues: defaults(product, currency),
  })
  const { errors } = form.formState
  const net = form.watch('netWeightG')
  const gtin = form.watch('gtin') ?? ''
  // The current recipe stays choosable even when it has been archived since.
  const options =
    product && !recipes.some((r) => r.id === product.recipeId)
      ? [...recipes, { id: product.recipeId, name: `${product.recipeName} (archived)`, barWeightG: 0 }]
      : recipes

  const submit = form.handleSubmit(async ({ msrp, ...rest }) => {
    setFormError(null)
    try {
      await onSave({ ...rest, msrpCents: parseMoneyToCents(msrp)! })
      if (product) form.reset({ ...form.getValues() })
    } catch (err) {
      // The API speaks of msrpCents; the form's field for it is the typed amount.
      const setError: UseFormSetError<FormIn> = (name, error, options) =>
        form.setError((name as string) === 'msrpCents' ? 'msrp' : name, error, options)
      setFormError(applyApiErrors(err, setError, [...FIELDS, 'msrpCents']))
    }
  })

  const num = { valueAsNumber: true } as const
  return (
    <form onSubmit={submit} noValidate className="grid gap-4 sm:grid-cols-2" aria-label="Product details">
      {formError ? <FormError message={formError} className="sm:col-span-2" /> : null}
      <Field
        label="SKU"
        hint="Capital letters and digits, with single hyphens: LAV, HNY-XL."
        error={errors.sku?.message}
      >
        <Input
          autoComplete="off"
          className="uppercase"
          {...form.register('sku', { setValueAs: (v: string) => v.toUpperCase() })}
        />
      </Field>
      <Field label="Name" error={errors.name?.message}>
        <Input autoComplete="off" {...form.register('name')} />
      </Field>
      <Field label="Recipe" error={errors.recipeId?.message}>
        <Select {...form.register('recipeId', num)}>
          <option value="">Choose a recipe…</option>
          {options.map((r) => (
            <option key={r.id} value={r.id}>
              {r.name}
            </option>
          ))}
        </Select>
      </Field>
      <Field label="Scent notes" optional error={errors.scentNotes?.message}>
        <Input autoComplete="off" {...form.register('scentNotes')} />
      </Field>
      <Field label="Description" optional error={errors.description?.message} className="sm:col-span-2">
        <Textarea rows={3} {...form.register('description')} />
      </Field>
      <Field
        label="Net weight (g)"
        hint={
          Number.isFinite(net) && net > 0
            ? `${gramsTo(net, 'oz').toFixed(2)} oz on the label, after the cure.`
            : 'Declared on the label, after the cure.'
        }
        error={errors.netWeightG?.message}
      >
        <Input type="number" inputMode="numeric" min={1} step={1} {...form.register('netWeightG', num)} />
      </Field>
      <Field
        label="Cut weight (g)"
        hint="As cut from the loaf, before the cure."
        error={errors.cutWeightG?.message}
      >
        <Input type="number" inputMode="numeric" min={1} step={1} {...form.register('cutWeightG', num)} />
      </Field>
      <Field label="Case pack (bars per case)" error={errors.casePack?.message}>
        <Input
          type="number"
          inputMode="numeric"
          min={1}
          max={500}
          step={1}
          {...form.register('casePack', num)}
        />
      </Field>
      <Field label="MSRP" hint={`Suggested retail price per bar, ${currency}.`} error={errors.msrp?.message}>
        <Input inputMode="decimal" autoComplete="off" {...form.register('msrp')} />
      </Field>
      <Field label="GTIN" hint={<GtinStatus value={gtin} />} error={errors.gtin?.message}>
        <Input inputMode="numeric" autoComplete="off" {...form.register('gtin')} />
      </Field>
      <div className="flex items-center sm:pt-7">
        <Checkbox
          label="On sale to shops"
          hint="Off sale hides it from the catalogue."
          {...form.register('active')}
        />
      </div>
      <div className="flex items-end gap-3 sm:col-span-2">
        <Button type="submit" loading={saving}>
          {product ? 'Save product' : 'Create product'}
        </Button>
      </div>
    </form>
  )
}
