import { useState } from 'react'
import type { ShopAccount } from '@shared/schemas/shops'
import { Button } from '@/components/ui/button'
import { ConfirmDialog } from '@/components/ui/dialog'
import { toast } from '@/components/ui/toast'
import { useMoveShop } from '@/features/shops/api/accounts'
import type { StatusMove } from '@/features/shops/api/accounts'

const MOVES: Record<
  StatusMove,
  {
    label: string
    title: (n: string) => string
    message: string
    done: (n: string) => string
    danger: boolean
  }
> = {
  hold: {
    label: 'Put on hold',
    title: (n) => `Put ${n} on hold?`,
    message:
      'Its buyers can still sign in, look at the catalogue and their invoices, but new orders are refused until you reactivate the account.',
    done: (n) => `${n} is on hold.`,
    danger: false,
  },
  close: {
    label: 'Close account',
    title: (n) => `Close ${n}?`,
    message:
      'The shop can no longer order. Its buyers can still sign in to see past orders and invoices. You can reactivate it later.',
    done: (n) => `${n} is closed.`,
    danger: true,
  },
  reactivate: {
    label: 'Reactivate',
    title: (n) => `Reactivate ${n}?`,
    message: 'The shop can order again at its tier and terms.',
    done: (n) => `${n} is active again.`,
    danger: false,
  },
}

const AVAILABLE: Record<ShopAccount['status'], StatusMove[]> = {
  applied: [],
  declined: [],
  active: ['hold', 'close'],
  on_hold: ['reactivate', 'close'],
  closed: ['reactivate'],
}

/** Hold, close and reactivate, each behind a confirmation. */
export function StatusActions({ shop }: { shop: ShopAccount }) {
  const move = useMoveShop(shop.id)
  const [asking, setAsking] = useState<StatusMove | null>(null)
  const m = asking ? MOVES[asking] : null
  return (
    <>
      {AVAILABLE[shop.status].map((k) => (
        <Button key={k} variant={k === 'reactivate' ? 'primary' : 'secondary'} onClick={() => setAsking(k)}>
          {MOVES[k].label}
        </Button>
      ))}
      <ConfirmDialog
        open={asking !== null}
        onClose={() => setAsking(null)}
        title={m?.title(shop.tradingName) ?? ''}
        message={m?.message ?? ''}
        confirmLabel={m?.label ?? ''}
        danger={m?.danger ?? false}
        onConfirm={async () => {
          if (!asking) return
          await move.mutateAsync(asking)
          toast.success(MOVES[asking].done(shop.tradingName))
        }}
      />
    </>
  )
}
