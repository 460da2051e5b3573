import { inject } from 'vitest'

export type CaughtMail = {
  id: string
  subject: string
  text: string
  html: string
  to: { address: string; name?: string }[]
  attachments?: { filename?: string; generatedFileName?: string; contentType: string; length?: number }[]
}

function mailUrl() {
  return inject('services').mailUrl
}

export async function allMail(): Promise<CaughtMail[]> {
  const r = await fetch(`${mailUrl()}/api/email`)
  if (!r.ok) throw new Error(`mail catcher answered ${r.status}`)
  return (await r.json()) as CaughtMail[]
}

/** Waits for a message to the address whose subject matches. */
export async function waitForMail(to: string, subject: RegExp, timeoutMs = 10_000): Promise<CaughtMail> {
  const until = Date.now() + timeoutMs
  for (;;) {
    const found = (await allMail())
      .filter(
        (m) => m.to.some((t) => t.address.toLowerCase() === to.toLowerCase()) && subject.test(m.subject),
      )
      .at(-1)
    if (found) return found
    if (Date.now() > until) throw new Error(`no e-mail to ${to} matching ${subject} within ${timeoutMs} ms`)
    await new Promise((r) => setTimeout(r, 150))
  }
}

/** The first link in a message's text that starts with the given prefix. */
export function linkIn(mail: CaughtMail, prefix: string): string {
  const m = mail.text.match(new RegExp(`${prefix.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\S+`))
  if (!m) throw new Error(`no link starting ${prefix} in e-mail "${mail.subject}"`)
  return m[0]
}
