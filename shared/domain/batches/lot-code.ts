/**
 * Batch lot codes read `261201-LAV-01`: the pour date as YYMMDD, the product's SKU, and the
 * batch's number among that SKU's pours of the day (1-based, two digits). Date first so codes
 * sort by age, SKU so a packer can tell bars apart at a glance, and at most 22 characters so the
 * code fits on a bar label beside the net weight. Letters are stored in capitals; the code is
 * read back in any case.
 */
import { DomainError } from '@shared/domain/errors'
import { isValidIsoDate } from '@shared/domain/dates/dates'

export const LOT_SKU_MAX_LENGTH = 12
const SKU = /^[A-Z0-9](?:[A-Z0-9-]*[A-Z0-9])?$/
const LOT_CODE = /^(\d{2})(\d{2})(\d{2})-([A-Z0-9-]+)-(\d{2})$/

export interface LotCodeParts {
  pourDate: string
  sku: string
  seq: number
}

function normaliseSku(sku: string): string | null {
  const clean = sku.trim().toUpperCase()
  return clean.length <= LOT_SKU_MAX_LENGTH && SKU.test(clean) && !clean.includes('--') ? clean : null
}

export function formatLotCode({ pourDate, sku, seq }: LotCodeParts): string {
  if (!isValidIsoDate(pourDate) || !pourDate.startsWith('20')) {
    throw new DomainError(
      'invalid_date',
      `Pour date must be a date in 2000–2099 (got ${pourDate})`,
      'pourDate',
    )
  }
  const code = normaliseSku(sku)
  if (code === null) {
    throw new DomainError(
      'invalid_sku',
      `A SKU on a lot code is 1–${LOT_SKU_MAX_LENGTH} letters, digits and single inner hyphens (got ${sku})`,
      'sku',
    )
  }
  if (!Number.isSafeInteger(seq) || seq < 1 || seq > 99) {
    throw new DomainError('invalid_sequence', `The batch number of the day runs 1–99 (got ${seq})`, 'seq')
  }
  const yymmdd = pourDate.slice(2).replaceAll('-', '')
  return `${yymmdd}-${code}-${String(seq).padStart(2, '0')}`
}

/** The parts of a lot code, or null when it is not one (including impossible dates). */
export function parseLotCode(text: string): LotCodeParts | null {
  const match = LOT_CODE.exec(text.trim().toUpperCase())
  if (!match) return null
  const [, yy, mm, dd, rawSku = '', rawSeq] = match
  const pourDate = `20${yy}-${mm}-${dd}`
  const sku = normaliseSku(rawSku)
  const seq = Number(rawSeq)
  if (!isValidIsoDate(pourDate) || sku === null || seq < 1) return null
  return { pourDate, sku, seq }
}
