// A starting figure for the batch form and the demo pours: how many bars a pour is likely to cut.

/**
 * Bars a batch is expected to cut into: the recipe's bars per mould for every mould of oils,
 * rescaled when the product is cut to another size than the recipe's bar (a guest bar of half the
 * weight gives twice the bars), and the recipe's kept-back end slices for every loaf poured. Only
 * a starting figure for the form; the owner enters what was actually cut.
 */
export function expectedBars(
  recipe: { mouldOilWeightG: number; barsPerMould: number; barWeightG: number; barsKeptBack: number },
  oilWeightG: number,
  cutWeightG: number,
): { moulds: number; barsCut: number; barsKeptBack: number } {
  const moulds = oilWeightG / recipe.mouldOilWeightG
  const barsCut = Math.max(
    1,
    Math.floor((moulds * recipe.barsPerMould * recipe.barWeightG) / cutWeightG + 1e-9),
  )
  const loaves = Math.max(1, Math.ceil(moulds - 1e-9))
  const barsKeptBack = Math.min(loaves * recipe.barsKeptBack, barsCut - 1)
  return { moulds: Math.round(moulds * 100) / 100, barsCut, barsKeptBack }
}
