import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces.js'
import { formatDate } from '@shared/domain/dates/dates'
import { formatCents } from '@shared/domain/money/money'
import type { InvoiceDto } from '@shared/schemas/invoices'
import { DOCUMENT_STATUS_LABELS } from '@shared/schemas/invoices'
import { PAYMENT_METHOD_LABELS } from '@shared/schemas/payments'
import { PAYMENT_TERMS_LABELS } from '@shared/schemas/shops'
import type { Settings } from '@shared/schemas/settings'
import { PALETTE, TABLE_LAYOUT, pageFooter, studioHeader } from '@server/lib/pdf'

const right = 'right' as const

function fact(label: string, value: string, bold = false): Content {
  return {
    stack: [
      { text: label, style: 'small' },
      { text: value, bold },
    ],
    width: '*',
  }
}

function block(title: string, lines: string[]): Content {
  return {
    stack: [
      { text: title, style: 'small', margin: [0, 0, 0, 2] },
      ...lines.map((l, i) => ({ text: l, bold: i === 0 })),
    ],
    width: '*',
  }
}

/** The stamp in the top corner: what the reader most needs to know at a glance. */
function stamp(invoice: InvoiceDto): Content | null {
  const tone =
    invoice.status === 'paid'
      ? { color: PALETTE.olive, fill: PALETTE.oliveLight }
      : invoice.status === 'overdue' || invoice.status === 'void'
        ? { color: PALETTE.clay, fill: PALETTE.clayLight }
        : invoice.status === 'credit'
          ? { color: PALETTE.honey, fill: PALETTE.honeyLight }
          : null
  if (!tone) return null
  return {
    table: {
      widths: ['auto'],
      body: [
        [
          {
            text: DOCUMENT_STATUS_LABELS[invoice.status].toUpperCase(),
            bold: true,
            color: tone.color,
            fillColor: tone.fill,
            fontSize: 11,
            characterSpacing: 1.5,
            margin: [10, 4, 10, 4],
          },
        ],
      ],
    },
    layout: {
      hLineWidth: () => 1,
      vLineWidth: () => 1,
      hLineColor: tone.color,
      vLineColor: () => tone.color,
      paddingLeft: () => 0,
      paddingRight: () => 0,
      paddingTop: () => 0,
      paddingBottom: () => 0,
    },
    width: 'auto',
  }
}

/**
 * An invoice or credit note: studio header, bill-to, number, dates and terms, the lines with their
 * prices, shipping, tax, total, what has been paid and what is still due, and the PO number.
 */
export function invoiceDocument(opts: {
  studio: Settings['studio']
  invoice: InvoiceDto
}): TDocumentDefinitions {
  const { studio, invoice } = opts
  const m = (cents: number) => formatCents(cents, invoice.currency)
  const credit = invoice.kind === 'credit_note'
  const title = credit ? 'Credit note' : 'Invoice'

  const header = ['SKU', 'Product', 'Cases', 'Bars', 'Unit price', 'Amount'].map((t, i) => ({
    text: t,
    style: 'th',
    alignment: i >= 2 ? right : ('left' as const),
  }))
  const rows = invoice.lines.map((l) => [
    { text: l.sku, color: PALETTE.muted },
    { text: l.description },
    { text: `${l.cases} × ${l.casePack}`, alignment: right },
    { text: String(l.bars), alignment: right },
    { text: m(l.unitPriceCents), alignment: right },
    { text: m(l.lineTotalCents), alignment: right },
  ])

  const taxLabel = invoice.taxExempt
    ? 'Tax (exempt, resale certificate)'
    : `Tax${invoice.taxRatePct ? ` (${Number(invoice.taxRatePct.toFixed(3))} %)` : ''}`
  const totals: [string, string, boolean][] = [
    ['Subtotal', m(invoice.subtotalCents), false],
    ['Shipping', m(invoice.shippingCents), false],
    [taxLabel, m(invoice.taxCents), false],
    [credit ? 'Total credited' : 'Total', m(invoice.totalCents), true],
  ]
  if (!credit) {
    totals.push(['Paid', m(invoice.paidCents), false])
    totals.push([
      invoice.status === 'void' ? 'Amount due (void)' : 'Amount due',
      m(invoice.outstandingCents),
      true,
    ])
  }

  const facts: Content[] = [
    fact(`${title} number`, invoice.number, true),
    fact('Issue date', formatDate(invoice.issueDate)),
    credit
      ? fact('Credits invoice', invoice.creditsInvoice?.number ?? '—', true)
      : fact('Due date', formatDate(invoice.dueDate), true),
    fact('Terms', PAYMENT_TERMS_LABELS[invoice.terms]),
    fact('Order', invoice.orderNumber),
    fact('PO number', invoice.poNumber ?? '—'),
  ]

  const studioLines = [
    studio.legalName && studio.legalName !== studio.name ? studio.legalName : null,
    studio.taxId ? `Tax id ${studio.taxId}` : null,
  ].filter((s): s is string => !!s)

  const badge = stamp(invoice)
  const notes: Content[] = []
  if (credit) {
    notes.push({
      text: `This credit note cancels invoice ${invoice.creditsInvoice?.number ?? ''} in full. Nothing is owed on that invoice.`,
      margin: [0, 14, 0, 0],
    })
  } else if (invoice.status === 'void') {
    notes.push({
      text: `This invoice is void${invoice.voidReason ? `: ${invoice.voidReason}` : ''}.${invoice.creditNote ? ` Credit note ${invoice.creditNote.number} cancels it.` : ''}`,
      style: 'danger',
      margin: [0, 14, 0, 0],
    })
  } else if (invoice.outstandingCents > 0) {
    notes.push({
      text:
        invoice.terms === 'prepay'
          ? `Payment is due before the order ships: ${m(invoice.outstandingCents)} by ${formatDate(invoice.dueDate)}. Please quote ${invoice.number} with your payment.`
          : `Please pay ${m(invoice.outstandingCents)} by ${formatDate(invoice.dueDate)} (${PAYMENT_TERMS_LABELS[invoice.terms]}: due ${invoice.terms === 'net_15' ? 15 : 30} days after the invoice date), quoting ${invoice.number}.`,
      margin: [0, 14, 0, 0],
    })
  }

  return {
    info: { title: `${title} ${invoice.number}`, author: studio.name, creator: 'Lathercase' },
    footer: pageFooter(`${title} ${invoice.number} · ${invoice.billTo.tradingName}`),
    content: [
      studioHeader(studio),
      {
        columns: [
          {
            stack: [
              { text: `${title} ${invoice.number}`, style: 'title' },
              {
                text: studioLines.length ? studioLines.join(' · ') : ' ',
                style: 'subtitle',
              },
            ],
            width: '*',
          },
          ...(badge ? [badge] : []),
        ],
      },
      {
        columns: [
          block('Bill to', [
            invoice.billTo.legalName,
            ...(invoice.billTo.tradingName !== invoice.billTo.legalName
              ? [`Trading as ${invoice.billTo.tradingName}`]
              : []),
            `Attn. ${invoice.billTo.contactName}`,
            ...invoice.billTo.lines,
            ...(invoice.billTo.taxId ? [`Tax / resale id ${invoice.billTo.taxId}`] : []),
          ]),
          invoice.shipment
            ? block('Shipped', [
                formatDate(invoice.shipment.shipDate),
                `${invoice.shipment.carrier} ${invoice.shipment.trackingNumber}`,
              ])
            : { text: '', width: '*' },
        ],
        columnGap: 16,
        margin: [0, 0, 0, 14],
      },
      { columns: facts, columnGap: 8, margin: [0, 0, 0, 14] },
      {
        table: {
          headerRows: 1,
          widths: [62, '*', 56, 40, 62, 70],
          body: [header, ...rows],
          dontBreakRows: true,
        },
        layout: TABLE_LAYOUT,
      },
      {
        columns: [
          { text: '', width: '*' },
          {
            width: 260,
            table: {
              widths: ['*', 86],
              body: totals.map(([label, value, bold]) => [
                { text: label, bold, alignment: right },
                { text: value, bold, alignment: right },
              ]),
            },
            layout: {
              hLineWidth: (i: number) => (i === 3 || (i === 5 && !credit) ? 0.8 : 0),
              vLineWidth: () => 0,
              hLineColor: () => PALETTE.faint,
              paddingLeft: () => 6,
              paddingRight: () => 6,
              paddingTop: () => 3,
              paddingBottom: () => 3,
            },
          },
        ],
        margin: [0, 8, 0, 0],
      },
      ...(invoice.payments.length > 0
        ? [
            { text: 'Payments received', style: 'h2' },
            {
              table: {
                headerRows: 1,
                widths: [80, 100, '*', 80],
                body: [
                  ['Received', 'Method', 'Reference', 'Amount'].map((t, i) => ({
                    text: t,
                    style: 'th',
                    alignment: i === 3 ? right : ('left' as const),
                  })),
                  ...invoice.payments.map((p) => [
                    formatDate(p.receivedOn),
                    PAYMENT_METHOD_LABELS[p.method],
                    p.reference ?? '—',
                    { text: m(p.amountCents), alignment: right },
                  ]),
                ],
              },
              layout: TABLE_LAYOUT,
            },
          ]
        : []),
      ...notes,
      {
        text: `Questions about this ${title.toLowerCase()}: ${[studio.email, studio.phone].filter(Boolean).join(' · ')}`,
        style: 'small',
        margin: [0, 18, 0, 0],
      },
    ],
  }
}
