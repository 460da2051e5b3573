/**
 * npm start: everything on one machine, on loopback. PostgreSQL (installed from Debian's
 * packages when missing and we are root), migrations, demo data on an empty database, the mail
 * catcher, the client build when its sources changed, and the server at one URL. Ctrl-C stops
 * all of it.
 */
import { spawn, spawnSync } from 'node:child_process'
import fs from 'node:fs'
import path from 'node:path'
import { DEMO_PASSWORDS, DEMO_SHOPS, DEMO_STAFF } from '../seeders/demo/scenario'
import { startCardServiceFake } from './lib/card-service-fake'
import type { CardServiceFake } from './lib/card-service-fake'
import { ROOT, loadSecrets, startLocalStack } from './lib/local-stack'
import { freePort, isPortFree } from './lib/ports'
import { SERVER_NODE_FLAGS, buildServerIfStale } from './lib/server-build'

const log = (l: string) => console.log(`[lathercase] ${l}`)

function newestMtime(p: string): number {
  if (!fs.existsSync(p)) return 0
  const st = fs.statSync(p)
  if (!st.isDirectory()) return st.mtimeMs
  return Math.max(st.mtimeMs, ...fs.readdirSync(p).map((f) => newestMtime(path.join(p, f))))
}

function buildClientIfStale() {
  const built = path.join(ROOT, 'dist', 'client', 'index.html')
  const sources = ['src', 'shared', 'index.html', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json']
  const newest = Math.max(...sources.map((s) => newestMtime(path.join(ROOT, s))))
  if (fs.existsSync(built) && fs.statSync(built).mtimeMs >= newest) return
  log('Building the client…')
  const r = spawnSync(path.join(ROOT, 'node_modules', '.bin', 'vite'), ['build', '--logLevel', 'warn'], {
    cwd: ROOT,
    stdio: 'inherit',
  })
  if (r.status !== 0) throw new Error('The client build failed; see above.')
}

async function main() {
  const port = Number(process.env.PORT ?? 3000)
  const host = '127.0.0.1'
  if (!(await isPortFree(port, host))) {
    throw new Error(
      `Port ${port} is already in use. Stop what runs there, or start with PORT=3100 npm start.`,
    )
  }
  buildClientIfStale()
  const serverFile = await buildServerIfStale(ROOT, log)
  const stack = await startLocalStack(log)
  const secrets = loadSecrets()
  const appUrl = process.env.APP_URL ?? `http://${host}:${port}`
  // Card payments: with CARD_SECRET_KEY set the real service is used as configured; otherwise the
  // local fake runs on loopback and the server's SDK is pointed at it.
  let cardFake: CardServiceFake | null = null
  let cardEnv: Record<string, string> = {}
  if (!process.env.CARD_SECRET_KEY) {
    const wanted = Number(process.env.CARD_FAKE_PORT ?? 12111)
    const fakePort = (await isPortFree(wanted, host)) ? wanted : await freePort()
    cardFake = await startCardServiceFake({
      port: fakePort,
      host,
      webhookSecret: secrets.cardWebhookSecret,
      webhookUrl: `${appUrl}/api/webhooks/card`,
    })
    cardEnv = {
      CARD_SECRET_KEY: secrets.cardSecretKey,
      CARD_WEBHOOK_SECRET: secrets.cardWebhookSecret,
      CARD_API_HOST: host,
      CARD_API_PORT: String(cardFake.port),
      CARD_API_PROTOCOL: 'http',
    }
  }
  const server = spawn(process.execPath, [...SERVER_NODE_FLAGS, serverFile], {
    cwd: ROOT,
    stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
    env: {
      ...process.env,
      NODE_ENV: process.env.NODE_ENV ?? 'production',
      HOST: host,
      PORT: String(port),
      APP_URL: appUrl,
      DATABASE_URL: stack.databaseUrl,
      SESSION_SECRET: process.env.SESSION_SECRET ?? secrets.sessionSecret,
      SMTP_HOST: '127.0.0.1',
      SMTP_PORT: String(stack.mail.smtpPort),
      MAIL_CATCHER_URL: stack.mail.url,
      ...cardEnv,
    },
  })

  let stopping = false
  const shutdown = async (code: number) => {
    if (stopping) return
    stopping = true
    log('Stopping…')
    if (server.exitCode === null) {
      server.kill('SIGTERM')
      await new Promise((r) => server.once('exit', r))
    }
    await cardFake?.stop()
    await stack.stop()
    log('Stopped.')
    process.exit(code)
  }
  process.on('SIGINT', () => void shutdown(0))
  process.on('SIGTERM', () => void shutdown(0))
  server.on('exit', (code) => {
    if (!stopping) {
      log(`The server stopped (exit ${code}).`)
      void shutdown(code ?? 1)
    }
  })
  server.on('message', (m: { type?: string }) => {
    if (m?.type !== 'listening') return
    const buyers = DEMO_SHOPS.map(
      (s) => `    buyer   ${s.buyer.email.padEnd(28)} ${DEMO_PASSWORDS.buyer}   (${s.tradingName})`,
    )
    console.log(
      [
        '',
        `  Lathercase is running at   ${appUrl}`,
        `  Mail catcher (all e-mail)  ${stack.mail.url}`,
        cardFake
          ? `  Card payments              test card service at ${cardFake.url} (card 4242 4242 4242 4242 pays)`
          : '  Card payments              the card service configured in CARD_SECRET_KEY',
        '',
        '  Demo sign-ins:',
        ...DEMO_STAFF.map((s) => `    ${s.role.padEnd(7)} ${s.email.padEnd(28)} ${DEMO_PASSWORDS[s.role]}`),
        ...buyers,
        '',
        '  Press Ctrl-C to stop.',
        '',
      ].join('\n'),
    )
  })
}

main().catch((err) => {
  console.error(`[lathercase] ${err instanceof Error ? err.message : String(err)}`)
  process.exit(1)
})
