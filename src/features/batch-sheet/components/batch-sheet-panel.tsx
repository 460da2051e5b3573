import { useId, useState } from 'react'
import type { FormEvent } from 'react'
import type { BatchLine } from '@shared/domain/batch-sheet/batch-sheet'
import { formatGrams, formatOunces } from '@shared/domain/units/units'
import type { RecipeBatchSheet } from '@shared/schemas/batch-sheet'
import { Button, buttonClasses } from '@/components/ui/button'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { LoadingBlock } from '@/components/ui/spinner'
import { Stat } from '@/components/ui/stat'
import { batchSheetPdfHref, useRecipeBatchSheet } from '@/features/batch-sheet/api/batch-sheet'
import type { SheetSize } from '@/features/batch-sheet/api/batch-sheet'
import { LyeCautions } from '@/features/batch-sheet/components/lye-cautions'

type Basis = 'mould' | 'oilWeight' | 'bars'

const ROLE_LABEL: Record<BatchLine['role'], string> = {
  oil: 'Oil / butter',
  lye: 'Lye',
  water: 'Water',
  fragrance: 'Fragrance',
  additive: 'Additive',
}

const pct = (n: number) => `${Number(n.toFixed(2))} %`

function waterText(sheet: RecipeBatchSheet) {
  return sheet.water.mode === 'concentration'
    ? `${pct(sheet.water.pct)} lye solution`
    : `${Number(sheet.water.ratio.toFixed(2))}:1 water to lye`
}

/** A recipe's batch sheet sized by its mould, an oil weight or a number of bars; with the PDF. */
export function BatchSheetPanel({
  recipeId,
  mouldOilWeightG,
}: {
  recipeId: number
  mouldOilWeightG: number
}) {
  const [basis, setBasis] = useState<Basis>('mould')
  const [amount, setAmount] = useState('')
  const [size, setSize] = useState<SheetSize>({})
  const [inputError, setInputError] = useState<string | null>(null)
  const sheet = useRecipeBatchSheet(recipeId, size)
  const amountId = useId()

  function apply(event: FormEvent) {
    event.preventDefault()
    setInputError(null)
    if (basis === 'mould') return setSize({})
    const n = Number(amount)
    if (basis === 'bars') {
      if (!Number.isInteger(n) || n < 1 || n > 1000)
        return setInputError('Enter a whole number of bars from 1 to 1000.')
      return setSize({ bars: n })
    }
    if (!Number.isFinite(n) || n <= 0 || n > 100_000)
      return setInputError('Enter an oil weight in grams, up to 100,000.')
    setSize({ oilWeightG: n })
  }

  const data = sheet.data
  return (
    <div className="flex flex-col gap-5">
      <form
        onSubmit={apply}
        noValidate
        className="flex flex-col gap-4 sm:flex-row sm:flex-wrap sm:items-end"
        aria-label="Size the batch"
      >
        <fieldset className="flex flex-col gap-2">
          <legend className="mb-1.5 text-sm font-medium text-ink-800">Size the batch by</legend>
          <div className="flex flex-wrap gap-x-5 gap-y-2">
            {(
              [
                ['mould', `One mould (${formatGrams(mouldOilWeightG)} of oils)`],
                ['oilWeight', 'Oil weight'],
                ['bars', 'Number of bars'],
              ] as const
            ).map(([value, label]) => (
              <label key={value} className="flex items-center gap-2 text-sm text-ink-800">
                <input
                  type="radio"
                  name="basis"
                  value={value}
                  checked={basis === value}
                  onChange={() => {
                    setBasis(value)
                    setInputError(null)
                  }}
                  className="size-4 accent-olive-700"
                />
                {label}
              </label>
            ))}
          </div>
        </fieldset>
        {basis !== 'mould' ? (
          <Field
            id={amountId}
            label={basis === 'bars' ? 'Bars to cut' : 'Oils (g)'}
            error={inputError}
            className="sm:w-40"
          >
            <Input
              type="number"
              inputMode={basis === 'bars' ? 'numeric' : 'decimal'}
              step={basis === 'bars' ? '1' : 'any'}
              value={amount}
              onChange={(e) => setAmount(e.target.value)}
            />
          </Field>
        ) : null}
        <Button type="submit" variant="secondary">
          Show sheet
        </Button>
        <a
          href={batchSheetPdfHref(recipeId, size)}
          download
          className={buttonClasses('primary', 'md', 'sm:ml-auto')}
        >
          Download PDF
        </a>
      </form>

      {sheet.isError ? <FormError message={sheet.error.message} /> : null}
      {!data ? (
        sheet.isPending ? (
          <LoadingBlock label="Working out the batch…" />
        ) : null
      ) : (
        <>
          <div className="grid grid-cols-2 gap-3 lg:grid-cols-5">
            <Stat label="Oils" value={formatGrams(data.oilsG)} hint={formatOunces(data.oilsG)} />
            <Stat
              label={`Lye (${data.lyeName})`}
              value={formatGrams(data.naohG)}
              hint={`${pct(data.lyePurityPct)} pure, ${pct(data.superfatPct)} superfat`}
              tone="clay"
            />
            <Stat label="Water" value={formatGrams(data.waterG)} hint={waterText(data)} />
            <Stat label="Whole batch" value={formatGrams(data.totalG)} hint={formatOunces(data.totalG)} />
            <Stat
              label="Bars expected"
              value={data.expectedBars}
              hint={`of ${formatGrams(data.barWeightG)}, ${data.barsKeptBack} kept back`}
            />
          </div>

          {data.warnings.length > 0 ? (
            <div
              role="alert"
              className="rounded-card border border-honey-500/40 bg-honey-50 px-4 py-3 text-sm"
            >
              <p className="font-medium text-honey-700">Check before pouring</p>
              <ul className="mt-1 list-disc pl-5 text-ink-800">
                {data.warnings.map((w) => (
                  <li key={`${w.code}-${w.ingredientId}`}>{w.message}</li>
                ))}
              </ul>
            </div>
          ) : null}

          <div
            className="overflow-x-auto rounded-card bg-white shadow-card ring-1 ring-cream-300/60"
            role="region"
            aria-label="Batch sheet table"
            tabIndex={0}
          >
            <table className="w-full border-collapse text-sm">
              <caption className="sr-only">What to weigh for this batch</caption>
              <thead className="border-b border-cream-300 bg-cream-50 text-xs tracking-wide text-ink-700 uppercase">
                <tr>
                  <th scope="col" className="px-4 py-2.5 text-left font-medium">
                    Ingredient
                  </th>
                  <th scope="col" className="px-3 py-2.5 text-left font-medium">
                    Kind
                  </th>
                  <th scope="col" className="px-3 py-2.5 text-right font-medium">
                    % of oils
                  </th>
                  <th scope="col" className="px-3 py-2.5 text-right font-medium">
                    Grams
                  </th>
                  <th scope="col" className="px-4 py-2.5 text-right font-medium">
                    Ounces
                  </th>
                </tr>
              </thead>
              <tbody>
                {data.lines.map((l, i) => (
                  <tr key={`${l.role}-${l.ingredientId ?? i}`} className="border-b border-cream-200">
                    <th
                      scope="row"
                      className={`px-4 py-2 text-left font-normal ${l.role === 'lye' ? 'font-medium text-clay-700' : 'text-ink-900'}`}
                    >
                      {l.name}
                    </th>
                    <td className="px-3 py-2 whitespace-nowrap text-ink-700">{ROLE_LABEL[l.role]}</td>
                    <td className="px-3 py-2 text-right whitespace-nowrap text-ink-700 tabular-nums">
                      {pct(l.pctOfOils)}
                    </td>
                    <td className="px-3 py-2 text-right font-medium whitespace-nowrap text-ink-900 tabular-nums">
                      {formatGrams(l.grams)}
                    </td>
                    <td className="px-4 py-2 text-right whitespace-nowrap text-ink-700 tabular-nums">
                      {formatOunces(l.grams)}
                    </td>
                  </tr>
                ))}
              </tbody>
              <tfoot>
                <tr className="bg-cream-50">
                  <th scope="row" colSpan={3} className="px-4 py-2.5 text-left font-medium text-ink-900">
                    Whole batch
                  </th>
                  <td className="px-3 py-2.5 text-right font-medium whitespace-nowrap tabular-nums">
                    {formatGrams(data.totalG)}
                  </td>
                  <td className="px-4 py-2.5 text-right font-medium whitespace-nowrap tabular-nums">
                    {formatOunces(data.totalG)}
                  </td>
                </tr>
              </tfoot>
            </table>
          </div>

          <LyeCautions cautions={data.cautions} lyeName={data.lyeName} />
        </>
      )}
    </div>
  )
}
