import type { OrderStatus } from '@shared/domain/orders/order-status'
import { ORDER_STATUS_LABELS } from '@shared/schemas/orders'
import { Badge } from '@/components/ui/badge'
import type { BadgeTone } from '@/components/ui/badge'

const TONES: Record<OrderStatus, BadgeTone> = {
  placed: 'honey',
  confirmed: 'sky',
  packing: 'sky',
  packed: 'green',
  shipped: 'green',
  cancelled: 'neutral',
}

export function OrderStatusBadge({ status }: { status: OrderStatus }) {
  return <Badge tone={TONES[status]}>{ORDER_STATUS_LABELS[status]}</Badge>
}
