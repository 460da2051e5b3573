/**
 * The order a packer walks the shelves in: by the batch's shelf location, then SKU, then lot age
 * (oldest ready first, then the older batch). Locations compare as people read them, numbers by
 * value ("Rack 2" before "Rack 10") and without regard to case; a batch with no location comes
 * last, where the packer has to look for it.
 */
export type WalkKey = {
  location: string | null
  sku: string
  readyDate: string
  batchId: number
}

const collator = new Intl.Collator('en', { numeric: true, sensitivity: 'base' })

function blank(location: string | null) {
  return location === null || location.trim() === ''
}

export function compareWalk(a: WalkKey, b: WalkKey): number {
  const aBlank = blank(a.location)
  const bBlank = blank(b.location)
  if (aBlank !== bBlank) return aBlank ? 1 : -1
  return (
    (aBlank ? 0 : collator.compare(a.location!.trim(), b.location!.trim())) ||
    collator.compare(a.sku, b.sku) ||
    (a.readyDate < b.readyDate ? -1 : a.readyDate > b.readyDate ? 1 : 0) ||
    a.batchId - b.batchId
  )
}

/** A copy of the stops in walking order. */
export function walkOrder<T extends WalkKey>(stops: readonly T[]): T[] {
  return [...stops].sort(compareWalk)
}
