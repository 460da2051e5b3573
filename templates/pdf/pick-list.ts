import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces.js'
import { formatDate } from '@shared/domain/dates/dates'
import type { PickListDto } from '@shared/schemas/packing'
import type { Settings } from '@shared/schemas/settings'
import { PALETTE, TABLE_LAYOUT, pageFooter, studioHeader } from '@server/lib/pdf'
import { tickBox } from './packing-slip'

/**
 * The shelf walk for one or more orders: per product, the batch lots to pull from (oldest first,
 * as allocated), where each lot sits and how many bars go to which order. No prices.
 */
export function pickListDocument(opts: {
  studio: Settings['studio']
  list: PickListDto
  printedOn: string
}): TDocumentDefinitions {
  const { list, studio } = opts
  // A fresh header row per table: pdfmake writes layout state into the objects it draws.
  const header = () =>
    ['Pulled', 'Lot code', 'Location', 'Ready since', 'Bars', 'For orders'].map((t, i) => ({
      text: t,
      style: 'th',
      alignment: i === 4 ? ('right' as const) : i === 0 ? ('center' as const) : ('left' as const),
    }))
  const products: Content[] = list.products.flatMap((p) => [
    {
      columns: [
        { text: [{ text: `${p.sku}  `, bold: true }, p.name], style: 'h2', width: '*' },
        {
          text: `${p.bars} bars · ${p.cases} ${p.cases === 1 ? 'case' : 'cases'} of ${p.casePack}`,
          alignment: 'right' as const,
          bold: true,
          margin: [0, 12, 0, 6] as [number, number, number, number],
          width: 'auto',
        },
      ],
    },
    {
      table: {
        headerRows: 1,
        widths: [40, 118, 96, 70, 36, '*'],
        dontBreakRows: true,
        body: [
          header(),
          ...p.lots.map((lot) => [
            tickBox(12),
            { text: lot.lotCode, bold: true, noWrap: true },
            { text: lot.location ?? 'No location set', color: lot.location ? PALETTE.ink : PALETTE.honey },
            formatDate(lot.readyDate),
            { text: String(lot.bars), alignment: 'right' as const, bold: true },
            { text: lot.orders.map((o) => `${o.number} × ${o.bars}`).join(', ') },
          ]),
        ],
      },
      layout: TABLE_LAYOUT,
    },
  ])

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
      ...(products.length > 0
        ? products
        : [
            {
              text: 'No bars are set aside for these orders yet.',
              margin: [0, 12, 0, 0] as [number, number, number, number],
            },
          ]),
      {
        text: 'Pull each lot in the order listed (oldest batch first) so the lot codes on the packing slips match the bars in the cartons.',
        style: 'small',
        margin: [0, 14, 0, 0],
      },
    ],
  }
}
