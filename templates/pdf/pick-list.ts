import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces.js'
import { formatDate } from '@shared/domain/dates/dates'
import type { PickListDto } from '@shared/schemas/packing'
import type { Settings } from '@shared/schemas/settings'
import { PALETTE, TABLE_LAYOUT, pageFooter, studioHeader } from '@server/lib/pdf'
import { tickBox } from './packing-slip'

/**
 * The shelf walk for one or more orders: the batch lots to pull from in walking order (by
 * location, then SKU, then lot age), how many bars go to which order, and the bars per product.
 * No prices.
 */
export function pickListDocument(opts: {
  studio: Settings['studio']
  list: PickListDto
  printedOn: string
}): TDocumentDefinitions {
  const { list, studio } = opts
  // A fresh header row per table: pdfmake writes layout state into the objects it draws.
  const header = () =>
    ['Pulled', 'Location', 'Product', 'Lot code', 'Ready since', 'Bars', 'For orders'].map((t, i) => ({
      text: t,
      style: 'th',
      alignment: i === 5 ? ('right' as const) : i === 0 ? ('center' as const) : ('left' as const),
    }))
  const walk: Content[] =
    list.stops.length === 0
      ? []
      : [
          { text: 'The walk, shelf by shelf', style: 'h2' },
          {
            table: {
              headerRows: 1,
              widths: [34, 78, '*', 100, 64, 30, 80],
              dontBreakRows: true,
              body: [
                header(),
                ...list.stops.map((stop) => [
                  tickBox(12),
                  {
                    text: stop.location?.trim() ? stop.location : 'No location set',
                    color: stop.location?.trim() ? PALETTE.ink : PALETTE.honey,
                  },
                  { text: [{ text: `${stop.sku}  `, bold: true }, stop.name] },
                  { text: stop.lotCode, bold: true, noWrap: true },
                  { text: formatDate(stop.readyDate), noWrap: true },
                  { text: String(stop.bars), alignment: 'right' as const, bold: true },
                  { text: stop.orders.map((o) => `${o.number} × ${o.bars}`).join(', ') },
                ]),
              ],
            },
            layout: TABLE_LAYOUT,
          },
          { text: 'Per product', style: 'h2' },
          {
            table: {
              headerRows: 1,
              widths: [70, '*', 50, 60],
              body: [
                ['SKU', 'Product', 'Bars', 'Cases'].map((t, i) => ({
                  text: t,
                  style: 'th',
                  alignment: i >= 2 ? ('right' as const) : ('left' as const),
                })),
                ...list.products.map((p) => [
                  { text: p.sku, bold: true },
                  p.name,
                  { text: String(p.bars), alignment: 'right' as const },
                  { text: `${p.cases} of ${p.casePack}`, alignment: 'right' as const },
                ]),
              ],
            },
            layout: TABLE_LAYOUT,
          },
        ]

  return {
    info: { title: 'Pick list', author: studio.name, creator: 'Lathercase' },
    footer: pageFooter(
      `Pick list · ${list.orders.map((o) => o.number).join(', ')} · printed ${formatDate(opts.printedOn)}`,
    ),
    content: [
      studioHeader(studio),
      { text: 'Pick list', style: 'title' },
      {
        text: `${list.orders.length} ${list.orders.length === 1 ? 'order' : 'orders'} · ${list.totalBars} bars in ${list.totalCases} cases · printed ${formatDate(opts.printedOn)}`,
        style: 'subtitle',
      },
      {
        table: {
          headerRows: 1,
          widths: [90, '*', 120],
          body: [
            ['Order', 'Shop', 'PO number'].map((t) => ({ text: t, style: 'th' })),
            ...list.orders.map((o) => [{ text: o.number, bold: true }, o.shopName, o.poNumber ?? '—']),
          ],
        },
        layout: TABLE_LAYOUT,
      },
      ...(walk.length > 0
        ? walk
        : [
            {
              text: 'No bars are set aside for these orders yet.',
              margin: [0, 12, 0, 0] as [number, number, number, number],
            },
          ]),
      {
        text: 'Walk the shelves in the order listed (by location, then SKU, the older lot first; lots without a location last) and pull each lot named, so the lot codes on the packing slips match the bars in the cartons.',
        style: 'small',
        margin: [0, 14, 0, 0],
      },
    ],
  }
}
