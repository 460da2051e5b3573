import { useCallback } from 'react'
import { useSearchParams } from 'react-router-dom'

/**
 * A list page's filters kept in its address: the search parameters, and a setter that sets one
 * (or removes it when given null or '') without adding a history entry, so Back leaves the page.
 */
export function useSearchFilters() {
  const [search, setSearch] = useSearchParams()
  const setParam = useCallback(
    (key: string, value: string | null) =>
      setSearch(
        (prev) => {
          const next = new URLSearchParams(prev)
          if (value) next.set(key, value)
          else next.delete(key)
          return next
        },
        { replace: true },
      ),
    [setSearch],
  )
  return [search, setParam] as const
}
