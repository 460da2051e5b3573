/**
 * npm run dev: the same local stack as npm start, the API restarted on change (tsx watch) and
 * Vite's dev server with /api proxied to it.
 */
import { spawn } from 'node:child_process'
import path from 'node:path'
import { startCardServiceFake } from './lib/card-service-fake'
import { ROOT, loadSecrets, startLocalStack } from './lib/local-stack'
import { freePort, isPortFree } from './lib/ports'

const log = (l: string) => console.log(`[lathercase dev] ${l}`)

async function main() {
  const stack = await startLocalStack(log)
  const secrets = loadSecrets()
  const apiPort = Number(process.env.PORT ?? 3000)
  const vitePort = Number(process.env.VITE_PORT ?? 5173)
  // The local test card service, as npm start runs it, unless a real key is configured.
  const wantedCard = Number(process.env.CARD_FAKE_PORT ?? 12111)
  const cardFake = process.env.CARD_SECRET_KEY
    ? null
    : await startCardServiceFake({
        port: (await isPortFree(wantedCard)) ? wantedCard : await freePort(),
        webhookSecret: secrets.cardWebhookSecret,
        webhookUrl: `http://127.0.0.1:${apiPort}/api/webhooks/card`,
      })
  const env = {
    ...process.env,
    NODE_ENV: 'development',
    PORT: String(apiPort),
    APP_URL: `http://127.0.0.1:${vitePort}`,
    DATABASE_URL: stack.databaseUrl,
    SESSION_SECRET: secrets.sessionSecret,
    SMTP_PORT: String(stack.mail.smtpPort),
    MAIL_CATCHER_URL: stack.mail.url,
    API_URL: `http://127.0.0.1:${apiPort}`,
    ...(cardFake
      ? {
          CARD_SECRET_KEY: secrets.cardSecretKey,
          CARD_WEBHOOK_SECRET: secrets.cardWebhookSecret,
          CARD_API_HOST: '127.0.0.1',
          CARD_API_PORT: String(cardFake.port),
          CARD_API_PROTOCOL: 'http',
        }
      : {}),
  }
  const bin = (n: string) => path.join(ROOT, 'node_modules', '.bin', n)
  const children = [
    spawn(bin('tsx'), ['watch', '--clear-screen=false', 'server/index.ts'], {
      cwd: ROOT,
      env,
      stdio: 'inherit',
    }),
    spawn(bin('vite'), ['--port', String(vitePort), '--strictPort'], { cwd: ROOT, env, stdio: 'inherit' }),
  ]
  log(
    `App (Vite) http://127.0.0.1:${vitePort}  ·  API http://127.0.0.1:${apiPort}  ·  Mail ${stack.mail.url}`,
  )
  const stop = async () => {
    for (const c of children) c.kill('SIGTERM')
    await cardFake?.stop()
    await stack.stop()
    process.exit(0)
  }
  process.on('SIGINT', () => void stop())
  process.on('SIGTERM', () => void stop())
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err)
  process.exit(1)
})
