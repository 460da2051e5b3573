// Types for the part of pdfmake 0.3 that server/lib/pdf.ts uses; pdfmake ships none of its own.
// Documents are built from these in templates/pdf/ and rendered only through server/lib/pdf.ts.
declare module 'pdfmake/interfaces.js' {
  export type Margins = number | [number, number] | [number, number, number, number]
  export type Alignment = 'left' | 'right' | 'center' | 'justify'

  export interface Style {
    font?: string
    fontSize?: number
    bold?: boolean
    italics?: boolean
    color?: string
    fillColor?: string
    background?: string
    margin?: Margins
    alignment?: Alignment
    lineHeight?: number
    characterSpacing?: number
    decoration?: 'underline' | 'lineThrough' | 'overline'
    noWrap?: boolean
    preserveLeadingSpaces?: boolean
  }
  export type StyleDictionary = Record<string, Style>

  export interface TableLayout {
    hLineWidth?: (i: number, node: { table: { body: unknown[][] } }) => number
    vLineWidth?: (i: number, node: { table: { widths?: unknown[] } }) => number
    hLineColor?: string | ((i: number, node: { table: { body: unknown[][] } }) => string)
    vLineColor?: string | ((i: number) => string)
    fillColor?: (rowIndex: number) => string | null
    paddingLeft?: (i: number) => number
    paddingRight?: (i: number) => number
    paddingTop?: (i: number) => number
    paddingBottom?: (i: number) => number
  }

  export interface Table {
    body: Content[][]
    widths?: (number | string)[] | '*' | 'auto'
    heights?: number | number[]
    headerRows?: number
    dontBreakRows?: boolean
    keepWithHeaderRows?: number
  }

  export interface CanvasElement {
    type: 'rect' | 'line' | 'polyline' | 'ellipse'
    x?: number
    y?: number
    w?: number
    h?: number
    r?: number
    x1?: number
    y1?: number
    x2?: number
    y2?: number
    r1?: number
    r2?: number
    points?: { x: number; y: number }[]
    closePath?: boolean
    lineWidth?: number
    lineColor?: string
    color?: string
    fillOpacity?: number
  }

  export interface ContentObject extends Style {
    text?: Content
    stack?: Content[]
    columns?: Content[]
    columnGap?: number
    table?: Table
    layout?: string | TableLayout
    canvas?: CanvasElement[]
    svg?: string
    ul?: Content[]
    ol?: Content[]
    style?: string | string[]
    width?: number | string
    height?: number
    pageBreak?: 'before' | 'after'
    unbreakable?: boolean
    colSpan?: number
    rowSpan?: number
    border?: [boolean, boolean, boolean, boolean]
    id?: string
  }
  export type Content = string | number | Content[] | ContentObject

  export type DynamicContent = (currentPage: number, pageCount: number) => Content | null | undefined

  export interface TDocumentInformation {
    title?: string
    author?: string
    subject?: string
    keywords?: string
    creator?: string
    producer?: string
  }

  export interface TDocumentDefinitions {
    content: Content
    info?: TDocumentInformation
    pageSize?: 'A4' | 'LETTER' | { width: number; height: number }
    pageOrientation?: 'portrait' | 'landscape'
    pageMargins?: Margins
    header?: Content | DynamicContent
    footer?: Content | DynamicContent
    background?: Content | DynamicContent
    styles?: StyleDictionary
    defaultStyle?: Style
    language?: string
    compress?: boolean
  }

  export type TFontDictionary = Record<
    string,
    { normal: string; bold: string; italics: string; bolditalics: string }
  >
}

declare module 'pdfmake' {
  import type { TDocumentDefinitions, TFontDictionary } from 'pdfmake/interfaces.js'

  interface OutputDocument {
    getBuffer(): Promise<Buffer>
  }
  interface PdfMake {
    virtualfs: {
      existsSync(name: string): boolean
      writeFileSync(name: string, content: Buffer): void
    }
    setFonts(fonts: TFontDictionary): void
    setUrlAccessPolicy(policy: (url: string) => boolean): void
    setLocalAccessPolicy(policy: (path: string) => boolean): void
    createPdf(doc: TDocumentDefinitions, options?: object): OutputDocument
  }
  const pdfmake: PdfMake
  export default pdfmake
}
