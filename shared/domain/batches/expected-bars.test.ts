import { describe, expect, it } from 'vitest'
import { expectedBars } from '@shared/domain/batches/expected-bars'

// The demo recipes' mould: 1100 g of oils cuts 12 bars of 130 g, with the two end slices kept back
// (common practice: the end slices of a loaf are trims or samples).
const mould = { mouldOilWeightG: 1100, barsPerMould: 12, barWeightG: 130, barsKeptBack: 2 }

describe('expectedBars', () => {
  it.each([
    {
      oil: 1100,
      cut: 130,
      bars: 12,
      kept: 2,
      moulds: 1,
      source: 'one mould as the recipe says (hand calculation)',
    },
    {
      oil: 3300,
      cut: 130,
      bars: 36,
      kept: 6,
      moulds: 3,
      source: '3 × 12 bars, 2 end slices per loaf (common practice)',
    },
    {
      oil: 2200,
      cut: 65,
      bars: 48,
      kept: 4,
      moulds: 2,
      source: 'half-weight guest bars: twice the bars, 2 × 12 × 130 ÷ 65 (hand calculation)',
    },
    {
      oil: 3300,
      cut: 195,
      bars: 24,
      kept: 6,
      moulds: 3,
      source: 'large blocks: ⌊3 × 12 × 130 ÷ 195⌋ = 24 (hand calculation)',
    },
    {
      oil: 1650,
      cut: 130,
      bars: 18,
      kept: 4,
      moulds: 1.5,
      source: 'a loaf and a half: 18 bars, two loaves’ end slices (hand calculation)',
    },
    {
      oil: 100,
      cut: 130,
      bars: 1,
      kept: 0,
      moulds: 0.09,
      source: 'a test pour still cuts one bar, and it is not kept back (hand calculation)',
    },
  ])('$source', ({ oil, cut, bars, kept, moulds }) => {
    expect(expectedBars(mould, oil, cut)).toEqual({ barsCut: bars, barsKeptBack: kept, moulds })
  })
})
