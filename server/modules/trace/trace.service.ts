import { QueryTypes } from 'sequelize'
import { toCsv } from '@shared/domain/csv/csv'
import type { TraceLotOption, TraceResult, TraceRow } from '@shared/schemas/batches'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { shipmentsForBatches } from '@server/modules/batches/shipments'
import { getSettings } from '@server/modules/settings/settings.service'

// Traceability, forward from a purchase: an ingredient lot → the batches that used it → the shops
// whose orders shipped bars of those batches. What a recall or a supplier's warning needs.

type LotOptionDb = {
  id: number
  ingredient_id: number
  ingredient_name: string
  supplier: string
  supplier_lot_code: string | null
  received_on: string
  unit: 'g' | 'each'
  quantity: string
  remaining: string
  batches: number
}

const LOT_SQL = `
  SELECT l.id, l.ingredient_id, i.name AS ingredient_name, l.supplier, l.supplier_lot_code, l.received_on,
         i.unit, l.quantity, l.remaining,
         (SELECT count(*)::int FROM batch_lots bl WHERE bl.ingredient_lot_id = l.id) AS batches
    FROM ingredient_lots l JOIN ingredients i ON i.id = l.ingredient_id`

const toOption = (r: LotOptionDb): TraceLotOption => ({
  id: r.id,
  ingredientId: r.ingredient_id,
  ingredientName: r.ingredient_name,
  supplier: r.supplier,
  supplierLotCode: r.supplier_lot_code,
  receivedOn: r.received_on,
  batches: r.batches,
})

/** Purchase lots to choose from, those that went into batches first, newest received first. */
export async function listTraceableLots(q?: string): Promise<TraceLotOption[]> {
  const like = q ? `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` : null
  const rows = await sequelize.query<LotOptionDb>(
    `${LOT_SQL}
      WHERE $1::text IS NULL OR i.name ILIKE $1 OR l.supplier ILIKE $1 OR l.supplier_lot_code ILIKE $1
      ORDER BY (SELECT count(*) FROM batch_lots bl WHERE bl.ingredient_lot_id = l.id) = 0, i.name, l.received_on DESC, l.id DESC
      LIMIT 500`,
    { bind: [like], type: QueryTypes.SELECT },
  )
  return rows.map(toOption)
}

type TraceBatchDb = {
  batch_id: number
  lot_code: string
  pour_date: string
  ready_date: string
  product_id: number
  sku: string
  product_name: string
  quantity: string
  sellable: number
  free: number
  reserved: number
}

export async function traceLot(lotId: number): Promise<TraceResult> {
  const [lot] = await sequelize.query<LotOptionDb>(`${LOT_SQL} WHERE l.id = $1`, {
    bind: [lotId],
    type: QueryTypes.SELECT,
  })
  if (!lot) throw AppError.notFound('That purchase lot')
  const batches = await sequelize.query<TraceBatchDb>(
    `SELECT b.id AS batch_id, b.lot_code, b.pour_date, b.ready_date, b.product_id, p.sku, p.name AS product_name,
            bl.quantity, (b.bars_cut - b.bars_kept_back) AS sellable,
            COALESCE(s.free, 0) AS free, COALESCE(s.reserved, 0) AS reserved
       FROM batch_lots bl
       JOIN batches b ON b.id = bl.batch_id
       JOIN products p ON p.id = b.product_id
       LEFT JOIN batch_stock s ON s.batch_id = b.id
      WHERE bl.ingredient_lot_id = $1
      ORDER BY b.pour_date, b.id`,
    { bind: [lotId], type: QueryTypes.SELECT },
  )
  const { timeZone } = await getSettings()
  const shipments = await shipmentsForBatches(
    batches.map((b) => b.batch_id),
    timeZone,
  )
  const rows: TraceRow[] = []
  const out: TraceResult['batches'] = batches.map((b) => {
    const shipped = shipments.get(b.batch_id) ?? []
    const common = {
      lotId: lot.id,
      ingredientName: lot.ingredient_name,
      supplierLotCode: lot.supplier_lot_code,
      batchId: b.batch_id,
      batchLotCode: b.lot_code,
      pourDate: b.pour_date,
      productSku: b.sku,
      quantityUsed: Number(b.quantity),
    }
    // A batch nothing has shipped from yet still gets its row: its bars are all at the studio.
    if (shipped.length === 0)
      rows.push({ ...common, shopName: null, orderNumber: null, bars: b.sellable, shipDate: null })
    for (const s of shipped) {
      rows.push({
        ...common,
        shopName: s.shopName,
        orderNumber: s.orderNumber,
        bars: s.bars,
        shipDate: s.shippedOn,
      })
    }
    return {
      batchId: b.batch_id,
      lotCode: b.lot_code,
      pourDate: b.pour_date,
      readyDate: b.ready_date,
      productId: b.product_id,
      sku: b.sku,
      productName: b.product_name,
      quantityUsed: Number(b.quantity),
      sellableBars: b.sellable,
      free: b.free,
      reserved: b.reserved,
      shipments: shipped,
    }
  })
  return {
    lot: {
      ...toOption(lot),
      unit: lot.unit,
      quantity: Number(lot.quantity),
      remaining: Number(lot.remaining),
    },
    batches: out,
    rows,
  }
}

export const TRACE_CSV_HEADER = [
  'lot',
  'ingredient',
  'supplier lot code',
  'batch lot code',
  'pour date',
  'product SKU',
  'shop',
  'order number',
  'bars',
  'ship date',
] as const

/**
 * A spreadsheet program runs a cell that starts with = + - @ (or a tab / carriage return) as a
 * formula; supplier lot codes are typed by people, so such cells are led by an apostrophe.
 */
function safeCell(value: string): string {
  return /^[=+\-@\t\r]/.test(value) ? `'${value}` : value
}

export function traceCsv(trace: TraceResult): string {
  return toCsv([
    [...TRACE_CSV_HEADER],
    ...trace.rows.map((r) =>
      [
        String(r.lotId),
        r.ingredientName,
        r.supplierLotCode ?? '',
        r.batchLotCode,
        r.pourDate,
        r.productSku,
        r.shopName ?? '',
        r.orderNumber ?? '',
        String(r.bars),
        r.shipDate ?? '',
      ].map(safeCell),
    ),
  ])
}

export function traceCsvFilename(trace: TraceResult): string {
  const code = (trace.lot.supplierLotCode ?? '').replace(/[^A-Za-z0-9-]+/g, '-').replace(/^-+|-+$/g, '')
  return `trace-lot-${trace.lot.id}${code ? `-${code}` : ''}.csv`
}
