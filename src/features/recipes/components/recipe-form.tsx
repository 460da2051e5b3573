import { zodResolver } from '@hookform/resolvers/zod'
import { Fragment, useState } from 'react'
import type { ReactNode } from 'react'
import { useFieldArray, useForm, useWatch } from 'react-hook-form'
import type { Control, FieldErrors, FieldPath, UseFormRegister } from 'react-hook-form'
import {
  OILS_SUM_TOLERANCE,
  VANILLIN_WARN_PCT,
  oilPercentagesAddUp,
  oilPercentagesSum,
} from '@shared/domain/batch-sheet/batch-sheet'
import { RecipeInputSchema } from '@shared/schemas/recipes'
import type {
  IngredientKind,
  Recipe,
  RecipeFormValues,
  RecipeIngredientOption,
  RecipeInput,
} from '@shared/schemas/recipes'
import { Button } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { Field, Input, Select, Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { cn } from '@/lib/cn'
import { applyApiErrors } from '@/lib/form-errors'

type Values = RecipeFormValues

const toId = (v: unknown) => (v === '' || v == null ? undefined : Number(v))
const toIdOrNull = (v: unknown) => (v === '' || v == null ? null : Number(v))
const toNumberOrNull = (v: unknown) => (v === '' || v == null ? null : Number(v))
const fmt = (n: number) => Number(n.toFixed(2)).toString()

/** The form's starting values: a recipe being edited, or a new one with the usual defaults. */
export function recipeFormDefaults(recipe: Recipe | null, options: RecipeIngredientOption[]): Values {
  if (recipe) {
    return {
      name: recipe.name,
      notes: recipe.notes ?? '',
      oils: recipe.oils.map((o) => ({ ingredientId: o.ingredientId, pct: o.pct })),
      superfatPct: recipe.superfatPct,
      waterMode: recipe.waterMode,
      lyeConcentrationPct: recipe.lyeConcentrationPct,
      waterLyeRatio: recipe.waterLyeRatio,
      lyeIngredientId: recipe.lye?.ingredientId ?? null,
      waterIngredientId: recipe.water?.ingredientId ?? null,
      fragrances: recipe.fragrances.map((f) => ({ ingredientId: f.ingredientId, pct: f.pct })),
      additives: recipe.additives.map((a) => ({ ingredientId: a.ingredientId, gPerKg: a.gPerKg })),
      packaging: recipe.packaging.map((p) => ({ ingredientId: p.ingredientId, qtyPerBar: p.qtyPerBar })),
      labourMinutes: recipe.labourMinutes,
      cureDays: recipe.cureDays,
      barWeightG: recipe.barWeightG,
      barsPerMould: recipe.barsPerMould,
      barsKeptBack: recipe.barsKeptBack,
      mouldOilWeightG: recipe.mouldOilWeightG,
    }
  }
  const first = (kind: IngredientKind) => options.find((o) => o.kind === kind)?.id ?? null
  return {
    name: '',
    notes: '',
    oils: [{ ingredientId: undefined as unknown as number, pct: undefined as unknown as number }],
    // Around 5 % superfat and a 33 % lye solution are the usual starting points (common practice).
    superfatPct: 5,
    waterMode: 'concentration',
    lyeConcentrationPct: 33,
    waterLyeRatio: null,
    lyeIngredientId: first('lye'),
    waterIngredientId: first('liquid'),
    fragrances: [],
    additives: [],
    packaging: [],
    labourMinutes: 60,
    cureDays: 28,
    barWeightG: undefined as unknown as number,
    barsPerMould: undefined as unknown as number,
    barsKeptBack: 2,
    mouldOilWeightG: undefined as unknown as number,
  }
}

const SCALAR_FIELDS = [
  'name',
  'notes',
  'oils',
  'superfatPct',
  'waterMode',
  'lyeConcentrationPct',
  'waterLyeRatio',
  'lyeIngredientId',
  'waterIngredientId',
  'fragrances',
  'additives',
  'packaging',
  'labourMinutes',
  'cureDays',
  'barWeightG',
  'barsPerMould',
  'barsKeptBack',
  'mouldOilWeightG',
]

export function RecipeForm({
  recipe,
  options,
  onSave,
  onCancel,
  saving,
}: {
  recipe: Recipe | null
  options: RecipeIngredientOption[]
  onSave: (input: RecipeInput) => Promise<unknown>
  onCancel: () => void
  saving: boolean
}) {
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<Values, unknown, RecipeInput>({
    resolver: zodResolver(RecipeInputSchema),
    defaultValues: recipeFormDefaults(recipe, options),
  })
  const { register, control, formState } = form
  const { errors } = formState
  const oils = useFieldArray({ control, name: 'oils' })
  const waterMode = useWatch({ control, name: 'waterMode' })
  const oilRows = useWatch({ control, name: 'oils' })
  const pcts = (oilRows ?? []).map((o) => (Number.isFinite(o?.pct) ? Number(o.pct) : 0))
  const sum = oilPercentagesSum(pcts)
  const addsUp = oilRows.length > 0 && oilPercentagesAddUp(pcts)

  const ofKinds = (...kinds: IngredientKind[]) => options.filter((o) => kinds.includes(o.kind))

  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      await onSave(values)
    } catch (err) {
      const rows = form.getValues()
      const fields = [
        ...SCALAR_FIELDS,
        ...rows.oils.flatMap((_, i) => [`oils.${i}.ingredientId`, `oils.${i}.pct`]),
        ...(rows.fragrances ?? []).flatMap((_, i) => [`fragrances.${i}.ingredientId`, `fragrances.${i}.pct`]),
        ...(rows.additives ?? []).flatMap((_, i) => [`additives.${i}.ingredientId`, `additives.${i}.gPerKg`]),
        ...(rows.packaging ?? []).flatMap((_, i) => [
          `packaging.${i}.ingredientId`,
          `packaging.${i}.qtyPerBar`,
        ]),
      ]
      setFormError(applyApiErrors(err, form.setError, fields))
    }
  })

  const oilsError = errors.oils?.root?.message ?? errors.oils?.message

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-6" aria-label="Recipe">
      {formError ? <FormError message={formError} /> : null}

      <Card>
        <CardHeader title="Recipe" />
        <CardBody className="grid gap-4 sm:grid-cols-2">
          <Field label="Name" error={errors.name?.message} className="sm:col-span-2">
            <Input autoComplete="off" {...register('name')} />
          </Field>
          <Field
            label="Cure before sale (days)"
            error={errors.cureDays?.message}
            hint="28 days is the usual minimum."
          >
            <Input
              type="number"
              inputMode="numeric"
              step="1"
              {...register('cureDays', { valueAsNumber: true })}
            />
          </Field>
          <Field label="Labour per batch (minutes)" error={errors.labourMinutes?.message}>
            <Input
              type="number"
              inputMode="numeric"
              step="1"
              {...register('labourMinutes', { valueAsNumber: true })}
            />
          </Field>
          <Field label="Notes" optional error={errors.notes?.message} className="sm:col-span-2">
            <Textarea rows={2} {...register('notes')} />
          </Field>
        </CardBody>
      </Card>

      <Card>
        <CardHeader
          title="Oils and butters"
          description="Each as a share of the total oil weight; together they make 100 %."
        />
        <CardBody className="flex flex-col gap-3">
          {oils.fields.map((row, i) => (
            <Row
              key={row.id}
              onRemove={oils.fields.length > 1 ? () => oils.remove(i) : undefined}
              removeLabel={`Remove oil ${i + 1}`}
            >
              <IngredientSelect
                label={`Oil ${i + 1}`}
                name={`oils.${i}.ingredientId`}
                register={register}
                options={ofKinds('oil')}
                placeholder="Choose an oil…"
                error={errors.oils?.[i]?.ingredientId?.message}
              />
              <NumberField
                label={`Oil ${i + 1} share (%)`}
                name={`oils.${i}.pct`}
                register={register}
                error={errors.oils?.[i]?.pct?.message}
              />
            </Row>
          ))}
          <div className="flex flex-col gap-3 sm:flex-row sm:items-center sm:justify-between">
            <Button
              variant="secondary"
              size="sm"
              onClick={() =>
                oils.append({
                  ingredientId: undefined as unknown as number,
                  pct: undefined as unknown as number,
                })
              }
              disabled={oils.fields.length >= 20}
            >
              Add an oil
            </Button>
            <p
              role="status"
              aria-live="polite"
              className={cn('text-sm font-medium tabular-nums', addsUp ? 'text-olive-800' : 'text-clay-700')}
            >
              Oils add up to {fmt(sum)} %
              {addsUp ? ' ✓' : sum < 100 ? ` — ${fmt(100 - sum)} % to go` : ` — ${fmt(sum - 100)} % too much`}
            </p>
          </div>
          {oilsError ? <p className="text-sm text-clay-700">{oilsError}</p> : null}
        </CardBody>
      </Card>

      <Card>
        <CardHeader title="Lye and water" />
        <CardBody className="grid gap-4 sm:grid-cols-2">
          <Field
            label="Superfat (%)"
            error={errors.superfatPct?.message}
            hint="Oil left unsaponified; about 5 % is usual."
          >
            <Input
              type="number"
              inputMode="decimal"
              step="any"
              {...register('superfatPct', { valueAsNumber: true })}
            />
          </Field>
          <fieldset className="flex flex-col gap-2">
            <legend className="mb-1.5 text-sm font-medium text-ink-800">Water set by</legend>
            <label className="flex items-center gap-2 text-sm text-ink-800">
              <input
                type="radio"
                value="concentration"
                className="size-4 accent-olive-700"
                {...register('waterMode')}
              />
              Lye concentration
            </label>
            <label className="flex items-center gap-2 text-sm text-ink-800">
              <input
                type="radio"
                value="ratio"
                className="size-4 accent-olive-700"
                {...register('waterMode')}
              />
              Water:lye ratio
            </label>
          </fieldset>
          {waterMode === 'ratio' ? (
            <Field
              label="Water:lye ratio (water per 1 lye)"
              error={errors.waterLyeRatio?.message}
              hint="2 means 2 g of water for every gram of lye (from 1 to 4)."
            >
              <Input
                type="number"
                inputMode="decimal"
                step="any"
                {...register('waterLyeRatio', { setValueAs: toNumberOrNull })}
              />
            </Field>
          ) : (
            <Field
              label="Lye concentration (%)"
              error={errors.lyeConcentrationPct?.message}
              hint="Lye as a share of the lye solution, 20–50 %; 25–40 % is usual."
            >
              <Input
                type="number"
                inputMode="decimal"
                step="any"
                {...register('lyeConcentrationPct', { setValueAs: toNumberOrNull })}
              />
            </Field>
          )}
          <div className="hidden sm:block" />
          <Field
            label="Lye"
            error={errors.lyeIngredientId?.message}
            hint="Its purity sizes the lye on the batch sheet."
          >
            <Select {...register('lyeIngredientId', { setValueAs: toIdOrNull })}>
              <option value="">None chosen (100 % pure, not costed)</option>
              {ofKinds('lye').map((o) => (
                <option key={o.id} value={o.id}>
                  {o.name}
                  {o.purityPct != null ? ` (${o.purityPct} %)` : ''}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Water" error={errors.waterIngredientId?.message}>
            <Select {...register('waterIngredientId', { setValueAs: toIdOrNull })}>
              <option value="">None chosen (not costed)</option>
              {ofKinds('liquid').map((o) => (
                <option key={o.id} value={o.id}>
                  {o.name}
                </option>
              ))}
            </Select>
          </Field>
        </CardBody>
      </Card>

      <ItemSection
        list="fragrances"
        amount="pct"
        noun="Fragrance"
        amountLabel="% of oils"
        title="Fragrance"
        description="As a share of the oil weight, within each fragrance's maximum usage from its supplier's certificate."
        empty="No fragrance: an unscented bar."
        options={ofKinds('fragrance')}
        placeholder="Choose a fragrance…"
        addLabel="Add a fragrance"
        newAmount={undefined as unknown as number}
        control={control}
        register={register}
        errors={errors}
        below={(i) => <FragranceCheck control={control} index={i} options={options} />}
      />

      <ItemSection
        list="additives"
        amount="gPerKg"
        noun="Additive"
        amountLabel="g per kg of oils"
        title="Additives and colourants"
        description="Grams per kilogram of oils."
        options={ofKinds('additive', 'colourant')}
        placeholder="Choose an additive or colourant…"
        addLabel="Add an additive"
        newAmount={undefined as unknown as number}
        control={control}
        register={register}
        errors={errors}
      />

      <ItemSection
        list="packaging"
        amount="qtyPerBar"
        noun="Packaging"
        amountLabel="per bar"
        title="Packaging"
        description="Items per bar, such as a box and a label."
        options={ofKinds('packaging')}
        placeholder="Choose a packaging item…"
        addLabel="Add packaging"
        newAmount={1}
        control={control}
        register={register}
        errors={errors}
      />

      <Card>
        <CardHeader title="Mould and bars" />
        <CardBody className="grid gap-4 sm:grid-cols-2">
          <Field label="Oil weight for one mould (g)" error={errors.mouldOilWeightG?.message}>
            <Input
              type="number"
              inputMode="decimal"
              step="any"
              {...register('mouldOilWeightG', { valueAsNumber: true })}
            />
          </Field>
          <Field label="Cut bar weight (g)" error={errors.barWeightG?.message}>
            <Input
              type="number"
              inputMode="decimal"
              step="any"
              {...register('barWeightG', { valueAsNumber: true })}
            />
          </Field>
          <Field label="Bars per mould" error={errors.barsPerMould?.message}>
            <Input
              type="number"
              inputMode="numeric"
              step="1"
              {...register('barsPerMould', { valueAsNumber: true })}
            />
          </Field>
          <Field
            label="Bars kept back"
            error={errors.barsKeptBack?.message}
            hint="End slices and samples that are not sold; usually the two ends."
          >
            <Input
              type="number"
              inputMode="numeric"
              step="1"
              {...register('barsKeptBack', { valueAsNumber: true })}
            />
          </Field>
        </CardBody>
      </Card>

      <div className="flex flex-col-reverse gap-3 sm:flex-row sm:items-center sm:justify-end">
        {!addsUp ? (
          <p className="text-sm text-ink-700" id="save-hint">
            Save is possible once the oils add up to 100 % (within {OILS_SUM_TOLERANCE} %).
          </p>
        ) : null}
        <Button variant="secondary" onClick={onCancel} disabled={saving}>
          Cancel
        </Button>
        <Button
          type="submit"
          loading={saving}
          disabled={!addsUp}
          aria-describedby={!addsUp ? 'save-hint' : undefined}
        >
          Save recipe
        </Button>
      </div>
    </form>
  )
}

function Row({
  children,
  onRemove,
  removeLabel,
}: {
  children: ReactNode
  onRemove?: () => void
  removeLabel: string
}) {
  return (
    <div className="grid gap-2 border-b border-cream-200 pb-3 last:border-b-0 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)_5.5rem] sm:items-start sm:gap-3 sm:border-b-0 sm:pb-0">
      {children}
      <div className="flex justify-end sm:pt-7">
        {onRemove ? (
          <Button variant="ghost" size="sm" onClick={onRemove} aria-label={removeLabel}>
            Remove
          </Button>
        ) : null}
      </div>
    </div>
  )
}

type ItemList = 'fragrances' | 'additives' | 'packaging'
type ItemAmount = 'pct' | 'gPerKg' | 'qtyPerBar'

/**
 * A card of fragrance, additive or packaging lines: each an ingredient and its amount, removable,
 * and a button that adds an empty line (`newAmount` its starting amount). `below` adds something
 * under a line (the fragrance's usage check).
 */
function ItemSection({
  list,
  amount,
  noun,
  amountLabel,
  title,
  description,
  empty,
  options,
  placeholder,
  addLabel,
  newAmount,
  control,
  register,
  errors,
  below,
}: {
  list: ItemList
  amount: ItemAmount
  noun: string
  amountLabel: string
  title: string
  description: string
  empty?: string
  options: RecipeIngredientOption[]
  placeholder: string
  addLabel: string
  newAmount: number
  control: Control<Values>
  register: UseFormRegister<Values>
  errors: FieldErrors<Values>
  below?: (index: number) => ReactNode
}) {
  const rows = useFieldArray({ control, name: list })
  const rowErrors = errors[list] as
    | ({ ingredientId?: { message?: string } } & Partial<Record<ItemAmount, { message?: string }>>)[]
    | undefined
  return (
    <Card>
      <CardHeader title={title} description={description} />
      <CardBody className="flex flex-col gap-3">
        {rows.fields.length === 0 && empty ? <p className="text-sm text-ink-600">{empty}</p> : null}
        {rows.fields.map((row, i) => {
          const line = (
            <ItemRow
              list={list}
              amount={amount}
              noun={noun}
              index={i}
              amountLabel={amountLabel}
              register={register}
              options={options}
              placeholder={placeholder}
              errors={[rowErrors?.[i]?.ingredientId?.message, rowErrors?.[i]?.[amount]?.message]}
              onRemove={() => rows.remove(i)}
            />
          )
          return below ? (
            <div key={row.id} className="flex flex-col gap-1">
              {line}
              {below(i)}
            </div>
          ) : (
            <Fragment key={row.id}>{line}</Fragment>
          )
        })}
        <div>
          <Button
            variant="secondary"
            size="sm"
            onClick={() =>
              rows.append({ ingredientId: undefined as unknown as number, [amount]: newAmount } as never)
            }
          >
            {addLabel}
          </Button>
        </div>
      </CardBody>
    </Card>
  )
}

/**
 * One fragrance, additive or packaging line: the ingredient and its amount, with a remove button.
 * Labels number the rows ("Fragrance 2", "Fragrance 2 (% of oils)", "Remove fragrance 2").
 */
function ItemRow({
  list,
  amount,
  noun,
  index,
  amountLabel,
  register,
  options,
  placeholder,
  errors: [ingredientError, amountError],
  onRemove,
}: {
  list: ItemList
  amount: ItemAmount
  noun: string
  index: number
  amountLabel: string
  register: UseFormRegister<Values>
  options: RecipeIngredientOption[]
  placeholder: string
  errors: [string | undefined, string | undefined]
  onRemove: () => void
}) {
  const n = index + 1
  return (
    <Row onRemove={onRemove} removeLabel={`Remove ${noun.toLowerCase()} ${n}`}>
      <IngredientSelect
        label={`${noun} ${n}`}
        name={`${list}.${index}.ingredientId` as FieldPath<Values>}
        register={register}
        options={options}
        placeholder={placeholder}
        error={ingredientError}
      />
      <NumberField
        label={`${noun} ${n} (${amountLabel})`}
        name={`${list}.${index}.${amount}` as FieldPath<Values>}
        register={register}
        error={amountError}
      />
    </Row>
  )
}

function IngredientSelect({
  label,
  name,
  register,
  options,
  placeholder,
  error,
}: {
  label: string
  name: FieldPath<Values>
  register: UseFormRegister<Values>
  options: RecipeIngredientOption[]
  placeholder: string
  error?: string
}) {
  return (
    <Field label={label} error={error}>
      <Select {...register(name, { setValueAs: toId })}>
        <option value="">{placeholder}</option>
        {options.map((o) => (
          <option key={o.id} value={o.id}>
            {o.name}
          </option>
        ))}
      </Select>
    </Field>
  )
}

function NumberField({
  label,
  name,
  register,
  error,
}: {
  label: string
  name: FieldPath<Values>
  register: UseFormRegister<Values>
  error?: string
}) {
  return (
    <Field label={label} error={error}>
      <Input type="number" inputMode="decimal" step="any" {...register(name, { valueAsNumber: true })} />
    </Field>
  )
}

/** Warns as it is typed when a fragrance goes over its certificate's limit, or will brown the bars. */
function FragranceCheck({
  control,
  index,
  options,
}: {
  control: Control<Values>
  index: number
  options: RecipeIngredientOption[]
}) {
  const row = useWatch({ control, name: `fragrances.${index}` })
  const option = options.find((o) => o.id === Number(row?.ingredientId))
  if (!option) return null
  const pct = Number(row?.pct)
  const over = option.maxUsagePct != null && Number.isFinite(pct) && pct > option.maxUsagePct
  const browns = option.vanillinPct != null && option.vanillinPct > VANILLIN_WARN_PCT
  return (
    <div aria-live="polite" className="flex flex-col gap-1 text-sm">
      {over ? (
        <p className="font-medium text-clay-700">
          Over the maximum usage: {option.name} may be used at up to {option.maxUsagePct} % of the oils
          (supplier certificate). The recipe cannot be saved like this.
        </p>
      ) : option.maxUsagePct != null ? (
        <p className="text-ink-600">Maximum usage {option.maxUsagePct} % of the oils.</p>
      ) : null}
      {browns ? (
        <p className="text-honey-700">
          Contains {option.vanillinPct} % vanillin: expect the bars to brown as they cure.
        </p>
      ) : null}
    </div>
  )
}
