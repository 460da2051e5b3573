import fs from 'node:fs'
import { createRequire } from 'node:module'
import type PdfmakeModule from 'pdfmake'
import type { Content, StyleDictionary, TDocumentDefinitions, TableLayout } from 'pdfmake/interfaces.js'

// The one PDF renderer. Document layouts live in templates/pdf/ as functions that return a
// docDefinition; they are rendered only here.

const require = createRequire(import.meta.url)

// pdfmake's own Roboto TTFs: the @fontsource web subsets drop letters silently (.woff) or crash
// pdfkit (.woff2). They go into pdfmake's virtual file system, so the local access policy below
// can refuse every path on disk.
const FONT_FILES = {
  normal: 'Roboto-Regular.ttf',
  bold: 'Roboto-Medium.ttf',
  italics: 'Roboto-Italic.ttf',
  bolditalics: 'Roboto-MediumItalic.ttf',
} as const

type Pdfmake = typeof PdfmakeModule

// pdfmake and its fonts are loaded at the first document, not at start: most requests never render
// one, and the renderer with four TTFs in its virtual file system holds memory for the process's life.
let loading: Promise<Pdfmake> | null = null
function loadPdfmake(): Promise<Pdfmake> {
  loading ??= import('pdfmake').then(({ default: pdfmake }) => {
    setUp(pdfmake)
    return pdfmake
  })
  loading.catch(() => {
    loading = null
  })
  return loading
}

function setUp(pdfmake: Pdfmake) {
  for (const file of Object.values(FONT_FILES)) {
    if (!pdfmake.virtualfs.existsSync(file)) {
      pdfmake.virtualfs.writeFileSync(file, fs.readFileSync(require.resolve(`pdfmake/fonts/Roboto/${file}`)))
    }
  }
  pdfmake.setFonts({ Roboto: { ...FONT_FILES } })
  // Documents are built from our own data only: no images or fonts fetched from the web or disk.
  pdfmake.setUrlAccessPolicy(() => false)
  pdfmake.setLocalAccessPolicy(() => false)
}

export async function renderPdf(docDefinition: TDocumentDefinitions): Promise<Buffer> {
  const pdfmake = await loadPdfmake()
  return pdfmake
    .createPdf({
      pageSize: 'LETTER',
      pageMargins: [48, 56, 48, 56],
      compress: true,
      ...docDefinition,
      defaultStyle: {
        font: 'Roboto',
        fontSize: 10,
        color: PALETTE.ink,
        lineHeight: 1.2,
        ...docDefinition.defaultStyle,
      },
      styles: { ...PDF_STYLES, ...docDefinition.styles },
    })
    .getBuffer()
}

/** Lathercase's palette (tailwind.config.ts) as PDF colours. */
export const PALETTE = {
  ink: '#2d2a26',
  muted: '#6f685f',
  faint: '#b9b3aa',
  olive: '#3b5b2d',
  oliveLight: '#e1eadb',
  cream: '#f2ece1',
  clay: '#8a3f24',
  clayLight: '#fbf1ec',
  honey: '#85620f',
  honeyLight: '#fdf7e6',
} as const

export const PDF_STYLES: StyleDictionary = {
  studio: { fontSize: 14, bold: true, color: PALETTE.olive },
  studioLine: { fontSize: 8.5, color: PALETTE.muted },
  title: { fontSize: 18, bold: true, margin: [0, 0, 0, 2] },
  subtitle: { fontSize: 10, color: PALETTE.muted, margin: [0, 0, 0, 12] },
  h2: { fontSize: 12, bold: true, color: PALETTE.olive, margin: [0, 12, 0, 6] },
  th: { bold: true, fontSize: 9, color: PALETTE.ink },
  num: { alignment: 'right' },
  small: { fontSize: 8.5, color: PALETTE.muted },
  danger: { bold: true, color: PALETTE.clay },
  warning: { color: PALETTE.honey },
}

/** Light horizontal rules, a cream header row. */
export const TABLE_LAYOUT: TableLayout = {
  hLineWidth: (i, node) => (i === 0 || i === node.table.body.length ? 0 : i === 1 ? 0.8 : 0.4),
  vLineWidth: () => 0,
  hLineColor: (i) => (i === 1 ? PALETTE.faint : PALETTE.cream),
  fillColor: (row) => (row === 0 ? PALETTE.cream : null),
  paddingLeft: () => 6,
  paddingRight: () => 6,
  paddingTop: () => 4,
  paddingBottom: () => 4,
}

/** The studio header every document starts with: name on the left, contact lines on the right. */
export function studioHeader(studio: {
  name: string
  email: string
  phone: string
  address: readonly string[]
}): Content {
  const contact = [...studio.address, [studio.phone, studio.email].filter(Boolean).join(' · ')].filter(
    Boolean,
  )
  return {
    columns: [
      { text: studio.name, style: 'studio', width: '*' },
      {
        stack: contact.map((line) => ({ text: line, style: 'studioLine', alignment: 'right' })),
        width: 'auto',
      },
    ],
    margin: [0, 0, 0, 16],
  }
}

/** "Page 2 of 3" and a short line on the left (document name, date). */
export function pageFooter(left: string) {
  return (page: number, pages: number): Content => ({
    columns: [
      { text: left, style: 'small' },
      { text: `Page ${page} of ${pages}`, style: 'small', alignment: 'right' },
    ],
    margin: [48, 16, 48, 0],
  })
}
