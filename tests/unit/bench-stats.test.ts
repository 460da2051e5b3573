/** The benchmark's pure helpers: summaries of rounds, paired ratios, goal checks and the manifest walk. */
import { describe, expect, it } from 'vitest'
import { checkGoal, median, pairedRatio, summarize, table } from '../../scripts/bench/stats'
import { filesLoadedBy } from '../../scripts/bench/client-size'

describe('median', () => {
  it.each([
    // The middle value of an odd count, the mean of the middle two of an even one (the usual definition; from memory).
    { values: [3], expected: 3 },
    { values: [5, 1, 3], expected: 3 },
    { values: [4, 1, 3, 2], expected: 2.5 },
    { values: [10, 10, 1000], expected: 10 },
  ])('median of $values is $expected', ({ values, expected }) => {
    expect(median(values)).toBe(expected)
  })

  it('refuses an empty list', () => {
    expect(() => median([])).toThrow()
  })
})

describe('summarize', () => {
  it('reports the median and the spread (max − min) ÷ median in percent', () => {
    const s = summarize([90, 100, 110])
    expect(s).toMatchObject({ median: 100, min: 90, max: 110, rounds: [90, 100, 110] })
    expect(s.spreadPct).toBeCloseTo(20, 10)
  })

  it('reports no spread for a median of 0 rather than dividing by it', () => {
    expect(summarize([0, 0, 0]).spreadPct).toBe(0)
  })
})

describe('pairedRatio', () => {
  it('divides each round by the bare round beside it, then takes the median', () => {
    // Rounds 1–3: 0.5, 0.6, 0.4 → median 0.5 (a slow round on both sides does not skew it).
    expect(pairedRatio([50, 30, 80], [100, 50, 200])).toBeCloseTo(0.5, 10)
  })

  it('refuses rounds that do not pair up', () => {
    expect(() => pairedRatio([1, 2], [1])).toThrow()
    expect(() => pairedRatio([], [])).toThrow()
  })
})

describe('checkGoal', () => {
  const goal = { id: 'g', label: 'g', unit: '' }
  it.each([
    { kind: 'atLeast' as const, limit: 0.5, value: 0.5, met: true },
    { kind: 'atLeast' as const, limit: 0.5, value: 0.49, met: false },
    { kind: 'under' as const, limit: 50, value: 49.9, met: true },
    { kind: 'under' as const, limit: 50, value: 50, met: false },
    { kind: 'within' as const, limit: 1.3, value: 1.3, met: true },
    { kind: 'within' as const, limit: 1.3, value: 1.31, met: false },
    { kind: 'within' as const, limit: 0, value: 0, met: true },
    { kind: 'atLeast' as const, limit: 0.5, value: Number.NaN, met: false },
  ])('$kind $limit with $value → met $met', ({ kind, limit, value, met }) => {
    expect(checkGoal({ ...goal, kind, limit, value }).met).toBe(met)
  })
})

describe('table', () => {
  it('pads every column to its widest cell under a rule', () => {
    expect(
      table([
        ['a', 'bb'],
        ['ccc', 'd'],
      ]),
    ).toBe(['a    bb', '---  --', 'ccc  d'].join('\n'))
  })
})

describe('filesLoadedBy', () => {
  const manifest = {
    'index.html': {
      file: 'assets/index.js',
      isEntry: true,
      imports: ['_vendor.js'],
      css: ['assets/index.css'],
    },
    '_vendor.js': { file: 'assets/vendor.js' },
    'src/page.tsx': { file: 'assets/page.js', imports: ['_form.js', '_vendor.js'] },
    '_form.js': { file: 'assets/form.js', imports: ['_zod.js'], css: ['assets/form.css'] },
    '_zod.js': { file: 'assets/zod.js' },
    'src/other.tsx': { file: 'assets/other.js' },
  }

  it('follows static imports transitively, with their CSS, each file once', () => {
    expect(filesLoadedBy(manifest, ['index.html', 'src/page.tsx'])).toEqual([
      'assets/form.css',
      'assets/form.js',
      'assets/index.css',
      'assets/index.js',
      'assets/page.js',
      'assets/vendor.js',
      'assets/zod.js',
    ])
  })

  it('leaves out pages that were not opened', () => {
    expect(filesLoadedBy(manifest, ['index.html'])).not.toContain('assets/other.js')
  })

  it('refuses a key the build does not know', () => {
    expect(() => filesLoadedBy(manifest, ['src/missing.tsx'])).toThrow(/not in the manifest/)
  })
})
