import { describe, expect, it } from 'vitest'
import {
  applyAction,
  canTransition,
  isCancellableBy,
  isOrderStatus,
  nextActions,
  ORDER_STATUSES,
  type OrderAction,
  type OrderRole,
  type OrderStatus,
} from '@shared/domain/orders/order-status'

// Every allowed step, with who may take it (product rule). Every pair not listed must be refused.
const ALLOWED: { from: OrderStatus; to: OrderStatus; roles: OrderRole[] }[] = [
  { from: 'placed', to: 'confirmed', roles: ['owner'] },
  { from: 'placed', to: 'cancelled', roles: ['owner', 'buyer'] },
  { from: 'confirmed', to: 'packing', roles: ['owner', 'packer'] },
  { from: 'confirmed', to: 'cancelled', roles: ['owner'] },
  { from: 'packing', to: 'packed', roles: ['owner', 'packer'] },
  { from: 'packing', to: 'cancelled', roles: ['owner'] },
  { from: 'packed', to: 'shipped', roles: ['owner', 'packer'] },
  { from: 'packed', to: 'cancelled', roles: ['owner'] },
]
const ROLES: OrderRole[] = ['owner', 'packer', 'buyer']

const pairs = ORDER_STATUSES.flatMap((from) =>
  ORDER_STATUSES.flatMap((to) =>
    ROLES.map((role) => ({
      from,
      to,
      role,
      allowed: ALLOWED.some((a) => a.from === from && a.to === to && a.roles.includes(role)),
      source: 'product rule: order steps',
    })),
  ),
)

describe('canTransition', () => {
  it.each(pairs)('$from → $to as $role: $allowed ($source)', ({ from, to, role, allowed }) => {
    expect(canTransition(from, to, role)).toBe(allowed)
  })

  it.each([
    { from: 'placed', to: 'confirmed', expected: true, source: 'product rule' },
    { from: 'placed', to: 'packing', expected: false, source: 'product rule: no skipping' },
    { from: 'packed', to: 'packing', expected: false, source: 'product rule: no going back' },
    { from: 'shipped', to: 'cancelled', expected: false, source: 'product rule: shipped is final' },
    { from: 'cancelled', to: 'placed', expected: false, source: 'product rule: cancelled is final' },
    { from: 'placed', to: 'placed', expected: false, source: 'product rule' },
  ] as { from: OrderStatus; to: OrderStatus; expected: boolean; source: string }[])(
    '$from → $to for anyone: $expected ($source)',
    ({ from, to, expected }) => {
      expect(canTransition(from, to)).toBe(expected)
    },
  )
})

describe('nextActions', () => {
  it.each([
    {
      status: 'placed',
      role: 'owner',
      expected: [
        { action: 'confirm', to: 'confirmed' },
        { action: 'cancel', to: 'cancelled' },
      ],
      source: 'product rule',
    },
    {
      status: 'placed',
      role: 'buyer',
      expected: [{ action: 'cancel', to: 'cancelled' }],
      source: 'product rule',
    },
    { status: 'placed', role: 'packer', expected: [], source: 'product rule: packers work confirmed orders' },
    {
      status: 'confirmed',
      role: 'packer',
      expected: [{ action: 'start_packing', to: 'packing' }],
      source: 'product rule',
    },
    { status: 'confirmed', role: 'buyer', expected: [], source: 'product rule' },
    {
      status: 'packing',
      role: 'packer',
      expected: [{ action: 'finish_packing', to: 'packed' }],
      source: 'product rule',
    },
    {
      status: 'packed',
      role: 'owner',
      expected: [
        { action: 'ship', to: 'shipped' },
        { action: 'cancel', to: 'cancelled' },
      ],
      source: 'product rule',
    },
    {
      status: 'packed',
      role: 'packer',
      expected: [{ action: 'ship', to: 'shipped' }],
      source: 'product rule',
    },
    { status: 'shipped', role: 'owner', expected: [], source: 'product rule: final' },
    { status: 'cancelled', role: 'owner', expected: [], source: 'product rule: final' },
  ] as { status: OrderStatus; role: OrderRole; expected: unknown[]; source: string }[])(
    '$status as $role ($source)',
    ({ status, role, expected }) => {
      expect(nextActions(status, role)).toEqual(expected)
    },
  )

  it.each(pairs.filter((p) => p.from !== p.to))(
    'offers $from → $to to $role exactly when allowed ($source)',
    ({ from, to, role, allowed }) => {
      expect(nextActions(from, role).some((a) => a.to === to)).toBe(allowed)
    },
  )
})

describe('isCancellableBy', () => {
  it.each([
    { status: 'placed', role: 'buyer', expected: true, source: 'product rule: buyer while placed' },
    { status: 'confirmed', role: 'buyer', expected: false, source: 'product rule: buyer while placed' },
    { status: 'placed', role: 'owner', expected: true, source: 'product rule: owner before shipped' },
    { status: 'confirmed', role: 'owner', expected: true, source: 'product rule: owner before shipped' },
    { status: 'packing', role: 'owner', expected: true, source: 'product rule: owner before shipped' },
    { status: 'packed', role: 'owner', expected: true, source: 'product rule: owner before shipped' },
    { status: 'shipped', role: 'owner', expected: false, source: 'product rule: owner before shipped' },
    { status: 'cancelled', role: 'owner', expected: false, source: 'product rule: already cancelled' },
    { status: 'placed', role: 'packer', expected: false, source: 'product rule: packers never cancel' },
    { status: 'packing', role: 'packer', expected: false, source: 'product rule: packers never cancel' },
  ] as { status: OrderStatus; role: OrderRole; expected: boolean; source: string }[])(
    '$status by $role: $expected ($source)',
    ({ status, role, expected }) => {
      expect(isCancellableBy(status, role)).toBe(expected)
    },
  )
})

describe('applyAction', () => {
  it.each([
    { status: 'placed', action: 'confirm', role: 'owner', expected: 'confirmed', source: 'product rule' },
    {
      status: 'packing',
      action: 'finish_packing',
      role: 'packer',
      expected: 'packed',
      source: 'product rule',
    },
    { status: 'placed', action: 'cancel', role: 'buyer', expected: 'cancelled', source: 'product rule' },
  ] as {
    status: OrderStatus
    action: OrderAction
    role: OrderRole
    expected: OrderStatus
    source: string
  }[])('$action on $status as $role → $expected ($source)', ({ status, action, role, expected }) => {
    expect(applyAction(status, action, role)).toBe(expected)
  })

  it.each([
    {
      status: 'shipped',
      action: 'cancel',
      role: 'owner',
      code: 'invalid_transition',
      source: 'product rule',
    },
    { status: 'placed', action: 'ship', role: 'owner', code: 'invalid_transition', source: 'product rule' },
    {
      status: 'confirmed',
      action: 'cancel',
      role: 'buyer',
      code: 'forbidden_transition',
      source: 'product rule',
    },
    {
      status: 'placed',
      action: 'confirm',
      role: 'packer',
      code: 'forbidden_transition',
      source: 'product rule',
    },
  ] as { status: OrderStatus; action: OrderAction; role: OrderRole; code: string; source: string }[])(
    'refuses $action on $status as $role with $code ($source)',
    ({ status, action, role, code }) => {
      expect(() => applyAction(status, action, role)).toThrow(
        expect.objectContaining({ code, field: 'status' }),
      )
    },
  )
})

describe('isOrderStatus', () => {
  it.each([
    { value: 'packed', expected: true, source: 'product rule' },
    { value: 'delivered', expected: false, source: 'bad input' },
    { value: undefined, expected: false, source: 'bad input' },
  ])('$value → $expected ($source)', ({ value, expected }) => {
    expect(isOrderStatus(value)).toBe(expected)
  })
})
