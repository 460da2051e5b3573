import { createBrowserRouter } from 'react-router-dom'
import { paths } from '@/config/paths'
import type { Role } from '@shared/permissions'
import { HomeRedirect } from '@/app/routes/guards'

/** A role's pages, gated by a lazy element loaded beside the page's own chunk. */
const roleGate = (roles: Role[]) => () =>
  import('@/app/routes/signed-in-layout').then(({ RoleGate }) => ({ element: <RoleGate roles={roles} /> }))
import { RouteError } from '@/app/routes/route-error'

// Every page is its own chunk: the sign-in page loads only what it needs.
export function createRouter() {
  return createBrowserRouter([
    {
      errorElement: <RouteError />,
      children: [
        { path: paths.root, element: <HomeRedirect /> },
        { path: paths.signIn, lazy: () => import('@/app/routes/sign-in') },
        { path: paths.apply, lazy: () => import('@/app/routes/apply') },
        { path: paths.forgotPassword, lazy: () => import('@/app/routes/forgot-password') },
        { path: paths.setPassword, lazy: () => import('@/app/routes/set-password') },
        {
          lazy: () => import('@/app/routes/signed-in-layout'),
          children: [
            { path: paths.account, lazy: () => import('@/app/routes/account') },
            {
              lazy: roleGate(['owner']),
              children: [
                { path: paths.owner.home, lazy: () => import('@/app/routes/owner-home') },
                { path: paths.owner.team, lazy: () => import('@/app/routes/owner-team') },
                { path: paths.owner.settings, lazy: () => import('@/app/routes/owner-settings') },
                { path: paths.owner.accounts, lazy: () => import('@/app/routes/owner-accounts') },
                { path: paths.owner.account(':shopId'), lazy: () => import('@/app/routes/owner-account') },
                { path: paths.owner.ingredients, lazy: () => import('@/app/routes/owner-ingredients') },
                {
                  path: paths.owner.ingredient(':ingredientId'),
                  lazy: () => import('@/app/routes/owner-ingredient'),
                },
                { path: paths.owner.purchases, lazy: () => import('@/app/routes/owner-purchases') },
                {
                  path: paths.owner.purchaseImport,
                  lazy: () => import('@/app/routes/owner-purchase-import'),
                },
                {
                  path: paths.owner.purchase(':purchaseId'),
                  lazy: () => import('@/app/routes/owner-purchase'),
                },
                { path: paths.owner.products, lazy: () => import('@/app/routes/owner-products') },
                { path: paths.owner.productNew, lazy: () => import('@/app/routes/owner-product') },
                { path: paths.owner.product(':productId'), lazy: () => import('@/app/routes/owner-product') },
                { path: paths.owner.pricing, lazy: () => import('@/app/routes/owner-pricing') },
                { path: paths.owner.recipes, lazy: () => import('@/app/routes/owner-recipes') },
                { path: paths.owner.recipeNew, lazy: () => import('@/app/routes/owner-recipe-edit') },
                { path: paths.owner.recipe(':recipeId'), lazy: () => import('@/app/routes/owner-recipe') },
                {
                  path: paths.owner.recipeEdit(':recipeId'),
                  lazy: () => import('@/app/routes/owner-recipe-edit'),
                },
                { path: paths.owner.batches, lazy: () => import('@/app/routes/owner-batches') },
                { path: paths.owner.batchNew, lazy: () => import('@/app/routes/owner-batch-new') },
                { path: paths.owner.batch(':batchId'), lazy: () => import('@/app/routes/batch') },
                { path: paths.owner.trace, lazy: () => import('@/app/routes/owner-trace') },
                { path: paths.owner.orders, lazy: () => import('@/app/routes/owner-orders') },
                { path: paths.owner.order(':orderId'), lazy: () => import('@/app/routes/owner-order') },
                { path: paths.owner.packing, lazy: () => import('@/app/routes/packer-queue') },
                {
                  path: paths.owner.packingOrder(':orderId'),
                  lazy: () => import('@/app/routes/packer-order'),
                },
                { path: paths.owner.invoices, lazy: () => import('@/app/routes/owner-invoices') },
                { path: paths.owner.invoice(':invoiceId'), lazy: () => import('@/app/routes/owner-invoice') },
                { path: paths.owner.receivables, lazy: () => import('@/app/routes/owner-receivables') },
                { path: paths.owner.plan, lazy: () => import('@/app/routes/owner-plan') },
                { path: paths.owner.sales, lazy: () => import('@/app/routes/owner-sales') },
              ],
            },
            {
              lazy: roleGate(['packer']),
              children: [
                { path: paths.packer.home, lazy: () => import('@/app/routes/packer-queue') },
                { path: paths.packer.order(':orderId'), lazy: () => import('@/app/routes/packer-order') },
                { path: paths.packer.stock, lazy: () => import('@/app/routes/packer-stock') },
                { path: paths.packer.batch(':batchId'), lazy: () => import('@/app/routes/batch') },
              ],
            },
            {
              lazy: roleGate(['buyer']),
              children: [
                { path: paths.buyer.home, lazy: () => import('@/app/routes/buyer-home') },
                { path: paths.buyer.catalogue, lazy: () => import('@/app/routes/buyer-catalogue') },
                { path: paths.buyer.cart, lazy: () => import('@/app/routes/buyer-cart') },
                { path: paths.buyer.orders, lazy: () => import('@/app/routes/buyer-orders') },
                { path: paths.buyer.order(':orderId'), lazy: () => import('@/app/routes/buyer-order') },
                { path: paths.buyer.invoices, lazy: () => import('@/app/routes/buyer-invoices') },
                {
                  path: paths.buyer.cardReturn(':invoiceId'),
                  lazy: () => import('@/app/routes/buyer-card-return'),
                },
              ],
            },
            { path: '*', lazy: () => import('@/app/routes/not-found').then((m) => ({ Component: m.NotFound })) },
          ],
        },
      ],
    },
  ])
}
