import { AsyncLocalStorage } from 'node:async_hooks'
import nodemailer from 'nodemailer'
import type { Attachment } from 'nodemailer/lib/mailer'
import type { Email } from '@templates/email/layout'
import { env } from '@server/config/env'
import { logger } from '@server/lib/logger'

const transport = nodemailer.createTransport({
  // Connections kept open and reused: a burst of orders (two e-mails each) would otherwise open
  // and greet the relay once per message and hold hundreds of sockets at its peak. Ten at once:
  // with three, the e-mails of a busy minute fell behind the orders (the benchmark measures it).
  pool: true,
  maxConnections: 10,
  maxMessages: 100,
  host: env.SMTP_HOST,
  port: env.SMTP_PORT,
  secure: env.SMTP_SECURE,
  // The local mail catcher speaks plain SMTP; a real relay is configured with SMTP_SECURE and credentials.
  ignoreTLS: !env.SMTP_SECURE && !env.SMTP_USER,
  auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASS ?? '' } : undefined,
})

export type OutgoingMail = Email & { to: string | string[]; attachments?: Attachment[]; replyTo?: string }

type Failures = { count: number; lastError?: string }
const failuresSeen = new AsyncLocalStorage<Failures>()

/**
 * Runs `work` (which may send any number of e-mails) and counts the sends that failed inside it,
 * however deep, so that the outbox can keep a job for another try without every sender having to
 * report back.
 */
export async function countMailFailures(work: () => Promise<unknown>): Promise<Failures> {
  const seen: Failures = { count: 0 }
  await failuresSeen.run(seen, work)
  return seen
}

/** Sends one e-mail; failures are logged and reported to the caller as false, never thrown. */
export async function sendMail(mail: OutgoingMail): Promise<boolean> {
  try {
    await transport.sendMail({
      from: env.MAIL_FROM,
      to: mail.to,
      replyTo: mail.replyTo,
      subject: mail.subject,
      text: mail.text,
      html: mail.html,
      attachments: mail.attachments,
    })
    return true
  } catch (err) {
    logger.warn('mail not sent', { to: mail.to, subject: mail.subject, error: (err as Error).message })
    const seen = failuresSeen.getStore()
    if (seen) {
      seen.count += 1
      seen.lastError = (err as Error).message
    }
    return false
  }
}

/** Closes the relay connections (the server calls it when it stops). */
export function closeMail(): void {
  transport.close()
}
