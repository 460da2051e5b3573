import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { addDays, compareIso } from '@shared/domain/dates/dates'
import type { ReminderDto } from '@shared/schemas/payments'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { logger } from '@server/lib/logger'
import { audit } from '@server/modules/audit/audit.service'
import { studioToday } from '@server/modules/availability/availability.service'
import { findInvoice } from '@server/modules/invoices/invoice-queries'
import { sendReminderMail } from '@server/modules/invoices/invoice-mail'
import { getSettings } from '@server/modules/settings/settings.service'

/** At most one reminder per invoice in this many days, whoever sends it. */
export const REMINDER_INTERVAL_DAYS = 7

async function lastReminder(invoiceId: number, t: Transaction): Promise<string | null> {
  const [r] = await sequelize.query<{ sent_on: string }>(
    'SELECT sent_on FROM invoice_reminders WHERE invoice_id = $1 ORDER BY sent_on DESC LIMIT 1',
    { bind: [invoiceId], type: QueryTypes.SELECT, transaction: t },
  )
  return r?.sent_on ?? null
}

/**
 * Sends one reminder with the invoice row locked (so two senders cannot both pass the 7-day
 * check) and records it only when the mail went out. `skipLocked` lets the daily job step past an
 * invoice someone is working on rather than wait for it.
 */
async function remindLocked(
  invoiceId: number,
  today: string,
  source: 'owner' | 'daily',
  userId: number | null,
  skipLocked: boolean,
): Promise<ReminderDto | { skipped: string }> {
  const { currency } = await getSettings()
  return sequelize.transaction(async (t) => {
    const [locked] = await sequelize.query<{ id: number }>(
      `SELECT id FROM invoices WHERE id = $1 FOR UPDATE ${skipLocked ? 'SKIP LOCKED' : ''}`,
      { bind: [invoiceId], type: QueryTypes.SELECT, transaction: t },
    )
    if (!locked) {
      if (skipLocked) return { skipped: 'busy' }
      throw AppError.notFound('That invoice')
    }
    const invoice = (await findInvoice(invoiceId, { role: 'owner', shopId: null }, today, currency, t))!
    if (invoice.kind !== 'invoice' || invoice.outstandingCents === 0) {
      if (source === 'daily') return { skipped: 'nothing owed' }
      throw AppError.conflict(
        'nothing_owed',
        `Nothing is owed on ${invoice.number} (${invoice.status.replace('_', ' ')}); there is nothing to remind about.`,
      )
    }
    if (source === 'daily' && invoice.status !== 'overdue') return { skipped: 'not overdue' }
    const last = await lastReminder(invoiceId, t)
    if (last && compareIso(addDays(last, REMINDER_INTERVAL_DAYS), today) > 0) {
      if (source === 'daily') return { skipped: 'reminded recently' }
      const next = addDays(last, REMINDER_INTERVAL_DAYS)
      throw AppError.conflict(
        'reminder_recent',
        `A reminder for ${invoice.number} went out on ${last}; the next one can go on ${next}.`,
        [{ field: 'invoiceId', message: `Last reminder ${last}.`, lastSentOn: last, nextOn: next }],
      )
    }
    const sentTo = await sendReminderMail(invoice, today)
    if (sentTo.length === 0) {
      if (source === 'daily') return { skipped: 'mail failed' }
      throw new AppError(
        502,
        'mail_failed',
        'The reminder could not be sent. Check the mail settings and try again.',
      )
    }
    await sequelize.query(
      `INSERT INTO invoice_reminders (invoice_id, sent_on, sent_to, source, sent_by) VALUES ($1, $2, $3, $4, $5)`,
      { bind: [invoiceId, today, sentTo.join(', '), source, userId], transaction: t },
    )
    await audit(
      {
        userId,
        action: 'invoice.reminded',
        entity: 'invoice',
        entityId: invoiceId,
        data: { source, to: sentTo },
      },
      t,
    )
    return { invoiceId, sentOn: today, sentTo }
  })
}

/** `POST /api/invoices/:id/remind`: the owner sends a reminder now (the 7-day rule still holds). */
export async function remindInvoice(invoiceId: number, userId: number): Promise<ReminderDto> {
  const result = await remindLocked(invoiceId, await studioToday(), 'owner', userId, false)
  return result as ReminderDto
}

/**
 * The daily job: a reminder for every overdue invoice that had none in the last 7 days. Safe to
 * run more than once a day, or from two processes at once: each invoice is checked under its lock.
 */
export async function sendOverdueReminders(
  today: string,
): Promise<{ sent: ReminderDto[]; skipped: { invoiceId: number; reason: string }[] }> {
  const candidates = await sequelize.query<{ id: number }>(
    `SELECT i.id FROM invoices i
      WHERE i.kind = 'invoice' AND i.voided_at IS NULL AND i.paid_cents < i.total_cents AND i.due_date < $1::date
        AND NOT EXISTS (SELECT 1 FROM invoice_reminders r WHERE r.invoice_id = i.id AND r.sent_on > $1::date - $2::int)
      ORDER BY i.due_date, i.id`,
    { bind: [today, REMINDER_INTERVAL_DAYS], type: QueryTypes.SELECT },
  )
  const sent: ReminderDto[] = []
  const skipped: { invoiceId: number; reason: string }[] = []
  for (const c of candidates) {
    try {
      const r = await remindLocked(c.id, today, 'daily', null, true)
      if ('skipped' in r) skipped.push({ invoiceId: c.id, reason: r.skipped })
      else sent.push(r)
    } catch (err) {
      skipped.push({ invoiceId: c.id, reason: (err as Error).message })
      logger.warn('overdue reminder failed', { invoiceId: c.id, error: (err as Error).message })
    }
  }
  return { sent, skipped }
}
