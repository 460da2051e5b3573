import { DomainError } from '@shared/domain/errors'

/**
 * The life of an order. Stock is reserved when the order is placed, so every state before
 * `shipped` holds reserved bars: cancelling releases them, shipping turns them into shipped moves.
 *
 *   placed → confirmed → packing → packed → shipped
 *      └──────────┴──────────┴────────┴──→ cancelled
 */
export const ORDER_STATUSES = ['placed', 'confirmed', 'packing', 'packed', 'shipped', 'cancelled'] as const
export type OrderStatus = (typeof ORDER_STATUSES)[number]

export type OrderRole = 'owner' | 'packer' | 'buyer'

export const ORDER_ACTIONS = ['confirm', 'start_packing', 'finish_packing', 'ship', 'cancel'] as const
export type OrderAction = (typeof ORDER_ACTIONS)[number]

interface Step {
  action: OrderAction
  from: OrderStatus
  to: OrderStatus
  roles: readonly OrderRole[]
}

const STEPS: readonly Step[] = [
  { action: 'confirm', from: 'placed', to: 'confirmed', roles: ['owner'] },
  { action: 'start_packing', from: 'confirmed', to: 'packing', roles: ['owner', 'packer'] },
  { action: 'finish_packing', from: 'packing', to: 'packed', roles: ['owner', 'packer'] },
  { action: 'ship', from: 'packed', to: 'shipped', roles: ['owner', 'packer'] },
  // A buyer may take an order back only until the studio has confirmed it.
  { action: 'cancel', from: 'placed', to: 'cancelled', roles: ['owner', 'buyer'] },
  { action: 'cancel', from: 'confirmed', to: 'cancelled', roles: ['owner'] },
  { action: 'cancel', from: 'packing', to: 'cancelled', roles: ['owner'] },
  { action: 'cancel', from: 'packed', to: 'cancelled', roles: ['owner'] },
]

export function isOrderStatus(value: unknown): value is OrderStatus {
  return (ORDER_STATUSES as readonly unknown[]).includes(value)
}

/** Whether the step exists at all; with a role, whether that role may take it. */
export function canTransition(from: OrderStatus, to: OrderStatus, role?: OrderRole): boolean {
  return STEPS.some((s) => s.from === from && s.to === to && (role === undefined || s.roles.includes(role)))
}

/** The steps a role may take from a status, in the order a screen should offer them. */
export function nextActions(
  status: OrderStatus,
  role: OrderRole,
): { action: OrderAction; to: OrderStatus }[] {
  return STEPS.filter((s) => s.from === status && s.roles.includes(role)).map(({ action, to }) => ({
    action,
    to,
  }))
}

export function isCancellableBy(status: OrderStatus, role: OrderRole): boolean {
  return canTransition(status, 'cancelled', role)
}

/**
 * The status an action leads to, or a DomainError: 'invalid_transition' when the order's status
 * does not allow the action, 'forbidden_transition' when it does but not for this role.
 */
export function applyAction(status: OrderStatus, action: OrderAction, role: OrderRole): OrderStatus {
  const step = STEPS.find((s) => s.from === status && s.action === action)
  if (!step)
    throw new DomainError('invalid_transition', `An order that is ${status} cannot ${action}`, 'status')
  if (!step.roles.includes(role)) {
    throw new DomainError(
      'forbidden_transition',
      `A ${role} cannot ${action} an order that is ${status}`,
      'status',
    )
  }
  return step.to
}
