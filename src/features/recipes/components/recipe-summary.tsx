import type { ReactNode } from 'react'
import { formatGrams } from '@shared/domain/units/units'
import type { Recipe } from '@shared/schemas/recipes'
import { Card, CardBody, CardHeader } from '@/components/ui/card'

const pct = (n: number) => `${Number(n.toFixed(3))} %`

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="min-w-0">
      <dt className="text-sm text-ink-600">{label}</dt>
      <dd className="mt-0.5 text-ink-900">{children}</dd>
    </div>
  )
}

/** One recipe at a glance: what goes in and how a mould is cut. */
export function RecipeSummary({ recipe }: { recipe: Recipe }) {
  const water =
    recipe.waterMode === 'concentration'
      ? `${pct(recipe.lyeConcentrationPct!)} lye solution`
      : `${Number(recipe.waterLyeRatio!.toFixed(3))}:1 water to lye`
  return (
    <Card>
      <CardHeader title="Formula" description={recipe.notes ?? undefined} />
      <CardBody className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <div>
          <h3 className="mb-2 text-sm font-medium text-ink-800">Oils and butters</h3>
          <ul className="divide-y divide-cream-200 rounded-md ring-1 ring-cream-300/60">
            {recipe.oils.map((o) => (
              <li key={o.ingredientId} className="flex justify-between gap-3 px-3 py-1.5 text-sm">
                <span className="text-ink-900">{o.name}</span>
                <span className="text-ink-700 tabular-nums">{pct(o.pct)}</span>
              </li>
            ))}
          </ul>
          {recipe.fragrances.length + recipe.additives.length + recipe.packaging.length > 0 ? (
            <ul className="mt-3 flex flex-col gap-1 text-sm text-ink-800">
              {recipe.fragrances.map((f) => (
                <li key={`f${f.ingredientId}`}>
                  <span className="text-ink-600">Fragrance:</span> {f.name}, {pct(f.pct)} of oils
                  {f.maxUsagePct != null ? (
                    <span className="text-ink-600"> (max {pct(f.maxUsagePct)})</span>
                  ) : null}
                </li>
              ))}
              {recipe.additives.map((a) => (
                <li key={`a${a.ingredientId}`}>
                  <span className="text-ink-600">{a.kind === 'colourant' ? 'Colourant' : 'Additive'}:</span>{' '}
                  {a.name}, {Number(a.gPerKg.toFixed(3))} g per kg of oils
                </li>
              ))}
              {recipe.packaging.map((p) => (
                <li key={`p${p.ingredientId}`}>
                  <span className="text-ink-600">Packaging:</span> {p.name}, {Number(p.qtyPerBar.toFixed(3))}{' '}
                  per bar
                </li>
              ))}
            </ul>
          ) : null}
        </div>
        <dl className="grid grid-cols-2 gap-4 self-start">
          <Fact label="Superfat">{pct(recipe.superfatPct)}</Fact>
          <Fact label="Water">{water}</Fact>
          <Fact label="Lye">
            {recipe.lye
              ? `${recipe.lye.name}${recipe.lye.purityPct != null ? `, ${pct(recipe.lye.purityPct)} pure` : ''}`
              : 'None chosen'}
          </Fact>
          <Fact label="Cure">{recipe.cureDays} days</Fact>
          <Fact label="One mould">{formatGrams(recipe.mouldOilWeightG)} of oils</Fact>
          <Fact label="Bars">
            {recipe.barsPerMould} of {formatGrams(recipe.barWeightG)}, {recipe.barsKeptBack} kept back
          </Fact>
          <Fact label="Labour">{recipe.labourMinutes} min per batch</Fact>
          <Fact label="Status">{recipe.archivedAt ? 'Archived' : 'In use'}</Fact>
        </dl>
      </CardBody>
    </Card>
  )
}
