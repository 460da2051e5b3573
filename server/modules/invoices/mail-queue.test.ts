import { afterEach, describe, expect, it, vi } from 'vitest'
import { logger } from '@server/lib/logger'
import { drainMail, queueMail, trackMail } from '@server/modules/invoices/mail-queue'

// The queue's only collaborator; the real logger reads the server's environment at import.
vi.mock('@server/lib/logger', () => ({ logger: { warn: vi.fn(), info: vi.fn(), error: vi.fn() } }))

const later = (ms: number, sent: string[], name: string) => () =>
  new Promise<void>((r) =>
    setTimeout(() => {
      sent.push(name)
      r()
    }, ms),
  )

afterEach(() => {
  vi.clearAllMocks()
})

describe('drainMail', () => {
  it('waits for queued mail, mail it queues in turn, and mail tracked outside the queue', async () => {
    const sent: string[] = []
    queueMail('first', async () => {
      await later(30, sent, 'first')()
      // Mail that queues more while it goes out (an invoice after a shipment).
      queueMail('follow-up', later(20, sent, 'follow-up'))
    })
    void trackMail(later(60, sent, 'order')())
    expect(await drainMail()).toBe(0)
    expect(sent.sort()).toEqual(['first', 'follow-up', 'order'])
  })

  it('does not hide a failure: it is logged as ever, and the drain still ends', async () => {
    const warn = vi.mocked(logger.warn)
    queueMail('broken', () => Promise.reject(new Error('relay refused')))
    expect(await drainMail()).toBe(0)
    expect(warn).toHaveBeenCalledWith('mail not sent', { label: 'broken', error: 'relay refused' })
  })

  it('answers how many are left when mail outlasts the wait, rather than waiting forever', async () => {
    const sent: string[] = []
    void trackMail(later(300, sent, 'slow')())
    expect(await drainMail(50)).toBe(1)
    expect(sent).toEqual([])
    expect(await drainMail()).toBe(0)
    expect(sent).toEqual(['slow'])
  })
})
