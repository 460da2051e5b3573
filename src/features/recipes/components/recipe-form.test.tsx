import { render, screen, waitFor } from '@testing-library/react'
import userEvent from '@testing-library/user-event'
import { describe, expect, it, vi } from 'vitest'
import type { RecipeIngredientOption, RecipeInput } from '@shared/schemas/recipes'
import { ApiError } from '@/lib/api-client'
import { RecipeForm } from '@/features/recipes/components/recipe-form'

const opt = (
  id: number,
  name: string,
  kind: RecipeIngredientOption['kind'],
  extra: Partial<RecipeIngredientOption> = {},
) => ({
  id,
  name,
  kind,
  sapNaoh: kind === 'oil' ? 0.135 : null,
  purityPct: kind === 'lye' ? 99 : null,
  maxUsagePct: null,
  vanillinPct: null,
  unit: kind === 'packaging' ? ('each' as const) : ('g' as const),
  ...extra,
})

const options: RecipeIngredientOption[] = [
  opt(1, 'Olive oil', 'oil'),
  opt(2, 'Coconut oil', 'oil'),
  opt(3, 'Sodium hydroxide', 'lye'),
  opt(4, 'Distilled water', 'liquid'),
  opt(5, 'Peppermint essential oil', 'fragrance', { maxUsagePct: 3 }),
  opt(6, 'Honey oat fragrance', 'fragrance', { maxUsagePct: 5, vanillinPct: 1.8 }),
  opt(7, 'Kaolin clay', 'additive'),
  opt(8, 'Ultramarine blue', 'colourant'),
  opt(9, 'Kraft box', 'packaging'),
]

function renderForm(onSave = vi.fn(async (_input: RecipeInput) => {})) {
  render(<RecipeForm recipe={null} options={options} onSave={onSave} onCancel={() => {}} saving={false} />)
  return onSave
}

async function fillBasics(user: ReturnType<typeof userEvent.setup>) {
  await user.type(screen.getByLabelText('Name'), 'Mint bar')
  await user.selectOptions(screen.getByLabelText('Oil 1'), 'Olive oil')
  await user.type(screen.getByLabelText('Oil 1 share (%)'), '70')
  await user.type(screen.getByLabelText('Oil weight for one mould (g)'), '1000')
  await user.type(screen.getByLabelText('Cut bar weight (g)'), '120')
  await user.type(screen.getByLabelText('Bars per mould'), '10')
  // happy-dom does not show a select's numeric default value (browsers do, see the e2e test), so
  // the lye and water are chosen by hand here.
  await user.selectOptions(screen.getByLabelText('Lye'), 'Sodium hydroxide (99 %)')
  await user.selectOptions(screen.getByLabelText('Water'), 'Distilled water')
}

describe('RecipeForm', () => {
  it('adds, fills and removes additive and packaging lines, and saves them with their amounts', async () => {
    const user = userEvent.setup()
    const onSave = renderForm()
    await fillBasics(user)
    await user.clear(screen.getByLabelText('Oil 1 share (%)'))
    await user.type(screen.getByLabelText('Oil 1 share (%)'), '100')
    await user.click(screen.getByRole('button', { name: 'Add an additive' }))
    await user.click(screen.getByRole('button', { name: 'Add an additive' }))
    await user.selectOptions(screen.getByLabelText('Additive 1'), 'Kaolin clay')
    await user.type(screen.getByLabelText('Additive 1 (g per kg of oils)'), '10')
    await user.selectOptions(screen.getByLabelText('Additive 2'), 'Ultramarine blue')
    await user.type(screen.getByLabelText('Additive 2 (g per kg of oils)'), '0.5')
    await user.click(screen.getByRole('button', { name: 'Remove additive 1' }))
    expect(screen.queryByLabelText('Additive 2')).toBeNull()
    await user.click(screen.getByRole('button', { name: 'Add packaging' }))
    // A packaging line starts at one item per bar.
    expect(screen.getByLabelText('Packaging 1 (per bar)')).toHaveValue(1)
    await user.selectOptions(screen.getByLabelText('Packaging 1'), 'Kraft box')
    await user.click(screen.getByRole('button', { name: 'Save recipe' }))
    await waitFor(() => expect(onSave).toHaveBeenCalledTimes(1))
    expect(onSave.mock.calls[0]![0]).toMatchObject({
      additives: [{ ingredientId: 8, gPerKg: 0.5 }],
      packaging: [{ ingredientId: 9, qtyPerBar: 1 }],
      fragrances: [],
    })
  })

  it('keeps Save off until the oils add up to 100 %, showing the running sum', async () => {
    const user = userEvent.setup()
    const onSave = renderForm()
    await fillBasics(user)
    expect(screen.getByText(/Oils add up to 70 % — 30 % to go/)).toBeInTheDocument()
    expect(screen.getByRole('button', { name: 'Save recipe' })).toBeDisabled()
    await user.click(screen.getByRole('button', { name: 'Add an oil' }))
    await user.selectOptions(screen.getByLabelText('Oil 2'), 'Coconut oil')
    await user.type(screen.getByLabelText('Oil 2 share (%)'), '40')
    expect(screen.getByText(/10 % too much/)).toBeInTheDocument()
    expect(screen.getByRole('button', { name: 'Save recipe' })).toBeDisabled()
    await user.clear(screen.getByLabelText('Oil 2 share (%)'))
    await user.type(screen.getByLabelText('Oil 2 share (%)'), '30')
    expect(screen.getByText('Oils add up to 100 % ✓')).toBeInTheDocument()
    await user.click(screen.getByRole('button', { name: 'Save recipe' }))
    await waitFor(() => expect(onSave).toHaveBeenCalledTimes(1))
    expect(onSave.mock.calls[0]![0]).toMatchObject({
      name: 'Mint bar',
      oils: [
        { ingredientId: 1, pct: 70 },
        { ingredientId: 2, pct: 30 },
      ],
      lyeIngredientId: 3,
      waterIngredientId: 4,
      superfatPct: 5,
      lyeConcentrationPct: 33,
      waterLyeRatio: null,
      cureDays: 28,
    })
  })

  it('warns as it is typed when a fragrance is over its maximum usage, and of vanillin browning', async () => {
    const user = userEvent.setup()
    renderForm()
    await user.click(screen.getByRole('button', { name: 'Add a fragrance' }))
    await user.selectOptions(screen.getByLabelText('Fragrance 1'), 'Peppermint essential oil')
    await user.type(screen.getByLabelText('Fragrance 1 (% of oils)'), '4')
    expect(screen.getByText(/Over the maximum usage/)).toBeInTheDocument()
    await user.clear(screen.getByLabelText('Fragrance 1 (% of oils)'))
    await user.type(screen.getByLabelText('Fragrance 1 (% of oils)'), '2')
    expect(screen.queryByText(/Over the maximum usage/)).not.toBeInTheDocument()
    await user.selectOptions(screen.getByLabelText('Fragrance 1'), 'Honey oat fragrance')
    expect(screen.getByText(/1\.8 % vanillin: expect the bars to brown/)).toBeInTheDocument()
  })

  it('puts the server’s refusal on the fragrance row', async () => {
    const user = userEvent.setup()
    const onSave = vi.fn(async (_input: RecipeInput) => {
      throw new ApiError(422, 'fragrance_over_max', 'Over its maximum usage.', [
        {
          field: 'fragrances.0.pct',
          message: 'Peppermint essential oil at 2 % of oils is over its maximum usage of 1 %.',
        },
      ])
    })
    renderForm(onSave)
    await fillBasics(user)
    await user.clear(screen.getByLabelText('Oil 1 share (%)'))
    await user.type(screen.getByLabelText('Oil 1 share (%)'), '100')
    await user.click(screen.getByRole('button', { name: 'Add a fragrance' }))
    await user.selectOptions(screen.getByLabelText('Fragrance 1'), 'Peppermint essential oil')
    await user.type(screen.getByLabelText('Fragrance 1 (% of oils)'), '2')
    await user.click(screen.getByRole('button', { name: 'Save recipe' }))
    expect(await screen.findByText(/over its maximum usage of 1 %/)).toBeInTheDocument()
    expect(screen.getByLabelText('Fragrance 1 (% of oils)')).toHaveAttribute('aria-invalid', 'true')
  })

  it('asks for the ratio when the water is set by a water:lye ratio', async () => {
    const user = userEvent.setup()
    const onSave = renderForm()
    await fillBasics(user)
    await user.clear(screen.getByLabelText('Oil 1 share (%)'))
    await user.type(screen.getByLabelText('Oil 1 share (%)'), '100')
    await user.click(screen.getByLabelText('Water:lye ratio'))
    await user.click(screen.getByRole('button', { name: 'Save recipe' }))
    expect(await screen.findByText('Enter the water:lye ratio.')).toBeInTheDocument()
    expect(onSave).not.toHaveBeenCalled()
    await user.type(screen.getByLabelText(/Water:lye ratio \(water per 1 lye\)/), '2.5')
    await user.click(screen.getByRole('button', { name: 'Save recipe' }))
    await waitFor(() => expect(onSave).toHaveBeenCalledTimes(1))
    expect(onSave.mock.calls[0]![0]).toMatchObject({
      waterMode: 'ratio',
      waterLyeRatio: 2.5,
      lyeConcentrationPct: null,
    })
  })
})
