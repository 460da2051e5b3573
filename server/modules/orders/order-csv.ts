import { toCsv } from '@shared/domain/csv/csv'
import { isoToday } from '@shared/domain/dates/dates'
import type { OrderListQuery } from '@shared/schemas/orders'
import { ORDER_STATUS_LABELS } from '@shared/schemas/orders'
import { spreadsheetSafe } from '@server/modules/invoices/spreadsheet'
import { listOrders } from '@server/modules/orders/order-queries'
import type { OrderViewer } from '@server/modules/orders/order-queries'

/** Enough for years of a small studio's orders; a larger export is narrowed by the filters. */
export const CSV_MAX_ORDERS = 10_000

const amount = (cents: number | undefined) => ((cents ?? 0) / 100).toFixed(2)

/**
 * One row per order line (the order's own columns repeated), newest order first, with the same
 * filters as the list. Text that people typed (PO, shop and product names) is made spreadsheet-safe.
 */
export async function ordersCsv(
  viewer: OrderViewer,
  filter: OrderListQuery,
  timeZone: string,
): Promise<string> {
  const { items } = await listOrders(viewer, { ...filter, page: 1 }, timeZone, CSV_MAX_ORDERS)
  const header = [
    'Order',
    'Placed on',
    'Status',
    'Shop',
    'PO number',
    'SKU',
    'Product',
    'Cases',
    'Bars',
    'Pre-order promised for',
    'Unit price',
    'Line total',
    'Order merchandise',
    'Order shipping',
    'Order tax',
    'Order total',
  ]
  const rows = items.flatMap((o) =>
    o.lines.map((l) => [
      o.number,
      isoToday(new Date(o.placedAt), timeZone),
      ORDER_STATUS_LABELS[o.status],
      spreadsheetSafe(o.shopName),
      spreadsheetSafe(o.poNumber ?? ''),
      l.sku,
      spreadsheetSafe(l.name),
      String(l.cases),
      String(l.bars),
      l.preorder ? (l.promisedDate ?? '') : '',
      amount(l.unitPriceCents),
      amount(l.lineTotalCents),
      amount(o.subtotalCents),
      amount(o.shippingCents),
      amount(o.taxCents),
      amount(o.totalCents),
    ]),
  )
  return toCsv([header, ...rows])
}
