/** Roles and what each may do, defined once: the server enforces, the client only hides. */
export const ROLES = ['owner', 'packer', 'buyer'] as const
export type Role = (typeof ROLES)[number]

export const RIGHTS = {
  'users.manage': ['owner'],
  'settings.manage': ['owner'],
  'ingredients.manage': ['owner'],
  'recipes.manage': ['owner'],
  'costs.view': ['owner'],
  'products.manage': ['owner'],
  'pricing.manage': ['owner'],
  'batches.manage': ['owner'],
  'batches.view': ['owner', 'packer'],
  'stock.adjust': ['owner', 'packer'],
  'shops.manage': ['owner'],
  'shop.own': ['buyer'],
  'catalogue.view': ['buyer'],
  'cart.use': ['buyer'],
  'orders.place': ['buyer'],
  'orders.view': ['owner', 'packer', 'buyer'],
  'orders.manage': ['owner'],
  'packing.work': ['owner', 'packer'],
  'invoices.view': ['owner', 'buyer'],
  'invoices.manage': ['owner'],
  'invoices.pay': ['buyer'],
  'payments.manage': ['owner'],
  'reports.view': ['owner'],
  'planning.manage': ['owner'],
} as const satisfies Record<string, readonly Role[]>

export type Right = keyof typeof RIGHTS

export function can(role: Role | null | undefined, right: Right): boolean {
  if (!role) return false
  return (RIGHTS[right] as readonly Role[]).includes(role)
}

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value)
}

export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Studio owner',
  packer: 'Packer',
  buyer: 'Shop buyer',
}
