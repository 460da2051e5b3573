import { zodResolver } from '@hookform/resolvers/zod'
import { useEffect, useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { sapKohToNaoh, sapNaohToKoh } from '@shared/domain/lye/lye'
import { VANILLIN_WARN_PCT } from '@shared/domain/batch-sheet/batch-sheet'
import {
  CreateIngredientSchema,
  INGREDIENT_KINDS,
  INGREDIENT_KIND_LABELS,
  SAP_KOH_RANGE,
  SAP_NAOH_RANGE,
} from '@shared/schemas/ingredients'
import type { IngredientRow } from '@shared/schemas/ingredients'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Input, Select, Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useCreateIngredient, useUpdateIngredient } from '@/features/ingredients/api/ingredients'
import { applyApiErrors } from '@/lib/form-errors'

type FormIn = z.input<typeof CreateIngredientSchema>
type FormOut = z.output<typeof CreateIngredientSchema>
type SapBasis = 'koh' | 'naoh'

const FIELDS = [
  'name',
  'kind',
  'inci',
  'sapKoh',
  'sapNaoh',
  'purityPct',
  'maxUsagePct',
  'vanillinPct',
  'reorderLevel',
  'notes',
]

const text = (n: number | null | undefined) => (n === null || n === undefined ? '' : String(n))

function defaults(ingredient?: IngredientRow | null): FormIn {
  return {
    name: ingredient?.name ?? '',
    kind: ingredient?.kind ?? 'oil',
    inci: ingredient?.inci ?? '',
    // One SAP value is entered; the other follows. An existing oil is edited in mg KOH per g.
    sapKoh: ingredient?.sapKoh != null ? String(Number(ingredient.sapKoh.toFixed(3))) : '',
    purityPct: text(ingredient?.purityPct),
    maxUsagePct: text(ingredient?.maxUsagePct),
    vanillinPct: text(ingredient?.vanillinPct),
    reorderLevel: text(ingredient?.reorderLevel),
    notes: ingredient?.notes ?? '',
  }
}

function asNumber(v: unknown): number | null {
  if (typeof v === 'number') return v
  if (typeof v !== 'string' || v.trim() === '') return null
  const n = Number(v)
  return Number.isFinite(n) ? n : null
}

/** The SAP value converted to the other unit, for the line under the input. */
function conversion(basis: SapBasis, value: unknown): string | null {
  const n = asNumber(value)
  if (n === null || n <= 0) return null
  if (basis === 'koh') return `= ${sapKohToNaoh(n).toFixed(5)} g NaOH per g of oil`
  return `= ${sapNaohToKoh(n).toFixed(1)} mg KOH per g of oil`
}

type Props = {
  open: boolean
  onClose: () => void
  /** Editing this one; a new ingredient when absent. */
  ingredient?: IngredientRow | null
  onSaved?: (ingredient: IngredientRow) => void
}

/** Create or edit an ingredient; the fields follow the kind (SAP for oils, purity for lye, limits for fragrances). */
export function IngredientDialog({ open, onClose, ingredient, onSaved }: Props) {
  const create = useCreateIngredient()
  const update = useUpdateIngredient()
  const saving = create.isPending || update.isPending
  const [formError, setFormError] = useState<string | null>(null)
  const [basis, setBasis] = useState<SapBasis>('koh')
  const form = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(CreateIngredientSchema),
    defaultValues: defaults(ingredient),
    // Fields of another kind leave the form with their inputs, so nothing stale is sent.
    shouldUnregister: true,
  })
  const { errors } = form.formState
  const kind = form.watch('kind')
  const sapValue = form.watch(basis === 'koh' ? 'sapKoh' : 'sapNaoh')
  const vanillin = asNumber(form.watch('vanillinPct'))

  useEffect(() => {
    if (open) {
      form.reset(defaults(ingredient))
      setBasis('koh')
      setFormError(null)
    }
  }, [open, ingredient, form])

  const close = () => {
    if (!saving) onClose()
  }

  const submit = form.handleSubmit(async () => {
    setFormError(null)
    // The typed values go to the API as entered; it applies the same schema.
    const raw = form.getValues()
    const body = {
      ...raw,
      sapKoh: basis === 'koh' ? raw.sapKoh : null,
      sapNaoh: basis === 'naoh' ? raw.sapNaoh : null,
    }
    if (kind !== 'oil') {
      body.sapKoh = null
      body.sapNaoh = null
    }
    try {
      const { ingredient: saved } = ingredient
        ? await update.mutateAsync({ id: ingredient.id, ...body })
        : await create.mutateAsync(body)
      toast.success(ingredient ? `${saved.name} saved.` : `${saved.name} added.`)
      onSaved?.(saved)
      onClose()
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, FIELDS))
    }
  })

  const reorderUnit = kind === 'packaging' ? 'items' : 'g'

  return (
    <Dialog
      open={open}
      onClose={close}
      title={ingredient ? `Edit ${ingredient.name}` : 'Add an ingredient'}
      description="Oils need their saponification value; lye its purity; fragrances their usage limit."
      size="lg"
      dismissible={!saving}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={saving}>
            Cancel
          </Button>
          <Button type="submit" form="ingredient-form" loading={saving}>
            {ingredient ? 'Save changes' : 'Add ingredient'}
          </Button>
        </>
      }
    >
      <form id="ingredient-form" onSubmit={submit} noValidate className="grid gap-4 sm:grid-cols-2">
        {formError ? <FormError message={formError} className="sm:col-span-2" /> : null}
        <Field label="Name" error={errors.name?.message}>
          <Input autoComplete="off" {...form.register('name')} />
        </Field>
        <Field
          label="Kind"
          error={errors.kind?.message}
          hint={
            ingredient?.kindLocked ? 'Fixed: purchases or recipes already use this ingredient.' : undefined
          }
        >
          {ingredient?.kindLocked ? (
            <Input readOnly value={INGREDIENT_KIND_LABELS[ingredient.kind]} />
          ) : (
            <Select {...form.register('kind')}>
              {INGREDIENT_KINDS.map((k) => (
                <option key={k} value={k}>
                  {INGREDIENT_KIND_LABELS[k]}
                </option>
              ))}
            </Select>
          )}
        </Field>
        {ingredient?.kindLocked ? <input type="hidden" {...form.register('kind')} /> : null}
        <Field
          label="INCI name"
          optional
          error={errors.inci?.message}
          className="sm:col-span-2"
          hint="As the label declares it."
        >
          <Input autoComplete="off" {...form.register('inci')} />
        </Field>

        {kind === 'oil' ? (
          <fieldset className="flex flex-col gap-3 rounded-md border border-cream-300 p-4 sm:col-span-2">
            <legend className="px-1 text-sm font-medium text-ink-800">Saponification value</legend>
            <div className="flex flex-wrap gap-x-5 gap-y-2 text-sm">
              {(
                [
                  ['koh', 'mg KOH per g (as published tables give it)'],
                  ['naoh', 'g NaOH per g'],
                ] as const
              ).map(([value, label]) => (
                <label key={value} className="flex cursor-pointer items-center gap-2">
                  <input
                    type="radio"
                    name="sap-basis"
                    value={value}
                    checked={basis === value}
                    onChange={() => setBasis(value)}
                    className="size-4 accent-olive-700"
                  />
                  {label}
                </label>
              ))}
            </div>
            {basis === 'koh' ? (
              <Field
                label="SAP (KOH)"
                error={errors.sapKoh?.message}
                hint={
                  conversion('koh', sapValue) ??
                  `Between ${SAP_KOH_RANGE.min} and ${SAP_KOH_RANGE.max}; olive oil is about 190.`
                }
              >
                <Input inputMode="decimal" autoComplete="off" {...form.register('sapKoh')} />
              </Field>
            ) : (
              <Field
                label="SAP (NaOH)"
                error={errors.sapNaoh?.message ?? errors.sapKoh?.message}
                hint={
                  conversion('naoh', sapValue) ??
                  `Between ${SAP_NAOH_RANGE.min} and ${SAP_NAOH_RANGE.max}; olive oil is about 0.135.`
                }
              >
                <Input inputMode="decimal" autoComplete="off" {...form.register('sapNaoh')} />
              </Field>
            )}
            <p className="text-xs text-ink-600">
              The other unit follows from the molar masses of NaOH and KOH (IUPAC/CIAAW atomic weights): NaOH
              = KOH × 0.712888 ÷ 1000.
            </p>
          </fieldset>
        ) : null}

        {kind === 'lye' ? (
          <Field
            label="Purity (%)"
            optional
            error={errors.purityPct?.message}
            hint="From the supplier’s certificate; 100 when left empty."
          >
            <Input inputMode="decimal" autoComplete="off" placeholder="100" {...form.register('purityPct')} />
          </Field>
        ) : null}

        {kind === 'fragrance' ? (
          <>
            <Field
              label="Maximum usage (%)"
              optional
              error={errors.maxUsagePct?.message}
              hint="The supplier’s IFRA certificate limit for category 9 (rinse-off soap)."
            >
              <Input inputMode="decimal" autoComplete="off" {...form.register('maxUsagePct')} />
            </Field>
            <Field
              label="Vanillin (%)"
              optional
              error={errors.vanillinPct?.message}
              hint={
                vanillin !== null && vanillin > VANILLIN_WARN_PCT
                  ? 'Expect bars to brown as they cure (common practice).'
                  : 'Over about 0.5 % browns soap as it cures.'
              }
            >
              <Input inputMode="decimal" autoComplete="off" {...form.register('vanillinPct')} />
            </Field>
          </>
        ) : null}

        <Field
          label={`Reorder level (${reorderUnit})`}
          optional
          error={errors.reorderLevel?.message}
          hint="Flagged as low when less than this is on hand."
        >
          <Input inputMode="decimal" autoComplete="off" {...form.register('reorderLevel')} />
        </Field>
        <Field label="Notes" optional error={errors.notes?.message} className="sm:col-span-2">
          <Textarea rows={2} {...form.register('notes')} />
        </Field>
      </form>
    </Dialog>
  )
}
