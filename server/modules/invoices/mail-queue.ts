import { logger } from '@server/lib/logger'

// E-mails with PDFs go out one at a time, after the work that caused them has committed.
// Rendering a PDF holds the event loop for a while: rendered in the middle of a burst (twenty
// shipments at once), every render would stretch the open transactions, and with them the locks
// they hold on stock and on the invoice series. So the queue waits while such work is in flight
// (`holdMail`), then sends; a burst commits first and its mail follows.

let tail: Promise<void> = Promise.resolve()
let pending = 0
let holding = 0
const MAX_HOLD_MS = 10_000

/** Runs `work` with the mail queue held back until it (and any other held work) has finished. */
export async function holdMail<T>(work: () => Promise<T>): Promise<T> {
  holding += 1
  try {
    return await work()
  } finally {
    holding -= 1
  }
}

async function quiet() {
  const until = Date.now() + MAX_HOLD_MS
  while (holding > 0 && Date.now() < until) await new Promise((r) => setTimeout(r, 25))
}

/** Queues mail work; a failure is logged, never thrown into a finished request. */
export function queueMail(label: string, work: () => Promise<unknown>): void {
  pending += 1
  tail = tail
    .then(quiet)
    .then(work)
    .then(
      () => undefined,
      (err: unknown) => logger.warn('mail not sent', { label, error: (err as Error).message }),
    )
    .finally(() => {
      pending -= 1
    })
}

/** Resolves once every queued mail has been handed to the mail server. */
export async function mailQueueIdle(): Promise<void> {
  while (pending > 0) await tail
}

// Mail sent alongside the queue rather than through it (the orders module's order e-mails, which
// carry no PDF and need not wait for a burst): tracked so that a drain sees them too.
const inFlight = new Set<Promise<unknown>>()

/** Keeps count of mail work started outside the queue until it settles; answers the same promise. */
export function trackMail<T>(work: Promise<T>): Promise<T> {
  inFlight.add(work)
  const done = () => inFlight.delete(work)
  work.then(done, done)
  return work
}

/** How many mail jobs are queued or in flight now (the benchmark reports it). */
export function mailBacklog(): number {
  return pending + inFlight.size
}

/**
 * Waits until no mail is queued or in flight, including mail queued meanwhile by mail that was
 * still going out (a shutdown, or a test file closing its database). Failures are logged where
 * they happen, as ever; this only waits. Gives up after `timeoutMs` and answers how many are left,
 * so a mail that hangs is reported rather than waited on forever.
 */
export async function drainMail(timeoutMs = 30_000): Promise<number> {
  const until = Date.now() + timeoutMs
  const left = () => pending + inFlight.size
  while (left() > 0 && Date.now() < until) {
    const wait = Promise.allSettled([tail, ...inFlight])
    await Promise.race([wait, new Promise((r) => setTimeout(r, Math.max(0, until - Date.now())))])
  }
  return left()
}
