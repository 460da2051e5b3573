import type { Role } from '@shared/permissions'

/** Every route's path and href in one place. */
export const paths = {
  root: '/',
  signIn: '/sign-in',
  forgotPassword: '/forgot-password',
  setPassword: '/set-password',
  apply: '/apply',
  account: '/account',
  owner: {
    home: '/studio',
    team: '/studio/team',
    settings: '/studio/settings',
    accounts: '/studio/accounts',
    account: (id: number | string) => `/studio/accounts/${id}`,
    ingredients: '/studio/ingredients',
    ingredient: (id: number | string) => `/studio/ingredients/${id}`,
    purchases: '/studio/purchases',
    purchase: (id: number | string) => `/studio/purchases/${id}`,
    purchaseImport: '/studio/purchases/import',
    products: '/studio/products',
    productNew: '/studio/products/new',
    product: (id: number | string) => `/studio/products/${id}`,
    pricing: '/studio/pricing',
    recipes: '/studio/recipes',
    recipeNew: '/studio/recipes/new',
    recipe: (id: number | string) => `/studio/recipes/${id}`,
    recipeEdit: (id: number | string) => `/studio/recipes/${id}/edit`,
    batches: '/studio/batches',
    batchNew: '/studio/batches/new',
    batch: (id: number | string) => `/studio/batches/${id}`,
    trace: '/studio/trace',
    orders: '/studio/orders',
    order: (id: number | string) => `/studio/orders/${id}`,
    packing: '/studio/packing',
    packingOrder: (id: number | string) => `/studio/packing/orders/${id}`,
    invoices: '/studio/invoices',
    invoice: (id: number | string) => `/studio/invoices/${id}`,
    receivables: '/studio/receivables',
    plan: '/studio/plan',
    sales: '/studio/sales',
  },
  packer: {
    home: '/packing',
    order: (id: number | string) => `/packing/orders/${id}`,
    stock: '/packing/stock',
    batch: (id: number | string) => `/packing/stock/${id}`,
  },
  buyer: {
    home: '/shop',
    catalogue: '/shop/catalogue',
    cart: '/shop/cart',
    orders: '/shop/orders',
    order: (id: number | string) => `/shop/orders/${id}`,
    invoices: '/shop/invoices',
    cardReturn: (id: number | string) => `/shop/invoices/${id}/card-return`,
  },
} as const

export const homeFor: Record<Role, string> = {
  owner: paths.owner.home,
  packer: paths.packer.home,
  buyer: paths.buyer.home,
}

/** `group` names the sidebar section an item sits in. */
export type NavItem = { to: string; label: string; end?: boolean; group?: string }

/** Each role's own navigation. */
export const navFor: Record<Role, NavItem[]> = {
  owner: [
    { to: paths.owner.home, label: 'Today', end: true },
    { to: paths.owner.ingredients, label: 'Ingredients', group: 'Making' },
    { to: paths.owner.purchases, label: 'Purchases', group: 'Making' },
    { to: paths.owner.recipes, label: 'Recipes', group: 'Making' },
    { to: paths.owner.batches, label: 'Batches', group: 'Making' },
    { to: paths.owner.plan, label: 'Pour plan', group: 'Making' },
    { to: paths.owner.trace, label: 'Trace a lot', group: 'Making' },
    { to: paths.owner.orders, label: 'Orders', group: 'Selling' },
    { to: paths.owner.packing, label: 'Packing', group: 'Selling' },
    { to: paths.owner.products, label: 'Products', group: 'Selling' },
    { to: paths.owner.pricing, label: 'Pricing', group: 'Selling' },
    { to: paths.owner.accounts, label: 'Shop accounts', group: 'Selling' },
    { to: paths.owner.invoices, label: 'Invoices', group: 'Money' },
    { to: paths.owner.receivables, label: 'Receivables', group: 'Money' },
    { to: paths.owner.sales, label: 'Sales', group: 'Money' },
    { to: paths.owner.team, label: 'Team', group: 'Studio' },
    { to: paths.owner.settings, label: 'Settings', group: 'Studio' },
  ],
  packer: [
    { to: paths.packer.home, label: 'Packing', end: true },
    { to: paths.packer.stock, label: 'Stock' },
  ],
  buyer: [
    { to: paths.buyer.home, label: 'My account', end: true },
    { to: paths.buyer.catalogue, label: 'Catalogue' },
    { to: paths.buyer.cart, label: 'Cart' },
    { to: paths.buyer.orders, label: 'Orders' },
    { to: paths.buyer.invoices, label: 'Invoices' },
  ],
}
