import { useId, useState } from 'react'
import { ORDER_STATUSES } from '@shared/domain/orders/order-status'
import { ORDER_STATUS_LABELS } from '@shared/schemas/orders'
import { Button } from '@/components/ui/button'
import { Input, Select } from '@/components/ui/field'
import type { OrderFilters } from '@/features/orders/api/orders'

type Props = {
  value: OrderFilters
  onChange: (next: OrderFilters) => void
  /** The owner filters by shop; a buyer sees their own shop only. */
  shops?: { id: number; name: string }[]
}

/** Status, shop, placed dates and a number-or-PO search; any change starts again at page 1. */
export function OrderFiltersBar({ value, onChange, shops }: Props) {
  const ids = { status: useId(), shop: useId(), from: useId(), to: useId(), q: useId() }
  const [q, setQ] = useState(value.q ?? '')
  const set = (patch: Partial<OrderFilters>) => onChange({ ...value, ...patch, page: 1 })
  const label = 'text-sm font-medium text-ink-800'
  return (
    <>
      <form
        role="search"
        className="flex flex-col gap-1"
        onSubmit={(e) => {
          e.preventDefault()
          set({ q: q.trim() || undefined })
        }}
      >
        <label htmlFor={ids.q} className={label}>
          Order or PO number
        </label>
        <div className="flex gap-2">
          <Input
            id={ids.q}
            type="search"
            value={q}
            onChange={(e) => setQ(e.target.value)}
            className="w-44"
            autoComplete="off"
          />
          <Button type="submit" variant="secondary">
            Find
          </Button>
        </div>
      </form>
      <div className="flex flex-col gap-1">
        <label htmlFor={ids.status} className={label}>
          Status
        </label>
        <Select
          id={ids.status}
          value={value.status ?? ''}
          onChange={(e) => set({ status: e.target.value || undefined })}
          className="w-40"
        >
          <option value="">Any status</option>
          {ORDER_STATUSES.map((s) => (
            <option key={s} value={s}>
              {ORDER_STATUS_LABELS[s]}
            </option>
          ))}
        </Select>
      </div>
      {shops ? (
        <div className="flex flex-col gap-1">
          <label htmlFor={ids.shop} className={label}>
            Shop
          </label>
          <Select
            id={ids.shop}
            value={value.shopId ? String(value.shopId) : ''}
            onChange={(e) => set({ shopId: e.target.value ? Number(e.target.value) : undefined })}
            className="w-48"
          >
            <option value="">Every shop</option>
            {shops.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </Select>
        </div>
      ) : null}
      <div className="flex flex-col gap-1">
        <label htmlFor={ids.from} className={label}>
          Placed from
        </label>
        <Input
          id={ids.from}
          type="date"
          value={value.from ?? ''}
          onChange={(e) => set({ from: e.target.value || undefined })}
          className="w-40"
        />
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={ids.to} className={label}>
          Placed to
        </label>
        <Input
          id={ids.to}
          type="date"
          value={value.to ?? ''}
          onChange={(e) => set({ to: e.target.value || undefined })}
          className="w-40"
        />
      </div>
    </>
  )
}
