import { logger } from '@server/lib/logger'
import { studioToday } from '@server/modules/availability/availability.service'
import { sendOverdueReminders } from '@server/modules/payments/reminders.service'

const HOUR_MS = 60 * 60 * 1000

/**
 * Runs the overdue reminders once per studio day: a check every hour (and a minute after start)
 * does the day's run the first time it sees a new date, so a restart or a late start still gets
 * it done. The 7-day rule lives in the reminders themselves, so an extra run sends nothing twice.
 */
export function startReminderJob(): () => void {
  let lastRun: string | null = null
  let running = false
  const tick = async () => {
    if (running) return
    running = true
    try {
      const today = await studioToday()
      if (today === lastRun) return
      const { sent, skipped } = await sendOverdueReminders(today)
      lastRun = today
      logger.info('overdue reminders', { day: today, sent: sent.length, skipped: skipped.length })
    } catch (err) {
      logger.warn('overdue reminders did not run', { error: (err as Error).message })
    } finally {
      running = false
    }
  }
  const first = setTimeout(() => void tick(), 60_000)
  const every = setInterval(() => void tick(), HOUR_MS)
  first.unref()
  every.unref()
  return () => {
    clearTimeout(first)
    clearInterval(every)
  }
}
