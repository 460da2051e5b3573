import { Button } from '@/components/ui/button'

/** Previous / next over pages the server cuts (`page`, `pageSize`, `total` of the list answer). */
export function Pager({
  page,
  pageSize,
  total,
  onPage,
}: {
  page: number
  pageSize: number
  total: number
  onPage: (page: number) => void
}) {
  const pages = Math.max(1, Math.ceil(total / pageSize))
  if (total <= pageSize && page === 1) return null
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1
  const last = Math.min(total, page * pageSize)
  return (
    <nav
      aria-label="Pages of orders"
      className="flex flex-col gap-2 sm:flex-row sm:items-center sm:justify-between"
    >
      <p className="text-sm text-ink-700 tabular-nums">
        {first}–{last} of {total}
      </p>
      <div className="flex items-center gap-2">
        <Button size="sm" variant="secondary" onClick={() => onPage(page - 1)} disabled={page <= 1}>
          Previous page
        </Button>
        <span className="px-1 text-sm whitespace-nowrap text-ink-700 tabular-nums">
          Page {page} of {pages}
        </span>
        <Button size="sm" variant="secondary" onClick={() => onPage(page + 1)} disabled={page >= pages}>
          Next page
        </Button>
      </div>
    </nav>
  )
}
