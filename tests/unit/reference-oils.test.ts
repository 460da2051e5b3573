import { describe, expect, it } from 'vitest'
import { referenceOils } from '../../seeders/reference/oils'
import { saponifiedInci } from '@shared/domain/declaration/declaration'
import { sapKohToNaoh } from '@shared/domain/lye/lye'

const withRange = referenceOils.flatMap((oil) => (oil.sapRange ? [{ ...oil, ...oil.sapRange }] : []))

describe('reference oils', () => {
  it.each(withRange)('$name: $sapKoh mg KOH/g lies in $min–$max ($source)', ({ sapKoh, min, max }) => {
    expect(sapKoh).toBeGreaterThanOrEqual(min)
    expect(sapKoh).toBeLessThanOrEqual(max)
  })

  it('has a published range for every oil but the two butters REFERENCES.md lacks (from memory)', () => {
    expect(referenceOils.filter((o) => o.sapRange === null).map((o) => o.name)).toEqual([
      'Shea butter',
      'Cocoa butter',
    ])
  })

  it.each(referenceOils.map((oil) => ({ ...oil, source: oil.sapRange?.source ?? 'from memory' })))(
    '$name converts to a plausible NaOH value ($source)',
    ({ sapKoh }) => {
      // Soap oils sit between about 0.12 and 0.19 g NaOH per g (castor to coconut, Codex CXS 210-1999 and BP 1993 ranges)
      expect(sapKohToNaoh(sapKoh)).toBeGreaterThan(0.12)
      expect(sapKohToNaoh(sapKoh)).toBeLessThan(0.19)
    },
  )

  it('has unique names and INCI names (hand calculation)', () => {
    expect(new Set(referenceOils.map((o) => o.name)).size).toBe(referenceOils.length)
    expect(new Set(referenceOils.map((o) => o.inci)).size).toBe(referenceOils.length)
  })

  it.each([
    { name: 'Olive oil', saponified: 'Sodium Olivate', source: 'supplier INCI lists (REFERENCES.md)' },
    { name: 'Coconut oil', saponified: 'Sodium Cocoate', source: 'supplier INCI lists (REFERENCES.md)' },
    { name: 'Palm oil', saponified: 'Sodium Palmate', source: 'supplier INCI lists (REFERENCES.md)' },
    { name: 'Castor oil', saponified: 'Sodium Castorate', source: 'supplier INCI lists (REFERENCES.md)' },
    {
      name: 'Shea butter',
      saponified: 'Sodium Shea Butterate',
      source: 'supplier INCI lists (REFERENCES.md)',
    },
  ])('$name INCI saponifies to $saponified ($source)', ({ name, saponified }) => {
    const oil = referenceOils.find((o) => o.name === name)
    expect(saponifiedInci(oil!.inci)).toBe(saponified)
  })
})
