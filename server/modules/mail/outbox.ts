import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { sequelize } from '@server/db/sequelize'
import { logger } from '@server/lib/logger'
import { countMailFailures } from '@server/lib/mailer'
import { queueMail, trackMail } from '@server/modules/invoices/mail-queue'
import type { OrderMail } from '@server/modules/orders/order-mail'

/**
 * The e-mails a change owes its people, kept in `mail_outbox` by the change's own transaction so
 * that none is lost to a restart, a crash or a relay that is down:
 * - `keepMail(jobs, t)` writes the rows; when `t` commits they are sent at once (the fast path,
 *   as before), and each row is deleted when the relay has taken every message of its job.
 * - A job whose send failed is kept with its error and tried again later, at growing intervals,
 *   and given up (kept, marked, logged) after `MAX_ATTEMPTS`.
 * - A row whose process ended before its job was done is due `LEASE` after it was written; the
 *   outbox job (`startMailOutbox`, every minute and once at start) sends it then.
 * A job is sent again whole, so a job of several messages that failed half-way can reach some
 * people twice: at least once, never silently not at all.
 */
export type MailJob =
  | { kind: 'order'; mail: OrderMail }
  | { kind: 'invoice'; invoiceId: number; reason: 'issued' | 'credit_note' }
  | { kind: 'shipment'; orderId: number }
  | { kind: 'card_receipt'; invoiceId: number; amountCents: number; reference: string; paidOn: string }
  | { kind: 'card_refund'; invoiceId: number; amountCents: number; reference: string }

export type KeptMail = { id: number; job: MailJob; label: string }

/** How long a job's own process has to send it before the outbox job may. */
export const LEASE_SECONDS = 120
export const MAX_ATTEMPTS = 6
/** Waits after the 1st, 2nd… failure (minutes): about a day in all before it gives up. */
const RETRY_MINUTES = [1, 5, 30, 120, 720]

function labelOf(job: MailJob): string {
  switch (job.kind) {
    case 'order':
      return `order ${job.mail.orderId} ${job.mail.kind}`
    case 'invoice':
      return `${job.reason === 'credit_note' ? 'credit note' : 'invoice'} ${job.invoiceId}`
    case 'shipment':
      return `shipment of order ${job.orderId}`
    case 'card_receipt':
      return `card receipt ${job.reference}`
    case 'card_refund':
      return `card refund ${job.reference}`
  }
}

/** Sends one job's e-mails, reading what they show as it stands now. */
async function runJob(job: MailJob): Promise<void> {
  switch (job.kind) {
    case 'order': {
      const { sendOrderMail } = await import('@server/modules/orders/order-mail')
      return sendOrderMail(job.mail)
    }
    case 'invoice': {
      const { sendInvoiceMail } = await import('@server/modules/invoices/invoice-mail')
      await sendInvoiceMail(job.invoiceId, job.reason)
      return
    }
    case 'shipment': {
      const { sendShipmentMail } = await import('@server/modules/shipments/shipment-mail')
      await sendShipmentMail(job.orderId)
      return
    }
    case 'card_receipt': {
      const { sendCardReceipt } = await import('@server/modules/card-payments/card-mail')
      return sendCardReceipt(job)
    }
    case 'card_refund': {
      const { sendCardRefundMail } = await import('@server/modules/card-payments/card-mail')
      return sendCardRefundMail(job)
    }
  }
}

/** A kept job as `keepMail` answers it, for a row another statement wrote (placing an order). */
export function keptMail(id: number, job: MailJob): KeptMail {
  return { id, job, label: labelOf(job) }
}

/** Writes the jobs in `t`; they go out as soon as `t` commits. Nothing is written for no jobs. */
export async function keepMail(jobs: MailJob[], t: Transaction): Promise<KeptMail[]> {
  if (jobs.length === 0) return []
  const labels = jobs.map(labelOf)
  const rows = await sequelize.query<{ id: string }>(
    `INSERT INTO mail_outbox (job, label, next_attempt_at)
     SELECT j, l, now() + make_interval(secs => $3) FROM unnest($1::jsonb[], $2::text[]) AS x(j, l)
     RETURNING id`,
    {
      bind: [jobs.map((j) => JSON.stringify(j)), labels, LEASE_SECONDS],
      type: QueryTypes.SELECT,
      transaction: t,
    },
  )
  const kept = rows.map((r, i) => ({ id: Number(r.id), job: jobs[i]!, label: labels[i]! }))
  t.afterCommit(() => sendKept(kept))
  return kept
}

const running = new Set<number>()

/**
 * Sends kept jobs now, off the request: order e-mails straight away, the others (PDFs to render)
 * through the queue that lets a burst of work commit first. `work` may stand in for a job's usual
 * sender when the caller already holds what it shows (placing an order has just read it back).
 */
export function sendKept(
  kept: KeptMail[],
  work?: (k: KeptMail) => (() => Promise<unknown>) | undefined,
): void {
  for (const k of kept) {
    const run = work?.(k) ?? (() => runJob(k.job))
    if (k.job.kind === 'order') void trackMail(attempt(k, run))
    else queueMail(k.label, () => attempt(k, run))
  }
}

// Sent jobs' rows are deleted a few at a time: in a burst of orders one DELETE per e-mail was a
// statement per order more for the database (a row whose delete is lost is sent again, once).
let sentIds: number[] = []
let deleting: Promise<void> | null = null

function forget(id: number) {
  sentIds.push(id)
  deleting ??= trackMail(deleteSent())
}

async function deleteSent(): Promise<void> {
  try {
    await new Promise((r) => setTimeout(r, 10))
    while (sentIds.length > 0) {
      const ids = sentIds
      sentIds = []
      await sequelize.query('DELETE FROM mail_outbox WHERE id = ANY($1::bigint[])', { bind: [ids] })
    }
  } catch (err) {
    sentIds = []
    logger.warn('sent mail left in the outbox', { error: (err as Error).message })
  } finally {
    deleting = null
  }
}

/**
 * One try at a kept job: deleted when every message went, else kept for a later try. Answers
 * whether it was sent (false also when the job is being tried already).
 */
async function attempt(k: KeptMail, run: () => Promise<unknown>): Promise<boolean> {
  if (running.has(k.id)) return false
  running.add(k.id)
  try {
    let failures: { count: number; lastError?: string }
    try {
      failures = await countMailFailures(run)
    } catch (err) {
      failures = { count: 1, lastError: err instanceof Error ? err.message : String(err) }
    }
    if (failures.count === 0) {
      forget(k.id)
      return true
    }
    const [row] = await sequelize.query<{ attempts: number; gave_up: boolean }>(
      `UPDATE mail_outbox
          SET attempts = attempts + 1, last_error = $2,
              next_attempt_at = now() + make_interval(mins => ($3::int[])[least(attempts + 1, $4)]),
              gave_up_at = CASE WHEN attempts + 1 >= $5 THEN now() END
        WHERE id = $1
        RETURNING attempts, gave_up_at IS NOT NULL AS gave_up`,
      {
        bind: [k.id, failures.lastError ?? 'not sent', RETRY_MINUTES, RETRY_MINUTES.length, MAX_ATTEMPTS],
        type: QueryTypes.SELECT,
      },
    )
    const log = row?.gave_up ? logger.error : logger.warn
    log(row?.gave_up ? 'mail given up' : 'mail kept for another try', {
      label: k.label,
      attempts: row?.attempts,
      error: failures.lastError,
    })
  } catch (err) {
    // The outbox itself could not be written (the database went away): the row stays due.
    logger.warn('mail outbox not updated', { label: k.label, error: (err as Error).message })
  } finally {
    running.delete(k.id)
  }
  return false
}

/** Whether this process is trying the job right now. */
export const isSending = (id: number) => running.has(id)

/** Tries a kept job at once, whatever its wait (the owner asked): answers whether it was sent. */
export function sendKeptNow(k: KeptMail): Promise<boolean> {
  return attempt(k, () => runJob(k.job))
}

/**
 * Sends the kept jobs that are due (a failed try's wait is over, or their process ended before
 * sending them), oldest first, at most `limit`; answers how many it started. Each is leased
 * first, so a second caller does not take it too.
 */
export async function sendDueMail(limit = 50): Promise<number> {
  const due = await sequelize.query<{ id: string; job: MailJob; label: string }>(
    `UPDATE mail_outbox SET next_attempt_at = now() + make_interval(secs => $2)
      WHERE id IN (SELECT id FROM mail_outbox
                    WHERE gave_up_at IS NULL AND next_attempt_at <= now() AND NOT (id = ANY($3::bigint[]))
                    ORDER BY id LIMIT $1 FOR UPDATE SKIP LOCKED)
      RETURNING id, job, label`,
    { bind: [limit, LEASE_SECONDS, [...running]], type: QueryTypes.SELECT },
  )
  const kept = due.map((r) => ({ id: Number(r.id), job: r.job, label: r.label })).sort((a, b) => a.id - b.id)
  sendKept(kept)
  return kept.length
}

/** Runs `sendDueMail` once soon after start and then every minute; answers a stop function. */
export function startMailOutbox(): () => void {
  const tick = () =>
    void sendDueMail().catch((err: unknown) =>
      logger.warn('mail outbox not read', { error: err instanceof Error ? err.message : String(err) }),
    )
  const first = setTimeout(tick, 5_000)
  const every = setInterval(tick, 60_000)
  first.unref()
  every.unref()
  return () => {
    clearTimeout(first)
    clearInterval(every)
  }
}
