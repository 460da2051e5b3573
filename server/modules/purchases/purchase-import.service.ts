import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { parseCsv } from '@shared/domain/csv/csv'
import type { CsvRecord } from '@shared/domain/csv/csv'
import { DomainError } from '@shared/domain/errors'
import { parseMoneyToCents } from '@shared/domain/money/money'
import {
  IMPORT_COLUMNS,
  IMPORT_MAX_ROWS,
  PurchaseSchema,
  REQUIRED_IMPORT_COLUMNS,
} from '@shared/schemas/ingredients'
import type {
  ImportColumn,
  ImportPreview,
  ImportResult,
  ImportRow,
  ImportRowError,
  PurchaseValues,
} from '@shared/schemas/ingredients'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { Ingredient } from '@server/modules/ingredients/ingredient.model'
import { IngredientLot } from '@server/modules/purchases/ingredient-lot.model'
import {
  checkIngredientAndDate,
  duplicateDelivery,
  recordedDeliveries,
  lotColumns,
  lotRows,
  studioToday,
} from '@server/modules/purchases/purchases.service'

// Byte signatures of files people export by mistake instead of CSV. The type comes from the
// bytes, never from the file name or the browser's Content-Type.
const NOT_CSV: { magic: number[]; what: string }[] = [
  { magic: [0x50, 0x4b, 0x03, 0x04], what: 'a spreadsheet workbook or other zip file' },
  { magic: [0xd0, 0xcf, 0x11, 0xe0], what: 'an old-style spreadsheet (.xls)' },
  { magic: [0x25, 0x50, 0x44, 0x46], what: 'a PDF' },
  { magic: [0x89, 0x50, 0x4e, 0x47], what: 'a PNG image' },
  { magic: [0xff, 0xd8, 0xff], what: 'a JPEG image' },
  { magic: [0x47, 0x49, 0x46, 0x38], what: 'a GIF image' },
]

/** The text of an uploaded CSV file, or a 400 on `file` saying what the file is instead. */
export function csvTextFromBytes(bytes: Buffer): string {
  if (bytes.length === 0) throw AppError.field('file', 'The file is empty.')
  const found = NOT_CSV.find((s) => s.magic.every((b, i) => bytes[i] === b))
  if (found)
    throw AppError.field(
      'file',
      `This file is ${found.what}, not CSV text: save it as “CSV (UTF-8)” and upload that.`,
    )
  if (bytes.includes(0))
    throw AppError.field('file', 'This is not a text file: save the sheet as “CSV (UTF-8)” and upload that.')
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes)
  } catch {
    throw AppError.field(
      'file',
      'The file is not UTF-8 text: save the sheet as “CSV (UTF-8)” and upload that.',
    )
  }
}

/** The header row mapped to column positions, or a 400 on `file` naming what is missing or unknown. */
function readHeader(record: CsvRecord): Map<ImportColumn, number> {
  const names = record.fields.map((f) => f.trim().toLowerCase())
  const known = new Set<string>(IMPORT_COLUMNS)
  const unknown = names
    .filter((n) => !known.has(n))
    .map((n) => (n === '' ? '(an empty column name)' : `“${n}”`))
  const repeated = [...new Set(names.filter((n, i) => known.has(n) && names.indexOf(n) !== i))]
  const missing = REQUIRED_IMPORT_COLUMNS.filter((c) => !names.includes(c))
  if (unknown.length || repeated.length || missing.length) {
    const parts = [
      missing.length ? `missing ${missing.join(', ')}` : null,
      unknown.length ? `unknown ${unknown.join(', ')}` : null,
      repeated.length ? `repeated ${repeated.join(', ')}` : null,
    ].filter(Boolean)
    throw AppError.field(
      'file',
      `The header row does not fit (${parts.join('; ')}). The first line must name the columns: ${IMPORT_COLUMNS.join(',')} (lot_code and freight may be left out).`,
    )
  }
  return new Map(names.map((n, i) => [n as ImportColumn, i]))
}

function parseRecords(text: string): { header: Map<ImportColumn, number>; rows: CsvRecord[] } {
  let records: CsvRecord[]
  try {
    records = parseCsv(text)
  } catch (err) {
    if (err instanceof DomainError) throw AppError.field('file', err.message)
    throw err
  }
  const [first, ...rows] = records
  if (!first)
    throw AppError.field(
      'file',
      `The CSV is empty. Its first line names the columns: ${IMPORT_COLUMNS.join(',')}.`,
    )
  const header = readHeader(first)
  if (rows.length === 0) throw AppError.field('file', 'The CSV has its header row but no purchases under it.')
  if (rows.length > IMPORT_MAX_ROWS) {
    throw AppError.field(
      'file',
      `At most ${IMPORT_MAX_ROWS} purchases per import; this file has ${rows.length}. Split it up.`,
    )
  }
  return { header, rows }
}

// The purchase's fields under their CSV column names.
const COLUMN_OF: Record<string, ImportColumn> = {
  ingredientId: 'ingredient',
  supplier: 'supplier',
  supplierLotCode: 'lot_code',
  receivedOn: 'received_on',
  quantity: 'quantity',
  unit: 'unit',
  costCents: 'cost',
  freightCents: 'freight',
}

// "1,000" and "1000.5" are quantities; the schema reports anything else as not a number.
const GROUPED = /^\d{1,3}(,\d{3})+(\.\d+)?$/

type Checked = ImportRow & { purchase: PurchaseValues | null }

async function checkRows(text: string, transaction?: Transaction): Promise<Checked[]> {
  const { header, rows } = parseRecords(text)
  const today = await studioToday()
  const ingredients = await Ingredient.findAll({ transaction })
  const active = new Map<string, Ingredient>()
  const archived = new Map<string, Ingredient>()
  for (const i of ingredients) (i.archivedAt ? archived : active).set(i.name.trim().toLowerCase(), i)
  const seen = new Map<string, number>()
  // Rows that passed every other check wait here for the one query against recorded purchases.
  const pending: {
    row: number
    add: (field: ImportRowError['field'], message: string) => void
    errors: ImportRowError[]
    purchase: PurchaseValues
    inFile: string | null
  }[] = []

  const out: Checked[] = []
  for (const record of rows) {
    const values = Object.fromEntries(
      IMPORT_COLUMNS.map((c) => [c, header.has(c) ? (record.fields[header.get(c)!] ?? '').trim() : '']),
    ) as Record<ImportColumn, string>
    const errors: ImportRowError[] = []
    const add = (field: ImportRowError['field'], message: string) => {
      if (!errors.some((e) => e.field === field)) errors.push({ field, message })
    }
    if (record.fields.length !== header.size) {
      add('line', `This line has ${record.fields.length} values but the header names ${header.size} columns.`)
    }
    const name = values.ingredient.toLowerCase()
    const ingredient = active.get(name) ?? null
    if (!values.ingredient) add('ingredient', 'Name the ingredient.')
    else if (!ingredient) {
      add(
        'ingredient',
        archived.has(name)
          ? `${archived.get(name)!.name} is archived: restore it before importing its purchases.`
          : `No active ingredient is named “${values.ingredient}”. Add it on the Ingredients page first, or fix the spelling.`,
      )
    }
    const cost = values.cost === '' ? null : parseMoneyToCents(values.cost)
    if (values.cost === '') add('cost', 'Enter the cost, such as 168.00.')
    else if (cost === null)
      add('cost', `“${values.cost}” is not an amount: write it like 168.00, without a minus sign.`)
    const freight = values.freight === '' ? 0 : parseMoneyToCents(values.freight)
    if (freight === null)
      add('freight', `“${values.freight}” is not an amount: write it like 12.50, or leave it empty.`)

    const parsed = PurchaseSchema.safeParse({
      ingredientId: ingredient?.id ?? 1,
      supplier: values.supplier,
      supplierLotCode: values.lot_code,
      receivedOn: values.received_on,
      quantity: GROUPED.test(values.quantity) ? values.quantity.replaceAll(',', '') : values.quantity,
      unit: values.unit.toLowerCase(),
      costCents: cost ?? 0,
      freightCents: freight ?? 0,
    })
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const column = COLUMN_OF[String(issue.path[0])]
        if (column) add(column, issue.message)
      }
    } else if (ingredient && errors.length === 0) {
      for (const p of checkIngredientAndDate(parsed.data, ingredient, today)) {
        add(COLUMN_OF[p.field] ?? 'line', p.message)
      }
      const key = [
        ingredient.id,
        values.supplier.toLowerCase(),
        values.lot_code.toLowerCase(),
        values.received_on,
      ].join('|')
      let inFile: string | null = null
      if (values.lot_code && seen.has(key)) {
        inFile = `The same purchase is on line ${seen.get(key)} already (same ingredient, supplier, lot code and date).`
      } else if (values.lot_code) seen.set(key, record.line)
      pending.push({ row: out.length, add, errors, purchase: parsed.data, inFile })
    }
    // The purchase is set below once the row has passed the check against recorded purchases.
    out.push({ line: record.line, values, errors, purchase: null })
  }

  // One query for every row's recorded duplicate; a recorded one is named before one within the file.
  const recorded = await recordedDeliveries(
    pending.map((p) => p.purchase),
    { transaction },
  )
  pending.forEach((p, i) => {
    if (recorded[i] !== undefined) {
      const dup = duplicateDelivery(recorded[i])
      p.add(COLUMN_OF[dup.field] ?? 'line', dup.message)
    }
    if (p.inFile) p.add('lot_code', p.inFile)
    if (p.errors.length === 0) out[p.row]!.purchase = p.purchase
  })
  // Column order, so the errors read left to right like the row.
  for (const row of out) {
    row.errors.sort(
      (a, b) =>
        IMPORT_COLUMNS.indexOf(a.field as ImportColumn) - IMPORT_COLUMNS.indexOf(b.field as ImportColumn),
    )
  }
  return out
}

const summary = (rows: Checked[]): ImportPreview => ({
  rows: rows.map(({ line, values, errors }) => ({ line, values, errors })),
  validCount: rows.filter((r) => r.errors.length === 0).length,
  errorCount: rows.filter((r) => r.errors.length > 0).length,
})

/** Every row checked as it would be imported; nothing is written. */
export async function previewImport(text: string): Promise<ImportPreview> {
  return summary(await checkRows(text))
}

/** All rows in one transaction, or none: any bad row refuses the whole file with every row's problems. */
export async function confirmImport(text: string, byUserId: number): Promise<ImportResult> {
  const ids = await sequelize.transaction(async (t) => {
    // Ingredients stay as they are while the file goes in (no rename or archive halfway).
    await sequelize.query('SELECT id FROM ingredients FOR SHARE', { type: QueryTypes.SELECT, transaction: t })
    const rows = await checkRows(text, t)
    const bad = rows.filter((r) => r.errors.length > 0)
    if (bad.length > 0) {
      throw AppError.unprocessable(
        'import_invalid',
        `${bad.length} of ${rows.length} ${rows.length === 1 ? 'row needs' : 'rows need'} attention; nothing was imported.`,
        bad.flatMap((r) => r.errors.map((e) => ({ line: r.line, field: e.field, message: e.message }))),
      )
    }
    const created = await IngredientLot.bulkCreate(
      rows.map((r) => ({ ...lotColumns(r.purchase!), createdBy: byUserId })),
      { transaction: t, returning: true },
    )
    await audit(
      {
        userId: byUserId,
        action: 'purchases.imported',
        entity: 'ingredient_lot',
        data: { count: created.length, ids: created.map((l) => l.id) },
      },
      t,
    )
    return created.map((l) => l.id)
  })
  const purchases = await lotRows({ ids })
  return { purchases, count: purchases.length }
}
