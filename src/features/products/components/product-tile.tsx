import { cn } from '@/lib/cn'

// Soft tiles in the studio's palette; the SKU picks one, so a product keeps its colour everywhere.
const TILES = [
  'bg-olive-100 text-olive-900 ring-olive-200',
  'bg-clay-100 text-clay-700 ring-clay-300/60',
  'bg-honey-100 text-honey-700 ring-honey-500/30',
  'bg-cream-200 text-ink-800 ring-cream-300',
  'bg-olive-200 text-olive-900 ring-olive-300',
] as const

function tileFor(sku: string) {
  let h = 0
  for (let i = 0; i < sku.length; i++) h = (h * 31 + sku.charCodeAt(i)) >>> 0
  return TILES[h % TILES.length]!
}

const sizes = {
  sm: 'size-10 rounded-md text-[0.625rem]',
  lg: 'aspect-square w-full max-w-56 rounded-card text-xl',
} as const

/**
 * The product's photo, or where there is none a coloured tile that names the bar by its SKU, so a
 * list without photos still reads as a catalogue.
 */
export function ProductTile({
  sku,
  name,
  photoUrl,
  size = 'sm',
  className,
}: {
  sku: string
  name: string
  photoUrl?: string | null
  size?: keyof typeof sizes
  className?: string
}) {
  if (photoUrl) {
    return (
      <img
        src={photoUrl}
        alt={size === 'sm' ? '' : `Photo of ${name}`}
        className={cn('shrink-0 object-cover ring-1 ring-cream-300', sizes[size], className)}
        loading="lazy"
      />
    )
  }
  return (
    <span
      aria-hidden={size === 'sm' ? true : undefined}
      role={size === 'sm' ? undefined : 'img'}
      aria-label={size === 'sm' ? undefined : `${name}: no photo yet`}
      className={cn(
        'inline-flex shrink-0 items-center justify-center p-1 text-center font-medium tracking-wide break-all ring-1 ring-inset',
        tileFor(sku),
        sizes[size],
        className,
      )}
    >
      {sku}
    </span>
  )
}
