import { createServer } from 'node:http'
import { env } from '@server/config/env'
import { closeDb, sequelize } from '@server/db/sequelize'
import { migrate } from '@server/db/migrator'
import { createApp } from '@server/app'
import { logger } from '@server/lib/logger'
import { closeMail } from '@server/lib/mailer'
import { startReminderJob } from '@server/modules/payments/reminders.job'
import { startMailOutbox } from '@server/modules/mail/outbox'
import { drainMail } from '@server/modules/invoices/mail-queue'
import { schedulePreorderAllocation } from '@server/modules/orders/preorders.service'

/** Runs the API and the built client on one port. Migrations run first; demo data is the start script's job. */
async function main() {
  await sequelize.authenticate()
  await migrate(sequelize)
  const app = createApp({ serveClient: true })
  const server = createServer(app)
  server.keepAliveTimeout = 65_000
  await new Promise<void>((resolve) => server.listen(env.PORT, env.HOST, resolve))
  logger.info('listening', { url: env.APP_URL })
  if (process.send) process.send({ type: 'listening', port: env.PORT })
  // The daily overdue-invoice reminders (off with JOBS=false, as in tests, which call the job themselves).
  const stopReminders = env.JOBS ? startReminderJob() : () => {}
  // Pre-orders get their bars the day their batch is ready: now, then once each studio day.
  const stopPreorders = env.JOBS ? schedulePreorderAllocation() : () => {}
  // E-mails kept in the outbox and not yet sent (a relay that refused them, or a process that
  // ended before it could): soon after start, then every minute.
  const stopOutbox = env.JOBS ? startMailOutbox() : () => {}

  let stopping = false
  const stop = (signal: string) => {
    if (stopping) return
    stopping = true
    logger.info('stopping', { signal })
    stopReminders()
    stopPreorders()
    stopOutbox()
    server.close(() => {
      // E-mails going out get a moment to finish; any that do not stay in the outbox for next time.
      void drainMail(3000)
        .then(() => closeMail())
        .then(() => closeDb())
        .then(() => process.exit(0))
    })
    server.closeAllConnections()
    setTimeout(() => process.exit(0), 5000).unref()
  }
  process.on('SIGINT', () => stop('SIGINT'))
  process.on('SIGTERM', () => stop('SIGTERM'))
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err)
  process.exit(1)
})
