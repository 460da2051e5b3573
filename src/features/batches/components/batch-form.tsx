import { zodResolver } from '@hookform/resolvers/zod'
import { useEffect, useMemo, useRef, useState } from 'react'
import { useFieldArray, useForm, useWatch } from 'react-hook-form'
import { RecordBatchSchema } from '@shared/schemas/batches'
import type {
  BatchDetail,
  BatchSuggestion,
  PourableProduct,
  RecordBatchFormValues,
  RecordBatchInput,
  SuggestionLine,
} from '@shared/schemas/batches'
import { formatDate, isValidIsoDate } from '@shared/domain/dates/dates'
import { formatGrams } from '@shared/domain/units/units'
import { Button } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { Field, Input, Select, Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { Money } from '@/components/ui/money'
import { LoadingBlock } from '@/components/ui/spinner'
import { useRecordBatch } from '@/features/batches/api/record-batch'
import { useSuggestion } from '@/features/batches/api/suggest-lots'
import type { SuggestParams } from '@/features/batches/api/suggest-lots'
import { formatQuantity, localToday } from '@/features/batches/components/format'
import { LyeCautions } from '@/features/batches/components/lye-cautions'
import { applyApiErrors } from '@/lib/form-errors'

const ROLE_LABELS: Record<SuggestionLine['role'], string> = {
  oil: 'Oil',
  lye: 'Lye',
  water: 'Water',
  fragrance: 'Fragrance',
  additive: 'Additive',
  packaging: 'Packaging',
}

function useDebounced<T>(value: T, ms = 350): T {
  const [v, setV] = useState(value)
  useEffect(() => {
    const id = setTimeout(() => setV(value), ms)
    return () => clearTimeout(id)
  }, [value, ms])
  return v
}

const positive = (v: unknown) => {
  const n = typeof v === 'number' ? v : Number(v)
  return v !== '' && v != null && Number.isFinite(n) && n > 0 ? n : undefined
}
const whole = (v: unknown, min: number) => {
  const n = typeof v === 'number' ? v : Number(v)
  return v !== '' && v != null && Number.isInteger(n) && n >= min ? n : undefined
}

/** Every lot the ingredients could come from, in the order the form lists them. */
function lotRows(s: BatchSuggestion) {
  return s.lines.flatMap((line) =>
    line.lots.map((lot) => ({
      line,
      lot,
      quantity: line.takes.find((t) => t.ingredientLotId === lot.ingredientLotId)?.quantity ?? 0,
    })),
  )
}

/**
 * The pour form: product and size first, then the lots each ingredient comes from (oldest first
 * as suggested, quantities editable), the bars cut, and what the batch will be called and when it
 * will be ready.
 */
export function BatchForm({
  products,
  onRecorded,
  plan,
  currency,
}: {
  products: PourableProduct[]
  onRecorded: (b: BatchDetail) => void
  /** A planned pour to start from: its product and oil weight; recording the batch marks it poured. */
  plan?: { id: number; productId: number; oilWeightG: number; description: string } | null
  /** The studio's currency (settings) for the estimated cost. */
  currency: string
}) {
  const record = useRecordBatch()
  const [formError, setFormError] = useState<string | null>(null)
  const [barsTouched, setBarsTouched] = useState(false)
  const [applied, setApplied] = useState<BatchSuggestion | null>(null)
  const appliedKey = useRef('')

  const form = useForm<RecordBatchFormValues, unknown, RecordBatchInput>({
    resolver: zodResolver(RecordBatchSchema),
    defaultValues: {
      productId: plan ? plan.productId : '',
      pourDate: localToday(),
      oilWeightG: plan ? plan.oilWeightG : '',
      plannedPourId: plan ? plan.id : null,
      barsCut: '',
      barsKeptBack: '',
      keptBackReason: 'End slices',
      location: '',
      notes: '',
      lots: [],
    },
  })
  const { errors } = form.formState
  const lotsArray = useFieldArray({ control: form.control, name: 'lots' })
  const [productId, oilWeightG, pourDate, barsCut, barsKeptBack, lotValues] = useWatch({
    control: form.control,
    name: ['productId', 'oilWeightG', 'pourDate', 'barsCut', 'barsKeptBack', 'lots'],
  })
  const product = products.find((p) => String(p.id) === String(productId)) ?? null

  const params = useDebounced<SuggestParams | null>(
    useMemo(() => {
      if (!product) return null
      return {
        productId: product.id,
        oilWeightG: positive(oilWeightG),
        pourDate: typeof pourDate === 'string' && isValidIsoDate(pourDate) ? pourDate : undefined,
        ...(barsTouched ? { barsCut: whole(barsCut, 1), barsKeptBack: whole(barsKeptBack, 0) } : {}),
      }
    }, [product, oilWeightG, pourDate, barsCut, barsKeptBack, barsTouched]),
  )
  const suggestion = useSuggestion(params)
  const s =
    suggestion.data && params && suggestion.data.productId === params.productId ? suggestion.data : null

  // A new suggestion (another product, size, day or bar count) puts its lots into the form;
  // the same one fetched again leaves the owner's edits alone.
  useEffect(() => {
    if (!s) return
    const key = JSON.stringify([s.productId, s.oilWeightG, s.pourDate, s.barsCut, s.barsKeptBack])
    if (key === appliedKey.current) return
    appliedKey.current = key
    if (!barsTouched) {
      form.setValue('barsCut', s.barsCut)
      form.setValue('barsKeptBack', s.barsKeptBack)
    }
    lotsArray.replace(
      lotRows(s).map((r) => ({ ingredientLotId: r.lot.ingredientLotId, quantity: r.quantity })),
    )
    setApplied(s)
  }, [s, barsTouched, form, lotsArray])

  const rows = applied ? lotRows(applied) : []
  const rowFields = rows.map((_, i) => `lots.${i}.quantity`)
  const takenFor = (ingredientId: number) =>
    rows.reduce(
      (sum, r, i) =>
        r.line.ingredientId === ingredientId ? sum + (Number(lotValues?.[i]?.quantity) || 0) : sum,
      0,
    )

  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      const { batch } = await record.mutateAsync(values)
      onRecorded(batch)
    } catch (err) {
      setFormError(
        applyApiErrors(err, form.setError, [
          'productId',
          'pourDate',
          'oilWeightG',
          'barsCut',
          'barsKeptBack',
          'keptBackReason',
          'location',
          'notes',
          ...rowFields,
          ...rows.map((_, i) => `lots.${i}.ingredientLotId`),
        ]),
      )
    }
  })

  const keptBack = Number(barsKeptBack) || 0
  const blocked = s?.warnings.some((w) => w.code === 'fragrance_over_max') ?? false
  const lye = s?.lines.find((l) => l.role === 'lye')
  const water = s?.lines.find((l) => l.role === 'water')

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-6" aria-label="Record a batch">
      <FormError message={formError} />
      {plan && String(productId) === String(plan.productId) ? (
        <p
          className="rounded-card bg-olive-50 px-4 py-3 text-sm text-olive-800 ring-1 ring-olive-200"
          role="status"
        >
          {plan.description} Recording this batch marks the plan poured.
        </p>
      ) : null}
      <Card>
        <CardHeader title="What was poured" />
        <CardBody className="grid gap-4 sm:grid-cols-2">
          <Field label="Product" error={errors.productId?.message} className="sm:col-span-2">
            <Select
              {...form.register('productId', {
                onChange: (e: { target: { value: string } }) => {
                  const p = products.find((x) => String(x.id) === e.target.value)
                  form.setValue('oilWeightG', p ? p.mouldOilWeightG : '')
                  // Another product than the plan's is a batch of its own.
                  if (plan && String(plan.productId) !== e.target.value) form.setValue('plannedPourId', null)
                  setBarsTouched(false)
                  setApplied(null)
                  appliedKey.current = ''
                  lotsArray.replace([])
                },
              })}
            >
              <option value="">Choose a product…</option>
              {products.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name} ({p.sku}){p.active ? '' : ' – inactive'}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Pour date" error={errors.pourDate?.message}>
            <Input type="date" max={localToday()} {...form.register('pourDate')} />
          </Field>
          <Field
            label="Oil weight (g)"
            hint={
              product
                ? `One ${product.recipeName} mould takes ${formatGrams(product.mouldOilWeightG)} of oils.`
                : 'Choose a product first.'
            }
            error={errors.oilWeightG?.message}
          >
            <Input type="number" inputMode="decimal" step="any" min={1} {...form.register('oilWeightG')} />
          </Field>
        </CardBody>
      </Card>

      {product && suggestion.isError && !s ? (
        <FormError title="This batch cannot be worked out" message={suggestion.error.message} />
      ) : null}

      {product ? (
        <Card>
          <CardHeader
            title="Ingredient lots"
            description="Suggested oldest first. Change a quantity to what you actually took; 0 leaves a lot untouched."
          />
          <CardBody className="flex flex-col gap-5">
            {!applied ? (
              <LoadingBlock label="Working out the batch…" />
            ) : (
              <>
                {applied.shortfalls.length ? (
                  <FormError
                    title="Not enough on hand"
                    message={
                      <ul className="list-disc pl-5">
                        {applied.shortfalls.map((f) => (
                          <li key={f.ingredientId}>
                            {f.name}: {formatQuantity(f.needed, f.unit)} needed,{' '}
                            {formatQuantity(f.available, f.unit)} on hand by the pour date (short by{' '}
                            {formatQuantity(f.shortBy, f.unit)}). Record a purchase or pour a smaller batch.
                          </li>
                        ))}
                      </ul>
                    }
                  />
                ) : null}
                {applied.warnings.map((w) => (
                  <p
                    key={`${w.code}-${w.ingredientId}`}
                    role={w.code === 'fragrance_over_max' ? 'alert' : undefined}
                    className="text-sm text-honey-700"
                  >
                    {w.message}
                  </p>
                ))}
                <ul className="flex flex-col gap-4">
                  {applied.lines.map((line) => {
                    const taken = takenFor(line.ingredientId)
                    return (
                      <li key={line.ingredientId} className="rounded-md border border-cream-300 p-3">
                        <div className="flex flex-wrap items-baseline justify-between gap-2">
                          <p className="font-medium text-ink-900">
                            {line.name}{' '}
                            <span className="text-sm font-normal text-ink-600">{ROLE_LABELS[line.role]}</span>
                          </p>
                          <p className="text-sm text-ink-700 tabular-nums">
                            Needs {formatQuantity(line.needed, line.unit)} · taking{' '}
                            {formatQuantity(Math.round(taken * 100) / 100, line.unit)}
                          </p>
                        </div>
                        {line.lots.length === 0 ? (
                          <p className="mt-2 text-sm text-clay-700">
                            No lot of {line.name} on hand by the pour date.
                          </p>
                        ) : (
                          <div className="mt-2 grid gap-3 sm:grid-cols-2">
                            {rows.map((r, i) =>
                              r.line.ingredientId === line.ingredientId ? (
                                <Field
                                  key={lotsArray.fields[i]?.id ?? i}
                                  label={`${line.name} from ${r.lot.supplierLotCode ?? `lot #${r.lot.ingredientLotId}`} (${line.unit === 'each' ? 'pieces' : 'g'})`}
                                  hint={`${r.lot.supplier}, received ${formatDate(r.lot.receivedOn)}; ${formatQuantity(r.lot.remaining, line.unit)} left`}
                                  error={
                                    errors.lots?.[i]?.quantity?.message ??
                                    errors.lots?.[i]?.ingredientLotId?.message
                                  }
                                >
                                  <Input
                                    type="number"
                                    inputMode="decimal"
                                    step={line.unit === 'each' ? 1 : 'any'}
                                    min={0}
                                    {...form.register(`lots.${i}.quantity`)}
                                  />
                                </Field>
                              ) : null,
                            )}
                          </div>
                        )}
                      </li>
                    )
                  })}
                </ul>
                {applied.untracked.length ? (
                  <p className="text-sm text-ink-700">
                    Not drawn from any lot (the recipe names no ingredient):{' '}
                    {applied.untracked.map((u) => `${u.name} ${formatGrams(u.grams)}`).join(', ')}.
                  </p>
                ) : null}
              </>
            )}
          </CardBody>
        </Card>
      ) : null}

      {product ? (
        <Card>
          <CardHeader
            title="Bars cut"
            description="What came out of the moulds once cut. End slices and samples kept back are not sold."
          />
          <CardBody className="grid gap-4 sm:grid-cols-2">
            <Field label="Bars cut" error={errors.barsCut?.message}>
              <Input
                type="number"
                inputMode="numeric"
                step={1}
                min={1}
                {...form.register('barsCut', { onChange: () => setBarsTouched(true) })}
              />
            </Field>
            <Field label="Bars kept back" error={errors.barsKeptBack?.message}>
              <Input
                type="number"
                inputMode="numeric"
                step={1}
                min={0}
                {...form.register('barsKeptBack', { onChange: () => setBarsTouched(true) })}
              />
            </Field>
            {keptBack > 0 ? (
              <Field
                label="Why kept back"
                optional
                error={errors.keptBackReason?.message}
                className="sm:col-span-2"
              >
                <Input maxLength={200} {...form.register('keptBackReason')} />
              </Field>
            ) : null}
            <Field
              label="Location"
              optional
              hint="The rack or shelf it cures on."
              error={errors.location?.message}
            >
              <Input maxLength={60} {...form.register('location')} />
            </Field>
            <Field label="Notes" optional error={errors.notes?.message}>
              <Textarea rows={2} {...form.register('notes')} />
            </Field>
          </CardBody>
        </Card>
      ) : null}

      {s ? (
        <Card>
          <CardHeader title="This batch will be" />
          <CardBody className="flex flex-col gap-4">
            <dl className="grid gap-3 text-sm sm:grid-cols-2 lg:grid-cols-4">
              <div>
                <dt className="text-ink-700">Lot code</dt>
                <dd className="font-mono text-base font-medium text-ink-900" data-testid="lot-code-preview">
                  {s.lotCode}
                </dd>
              </div>
              <div>
                <dt className="text-ink-700">Ready on</dt>
                <dd className="text-base font-medium text-ink-900" data-testid="ready-date-preview">
                  {formatDate(s.readyDate)}
                </dd>
                <dd className="text-ink-600">after a {s.cureDays}-day cure</dd>
              </div>
              <div>
                <dt className="text-ink-700">Sellable bars</dt>
                <dd className="text-base font-medium text-ink-900">{s.sellableBars}</dd>
              </div>
              <div>
                <dt className="text-ink-700">Cost per bar (estimate)</dt>
                <dd className="text-base font-medium text-ink-900">
                  {s.estimatedCostPerBarCents == null ? (
                    '—'
                  ) : (
                    <Money cents={s.estimatedCostPerBarCents} currency={currency} />
                  )}
                </dd>
                <dd className="text-ink-600">frozen from the lots actually used</dd>
              </div>
            </dl>
            {lye ? (
              <p className="text-sm text-ink-800">
                Weigh {formatGrams(lye.needed)} of {lye.name}
                {water ? ` into ${formatGrams(water.needed)} of ${water.name}` : ''}.
              </p>
            ) : null}
            <LyeCautions />
          </CardBody>
        </Card>
      ) : null}

      <div className="flex flex-wrap justify-end gap-2">
        <Button type="submit" loading={record.isPending} disabled={!product || !applied || blocked}>
          Record the batch
        </Button>
      </div>
    </form>
  )
}
