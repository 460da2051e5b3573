import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { DomainError } from '@shared/domain/errors'
import { formatInvoiceNumber } from '@shared/domain/invoices/terms'
import { yearOf } from '@shared/domain/dates/dates'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { getSettings } from '@server/modules/settings/settings.service'

/**
 * The next number of the issue date's yearly series. The upsert takes the year's row lock and
 * keeps it until the caller's transaction ends, so concurrent issuers queue one behind another,
 * and a rollback gives the number back: the series stays gapless (REFERENCES: Directive
 * 2006/112/EC, Art. 226(2); "without gaps" in some national laws). Call it last, after every
 * check that could still refuse the invoice, to hold the lock as briefly as possible.
 */
export async function takeInvoiceNumber(
  issueDate: string,
  t: Transaction,
): Promise<{ year: number; seq: number; number: string }> {
  const year = yearOf(issueDate)
  const { invoicePrefix } = await getSettings(t)
  const prefix = invoicePrefix.trim().toUpperCase()
  const [row] = await sequelize.query<{ last: number }>(
    `INSERT INTO invoice_sequences (year, last) VALUES ($1, 1)
     ON CONFLICT (year) DO UPDATE SET last = invoice_sequences.last + 1
     RETURNING last`,
    { bind: [year], type: QueryTypes.SELECT, transaction: t },
  )
  try {
    return { year, seq: row!.last, number: formatInvoiceNumber(year, row!.last, prefix) }
  } catch (err) {
    if (err instanceof DomainError && err.code === 'invalid_prefix') {
      throw AppError.conflict(
        'invalid_invoice_prefix',
        `The invoice prefix "${prefix}" in the studio settings is not usable: ${err.message}.`,
        [{ field: 'invoicePrefix', message: err.message }],
      )
    }
    throw err
  }
}
