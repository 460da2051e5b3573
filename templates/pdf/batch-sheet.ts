import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces.js'
import type { BatchLine } from '@shared/domain/batch-sheet/batch-sheet'
import { formatDate } from '@shared/domain/dates/dates'
import { formatGrams, formatOunces } from '@shared/domain/units/units'
import type { RecipeBatchSheet } from '@shared/schemas/batch-sheet'
import type { Settings } from '@shared/schemas/settings'
import { PALETTE, TABLE_LAYOUT, pageFooter, studioHeader } from '@server/lib/pdf'

const ROLE_LABEL: Record<BatchLine['role'], string> = {
  oil: 'Oil / butter',
  lye: 'Lye',
  water: 'Water',
  fragrance: 'Fragrance',
  additive: 'Additive',
}

// A no-break space keeps the number and its unit on one line.
const pct = (n: number, digits = 1) => `${Number(n.toFixed(digits))}\u00a0%`

function waterText(sheet: RecipeBatchSheet) {
  return sheet.water.mode === 'concentration'
    ? `Lye concentration ${pct(sheet.water.pct)}`
    : `Water:lye ratio ${Number(sheet.water.ratio.toFixed(2))}:1`
}

function basisText(sheet: RecipeBatchSheet) {
  if (sheet.basis === 'bars')
    return `Sized for ${sheet.requestedBars} bars of ${formatGrams(sheet.barWeightG)}`
  if (sheet.basis === 'oilWeight') return `Sized for ${formatGrams(sheet.oilsG)} of oils`
  return `Sized for one mould: ${formatGrams(sheet.oilsG)} of oils`
}

/** The red-bordered diamond of the GHS corrosion pictogram's frame, with its code inside. */
function ghsDiamond(): Content {
  return {
    stack: [
      {
        canvas: [
          {
            type: 'polyline',
            closePath: true,
            lineWidth: 2.5,
            lineColor: '#c4161c',
            points: [
              { x: 26, y: 2 },
              { x: 50, y: 26 },
              { x: 26, y: 50 },
              { x: 2, y: 26 },
            ],
          },
        ],
      },
      { text: 'GHS05', fontSize: 7.5, bold: true, alignment: 'center', margin: [0, -31, 0, 21], width: 52 },
    ],
    width: 56,
  }
}

function cautionsBox(sheet: RecipeBatchSheet): Content {
  const c = sheet.cautions
  return {
    table: {
      widths: ['*'],
      body: [
        [
          {
            fillColor: PALETTE.clayLight,
            margin: [8, 8, 8, 8],
            stack: [
              {
                columns: [
                  ghsDiamond(),
                  {
                    stack: [
                      {
                        text: `${c.signalWord.toUpperCase()} · ${sheet.lyeName} is corrosive (${c.pictogram})`,
                        style: 'danger',
                        fontSize: 11,
                      },
                      ...c.hazards.map((h) => ({ text: [{ text: `${h.code} `, bold: true }, h.text] })),
                    ],
                    width: '*',
                  },
                ],
                columnGap: 10,
                margin: [0, 0, 0, 6],
              },
              ...c.precautions.map((p) => ({
                text: [{ text: `${p.code} `, bold: true }, p.text],
                fontSize: 9,
              })),
              ...c.practice.map((p) => ({
                text: p,
                bold: true,
                margin: [0, 4, 0, 0] as [number, number, number, number],
              })),
              { text: c.disclaimer, style: 'small', italics: true, margin: [0, 6, 0, 0] },
            ],
          },
        ],
      ],
    },
    layout: {
      hLineWidth: () => 1,
      vLineWidth: () => 1,
      hLineColor: PALETTE.clay,
      vLineColor: () => PALETTE.clay,
      paddingLeft: () => 0,
      paddingRight: () => 0,
      paddingTop: () => 0,
      paddingBottom: () => 0,
    },
    margin: [0, 14, 0, 0],
  }
}

/** The printable batch sheet: what to weigh, with the lye cautions, for the making room. */
export function batchSheetDocument(opts: {
  studio: Settings['studio']
  sheet: RecipeBatchSheet
  printedOn: string
}): TDocumentDefinitions {
  const { sheet, studio } = opts
  const header = ['Ingredient', 'Kind', '% of oils', 'Grams', 'Ounces', 'Weighed'].map((t, i) => ({
    text: t,
    style: 'th',
    alignment: i >= 2 && i <= 4 ? ('right' as const) : i === 5 ? ('center' as const) : ('left' as const),
  }))
  const rows = sheet.lines.map((l) => [
    { text: l.name, bold: l.role === 'lye' },
    { text: ROLE_LABEL[l.role], color: PALETTE.muted },
    { text: pct(l.pctOfOils, 2), alignment: 'right' as const },
    { text: formatGrams(l.grams), alignment: 'right' as const, bold: true },
    { text: formatOunces(l.grams), alignment: 'right' as const },
    {
      canvas: [{ type: 'rect' as const, x: 15, y: 1, w: 9, h: 9, lineWidth: 0.7, lineColor: PALETTE.muted }],
    },
  ])
  const total = [
    { text: 'Total batch', bold: true },
    '',
    '',
    { text: formatGrams(sheet.totalG), alignment: 'right' as const, bold: true },
    { text: formatOunces(sheet.totalG), alignment: 'right' as const, bold: true },
    '',
  ]
  const facts: [string, string][] = [
    ['Superfat', pct(sheet.superfatPct)],
    ['Water', waterText(sheet)],
    ['Lye purity', pct(sheet.lyePurityPct)],
    [
      'Expected bars',
      `${sheet.expectedBars} of ${formatGrams(sheet.barWeightG)} (${sheet.barsKeptBack} kept back)`,
    ],
    ['Cure', `${sheet.cureDays} days before sale`],
  ]

  return {
    info: { title: `Batch sheet — ${sheet.recipeName}`, author: studio.name, creator: 'Lathercase' },
    footer: pageFooter(`Batch sheet · ${sheet.recipeName} · printed ${formatDate(opts.printedOn)}`),
    content: [
      studioHeader(studio),
      { text: `Batch sheet: ${sheet.recipeName}`, style: 'title' },
      { text: `${basisText(sheet)} · printed ${formatDate(opts.printedOn)}`, style: 'subtitle' },
      {
        columns: facts.map(([k, v]) => ({
          stack: [
            { text: k, style: 'small' },
            { text: v, bold: true },
          ],
          width: '*',
        })),
        columnGap: 8,
        margin: [0, 0, 0, 10],
      },
      {
        table: {
          headerRows: 1,
          widths: ['*', 70, 52, 70, 58, 44],
          body: [header, ...rows, total],
          dontBreakRows: true,
        },
        layout: TABLE_LAYOUT,
      },
      ...(sheet.warnings.length > 0
        ? [
            {
              table: {
                widths: ['*'],
                body: [
                  [
                    {
                      fillColor: PALETTE.honeyLight,
                      margin: [8, 6, 8, 6] as [number, number, number, number],
                      stack: [
                        { text: 'Check before pouring', bold: true, color: PALETTE.honey },
                        ...sheet.warnings.map((w) => ({ text: `• ${w.message}`, color: PALETTE.ink })),
                      ],
                    },
                  ],
                ],
              },
              layout: 'noBorders',
              margin: [0, 12, 0, 0] as [number, number, number, number],
            },
          ]
        : []),
      cautionsBox(sheet),
      {
        columns: ['Made by', 'Pour date', 'Lot code', 'Bars cut'].map((label) => ({
          stack: [
            { text: label, style: 'small' },
            {
              canvas: [
                { type: 'line', x1: 0, y1: 18, x2: 110, y2: 18, lineWidth: 0.6, lineColor: PALETTE.faint },
              ],
            },
          ],
          width: '*',
        })),
        columnGap: 12,
        margin: [0, 18, 0, 0],
      },
    ],
  }
}
