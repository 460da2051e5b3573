import { MailDev } from 'maildev'
import fs from 'node:fs'

export interface MailCatcher {
  smtpPort: number
  webPort: number
  url: string
  stop(): Promise<void>
}

/** maildev on loopback with its own mail folder. */
export async function startMailCatcher(opts: {
  smtpPort: number
  webPort: number
  dir: string
}): Promise<MailCatcher> {
  fs.mkdirSync(opts.dir, { recursive: true })
  const maildev = new MailDev({
    smtp: opts.smtpPort,
    web: opts.webPort,
    ip: '127.0.0.1',
    webIp: '127.0.0.1',
    mailDirectory: opts.dir,
    silent: true,
  })
  await maildev.start()
  return {
    smtpPort: opts.smtpPort,
    webPort: opts.webPort,
    url: `http://127.0.0.1:${opts.webPort}`,
    stop: () => maildev.stop(),
  }
}
