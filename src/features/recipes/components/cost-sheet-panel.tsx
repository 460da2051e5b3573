import { useMemo, useState } from 'react'
import type { FormEvent } from 'react'
import { parseMoneyToCents, roundHalfUp } from '@shared/domain/money/money'
import { formatGrams } from '@shared/domain/units/units'
import type { CostSheet, CostSheetLine, Recipe } from '@shared/schemas/recipes'
import { Badge } from '@/components/ui/badge'
import { Button } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { Field, Input, Select } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { formatMoney } from '@/components/ui/money'
import { LoadingBlock } from '@/components/ui/spinner'
import { Stat } from '@/components/ui/stat'
import { useCostSheet } from '@/features/recipes/api/cost-sheet'
import type { CostSheetParams } from '@/features/recipes/api/cost-sheet'
import { CostChart } from '@/features/recipes/components/cost-chart'

const money = (cents: number, currency: string) => formatMoney(roundHalfUp(cents), currency)

/** Unit costs are cents per gram or per item; people think in price per kg or per item. */
function unitPrice(line: Pick<CostSheetLine, 'unit'>, centsPerUnit: number, currency: string) {
  return line.unit === 'each'
    ? `${money(centsPerUnit, currency)} each`
    : `${money(centsPerUnit * 1000, currency)}/kg`
}

function quantity(line: CostSheetLine) {
  if (line.unit === 'each') return `${Number(line.quantity.toFixed(2))} (${line.perBar} per bar)`
  return formatGrams(line.quantity)
}

/** What one mould costs at today's lot prices, where the cost goes, and a what-if on one price. */
export function CostSheetPanel({ recipe }: { recipe: Recipe }) {
  const [params, setParams] = useState<CostSheetParams>({})
  const [oilText, setOilText] = useState('')
  const [whatIfId, setWhatIfId] = useState('')
  const [whatIfPrice, setWhatIfPrice] = useState('')
  const [inputError, setInputError] = useState<{ field: 'oil' | 'price'; message: string } | null>(null)
  const cost = useCostSheet(recipe.id, params)
  const data = cost.data

  const priceable = useMemo(
    () =>
      (data?.lines ?? []).filter(
        (l): l is CostSheetLine & { ingredientId: number } => l.ingredientId != null,
      ),
    [data],
  )
  const chosen = priceable.find((l) => String(l.ingredientId) === whatIfId)
  const currentOfChosen = chosen
    ? chosen.overridden
      ? (data?.overrides.find((o) => o.ingredientId === chosen.ingredientId)?.currentUnitCostCents ?? null)
      : chosen.unitCostCents
    : null

  function apply(event: FormEvent) {
    event.preventDefault()
    setInputError(null)
    const next: CostSheetParams = {}
    if (oilText.trim() !== '') {
      const n = Number(oilText)
      if (!Number.isFinite(n) || n <= 0 || n > 100_000) {
        return setInputError({ field: 'oil', message: 'Enter an oil weight in grams, up to 100,000.' })
      }
      next.oilWeightG = n
    }
    if (whatIfId !== '' && whatIfPrice.trim() !== '') {
      const cents = parseMoneyToCents(whatIfPrice)
      if (cents == null) return setInputError({ field: 'price', message: 'Enter a price such as 9.50.' })
      const line = priceable.find((l) => String(l.ingredientId) === whatIfId)
      next.override = {
        ingredientId: Number(whatIfId),
        // Typed per kg for weighed ingredients, per item for packaging.
        centsPerUnit: line?.unit === 'each' ? cents : cents / 1000,
      }
    }
    setParams(next)
  }

  function clearWhatIf() {
    setWhatIfId('')
    setWhatIfPrice('')
    setParams((p) => ({ oilWeightG: p.oilWeightG }))
  }

  return (
    <div className="flex flex-col gap-5">
      <form
        onSubmit={apply}
        noValidate
        aria-label="Cost sheet options"
        className="grid gap-4 sm:grid-cols-[10rem_minmax(0,16rem)_10rem_auto] sm:items-start"
      >
        <Field
          label="Oils (g)"
          hint={`A mould is ${formatGrams(recipe.mouldOilWeightG)}.`}
          error={inputError?.field === 'oil' ? inputError.message : null}
        >
          <Input
            type="number"
            inputMode="decimal"
            step="any"
            placeholder={String(recipe.mouldOilWeightG)}
            value={oilText}
            onChange={(e) => setOilText(e.target.value)}
          />
        </Field>
        <Field label="What if this ingredient cost…">
          <Select value={whatIfId} onChange={(e) => setWhatIfId(e.target.value)}>
            <option value="">Choose an ingredient…</option>
            {priceable.map((l) => (
              <option key={l.ingredientId} value={l.ingredientId}>
                {l.name}
              </option>
            ))}
          </Select>
        </Field>
        <Field
          label={chosen?.unit === 'each' ? 'Price per item' : 'Price per kg'}
          hint={
            chosen && data && currentOfChosen != null
              ? `Now ${unitPrice(chosen, currentOfChosen, data.currency)}`
              : undefined
          }
          error={inputError?.field === 'price' ? inputError.message : null}
        >
          <Input
            inputMode="decimal"
            autoComplete="off"
            value={whatIfPrice}
            onChange={(e) => setWhatIfPrice(e.target.value)}
          />
        </Field>
        <div className="flex gap-2 sm:pt-7">
          <Button type="submit" variant="secondary">
            Work it out
          </Button>
          {params.override ? (
            <Button variant="ghost" onClick={clearWhatIf}>
              Clear what-if
            </Button>
          ) : null}
        </div>
      </form>

      {cost.isError ? <FormError message={cost.error.message} /> : null}
      {!data ? (
        cost.isPending ? (
          <LoadingBlock label="Costing the batch…" />
        ) : null
      ) : (
        <CostSheetBody data={data} />
      )}
    </div>
  )
}

function CostSheetBody({ data }: { data: CostSheet }) {
  const c = data.currency
  return (
    <>
      {data.overrides.length > 0 ? (
        <p
          role="status"
          className="rounded-md border border-sky-200 bg-sky-50 px-4 py-2 text-sm text-sky-900"
        >
          What-if:{' '}
          {data.overrides
            .map((o) => {
              const line = data.lines.find((l) => l.ingredientId === o.ingredientId)!
              return `${o.name} at ${unitPrice(line, o.centsPerUnit, c)}${o.currentUnitCostCents != null ? ` instead of ${unitPrice(line, o.currentUnitCostCents, c)}` : ''}`
            })
            .join('; ')}
          . Nothing is saved.
        </p>
      ) : null}
      <div className="grid grid-cols-2 gap-3 lg:grid-cols-4">
        <Stat
          label="Cost per sellable bar"
          value={formatMoney(data.costPerBarCents, c)}
          tone={data.missingCosts.length > 0 ? 'honey' : 'default'}
        />
        <Stat
          label="Whole batch"
          value={money(data.totalBatchCents, c)}
          hint={`${formatGrams(data.oilWeightG)} of oils`}
        />
        <Stat
          label="Sellable bars"
          value={data.sellableBars}
          hint={`${data.barsCut} cut, ${data.barsKeptBack} kept back`}
        />
        <Stat
          label="Labour"
          value={money(data.labourCents, c)}
          hint={`${data.labourMinutes} min at ${formatMoney(data.labourRateCents, c)}/h`}
        />
      </div>

      {data.warnings.length > 0 ? (
        <div role="alert" className="rounded-card border border-honey-500/40 bg-honey-50 px-4 py-3 text-sm">
          <p className="font-medium text-honey-700">Some costs are missing</p>
          <ul className="mt-1 list-disc pl-5 text-ink-800">
            {data.warnings.map((w, i) => (
              <li key={i}>{w.message}</li>
            ))}
          </ul>
        </div>
      ) : null}

      <div
        className="overflow-x-auto rounded-card bg-white shadow-card ring-1 ring-cream-300/60"
        role="region"
        aria-label="Cost sheet table"
        tabIndex={0}
      >
        <table className="w-full border-collapse text-sm">
          <caption className="sr-only">Cost of each ingredient for this batch</caption>
          <thead className="border-b border-cream-300 bg-cream-50 text-xs tracking-wide text-ink-700 uppercase">
            <tr>
              <th scope="col" className="px-4 py-2.5 text-left font-medium">
                Ingredient
              </th>
              <th scope="col" className="px-3 py-2.5 text-right font-medium">
                Quantity
              </th>
              <th scope="col" className="px-3 py-2.5 text-right font-medium">
                Unit cost
              </th>
              <th scope="col" className="px-4 py-2.5 text-right font-medium">
                Cost
              </th>
            </tr>
          </thead>
          <tbody>
            {data.lines.map((l, i) => (
              <tr key={`${l.role}-${l.ingredientId ?? i}`} className="border-b border-cream-200">
                <th scope="row" className="px-4 py-2 text-left font-normal text-ink-900">
                  <span className="inline-flex flex-wrap items-center gap-2">
                    {l.name}
                    {l.noCost ? <Badge tone="honey">No cost yet</Badge> : null}
                    {l.overridden ? <Badge tone="sky">What-if</Badge> : null}
                  </span>
                </th>
                <td className="px-3 py-2 text-right whitespace-nowrap text-ink-700 tabular-nums">
                  {quantity(l)}
                </td>
                <td className="px-3 py-2 text-right whitespace-nowrap text-ink-700 tabular-nums">
                  {l.unitCostCents == null ? '—' : unitPrice(l, l.unitCostCents, c)}
                </td>
                <td className="px-4 py-2 text-right whitespace-nowrap text-ink-900 tabular-nums">
                  {money(l.lineCostCents, c)}
                </td>
              </tr>
            ))}
          </tbody>
          <tfoot className="text-ink-900">
            <SumRow label="Ingredients" cents={data.ingredientCostCents} currency={c} />
            <SumRow
              label={`Packaging (${formatMoney(roundHalfUp(data.packagingPerBarCents), c)} per bar × ${data.sellableBars})`}
              cents={data.packagingCents}
              currency={c}
            />
            <SumRow label={`Labour (${data.labourMinutes} min)`} cents={data.labourCents} currency={c} />
            <SumRow label="Whole batch" cents={data.totalBatchCents} currency={c} strong />
            <tr className="bg-cream-50">
              <th scope="row" colSpan={3} className="px-4 py-2.5 text-left font-medium">
                Per sellable bar (÷ {data.sellableBars})
              </th>
              <td className="px-4 py-2.5 text-right font-medium whitespace-nowrap tabular-nums">
                {formatMoney(data.costPerBarCents, c)}
              </td>
            </tr>
          </tfoot>
        </table>
      </div>

      <Card>
        <CardHeader title="Where the cost goes" as="h3" />
        <CardBody>
          <CostChart breakdown={data.breakdown} currency={c} />
        </CardBody>
      </Card>
    </>
  )
}

function SumRow({
  label,
  cents,
  currency,
  strong,
}: {
  label: string
  cents: number
  currency: string
  strong?: boolean
}) {
  return (
    <tr className="border-b border-cream-200">
      <th
        scope="row"
        colSpan={3}
        className={`px-4 py-2 text-left ${strong ? 'font-medium' : 'font-normal text-ink-700'}`}
      >
        {label}
      </th>
      <td className={`px-4 py-2 text-right whitespace-nowrap tabular-nums ${strong ? 'font-medium' : ''}`}>
        {money(cents, currency)}
      </td>
    </tr>
  )
}
