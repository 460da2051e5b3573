import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces.js'
import { formatDate } from '@shared/domain/dates/dates'
import { gramsTo } from '@shared/domain/units/units'
import type { PackingOrderDto } from '@shared/schemas/packing'
import type { Settings } from '@shared/schemas/settings'
import { PALETTE, TABLE_LAYOUT, pageFooter, studioHeader } from '@server/lib/pdf'

/** A square to tick by hand. */
export function tickBox(x = 4): Content {
  return { canvas: [{ type: 'rect', x, y: 1, w: 10, h: 10, lineWidth: 0.8, lineColor: PALETTE.ink }] }
}

/** "12.40 kg (27.34 lb)" */
export function weightText(g: number): string {
  return `${(g / 1000).toFixed(2)} kg (${gramsTo(g, 'lb').toFixed(2)} lb)`
}

function labelled(label: string, value: string): Content {
  return {
    stack: [
      { text: label, style: 'small' },
      { text: value, bold: true },
    ],
    width: '*',
  }
}

/**
 * The slip that travels in the carton: studio, ship-to, order and PO numbers, every line with its
 * SKU, cases and bars and the batch lots the bars came from, a tick box per line and the carton
 * count. It carries no prices: it is read by whoever opens the box.
 */
export function packingSlipDocument(opts: {
  studio: Settings['studio']
  order: PackingOrderDto
  printedOn: string
}): TDocumentDefinitions {
  const { order, studio } = opts
  const header = ['Packed', 'SKU', 'Product', 'Cases', 'Bars', 'Batch lots (bars)'].map((t, i) => ({
    text: t,
    style: 'th',
    alignment: i === 3 || i === 4 ? ('right' as const) : i === 0 ? ('center' as const) : ('left' as const),
  }))
  const rows = order.lines.map((l) => [
    tickBox(12),
    { text: l.sku, bold: true },
    { text: l.name },
    { text: `${l.cases} × ${l.casePack}`, alignment: 'right' as const },
    { text: String(l.bars), alignment: 'right' as const, bold: true },
    {
      stack:
        l.lots.length > 0
          ? l.lots.map((lot) => ({
              text: [{ text: lot.lotCode, bold: true }, `  × ${lot.bars}`],
              noWrap: true,
            }))
          : [{ text: 'Not yet set aside', color: PALETTE.honey }],
    },
  ])
  const totalBars = order.lines.reduce((n, l) => n + l.bars, 0)
  const totalCases = order.lines.reduce((n, l) => n + l.cases, 0)
  const cartons = order.shipment?.cartons ?? order.cartons
  const weight = order.shipment?.weightG ?? order.packedWeightG

  return {
    info: { title: `Packing slip ${order.number}`, author: studio.name, creator: 'Lathercase' },
    footer: pageFooter(`Packing slip · ${order.number} · printed ${formatDate(opts.printedOn)}`),
    content: [
      studioHeader(studio),
      { text: `Packing slip · Order ${order.number}`, style: 'title' },
      {
        text: `${order.shopName}${order.poNumber ? ` · PO ${order.poNumber}` : ''}`,
        style: 'subtitle',
      },
      {
        columns: [
          {
            stack: [
              { text: 'Ship to', style: 'small', margin: [0, 0, 0, 2] },
              { text: order.shipTo.name, bold: true },
              `Attn. ${order.shipTo.contactName}`,
              ...order.shipTo.lines,
              ...(order.shipTo.contactPhone ? [order.shipTo.contactPhone] : []),
            ],
            width: '*',
          },
          {
            stack: [
              { text: 'Ship from', style: 'small', margin: [0, 0, 0, 2] },
              { text: studio.name, bold: true },
              ...studio.address,
            ],
            width: '*',
          },
        ],
        columnGap: 16,
        margin: [0, 0, 0, 14],
      },
      {
        columns: [
          labelled('Order', order.number),
          labelled('PO number', order.poNumber ?? '—'),
          labelled('Ordered', formatDate(order.placedAt.slice(0, 10))),
          labelled('Shipped', order.shipment ? formatDate(order.shipment.shipDate) : '—'),
          labelled('Cartons', cartons !== null ? String(cartons) : '____'),
        ],
        columnGap: 8,
        margin: [0, 0, 0, 14],
      },
      {
        table: {
          headerRows: 1,
          widths: [40, 62, '*', 48, 34, 140],
          body: [
            header,
            ...rows,
            [
              '',
              '',
              { text: 'Total', bold: true },
              { text: String(totalCases), alignment: 'right' as const, bold: true },
              { text: String(totalBars), alignment: 'right' as const, bold: true },
              '',
            ],
          ],
          dontBreakRows: true,
        },
        layout: TABLE_LAYOUT,
      },
      ...(order.shipment
        ? [
            {
              text: `Carrier ${order.shipment.carrier}, tracking number ${order.shipment.trackingNumber}.`,
              margin: [0, 12, 0, 0] as [number, number, number, number],
            },
          ]
        : []),
      ...(weight
        ? [
            {
              text: `Packed weight ${weightText(weight)}.`,
              style: 'small',
              margin: [0, 4, 0, 0] as [number, number, number, number],
            },
          ]
        : []),
      ...(order.note
        ? [
            {
              text: `Note from the order: ${order.note}`,
              margin: [0, 8, 0, 0] as [number, number, number, number],
            },
          ]
        : []),
      {
        text: 'Every bar carries the lot code of the batch it was cut from. Keep this slip: if you ever need to ask about a bar, the lot code tells us which batch it came from.',
        style: 'small',
        margin: [0, 14, 0, 0],
      },
      {
        columns: ['Packed by', 'Checked by'].map((label) => ({
          stack: [
            { text: label, style: 'small' },
            {
              canvas: [
                { type: 'line', x1: 0, y1: 18, x2: 160, y2: 18, lineWidth: 0.6, lineColor: PALETTE.faint },
              ],
            },
          ],
          width: '*',
        })),
        columnGap: 16,
        margin: [0, 18, 0, 0],
      },
    ],
  }
}
