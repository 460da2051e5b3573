/**
 * npm test: builds the client (the browser tests run against the built app), then runs every
 * vitest project: unit, client components, API against a real PostgreSQL, and the browser. The
 * API and browser projects start and stop their own PostgreSQL cluster and mail catcher.
 * Extra arguments go to vitest (e.g. `npm test -- --project api`).
 */
import { spawnSync } from 'node:child_process'
import fs from 'node:fs'
import path from 'node:path'
import { ROOT } from './lib/root'

const bin = (n: string) => path.join(ROOT, 'node_modules', '.bin', n)
const args = process.argv.slice(2)
const wantsBrowser = args.length === 0 || args.some((a) => a.includes('e2e'))

if (wantsBrowser) {
  const build = spawnSync(bin('vite'), ['build', '--logLevel', 'warn'], { cwd: ROOT, stdio: 'inherit' })
  if (build.status !== 0) process.exit(build.status ?? 1)
}

const report = path.join(ROOT, 'test-results', 'vitest.json')
fs.mkdirSync(path.dirname(report), { recursive: true })
fs.rmSync(report, { force: true })
const run = spawnSync(
  bin('vitest'),
  ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...args],
  {
    cwd: ROOT,
    stdio: 'inherit',
    env: { ...process.env, VITE_CONFIG_NATIVE_IGNORE_WARNING: 'true' },
  },
)
if (fs.existsSync(report)) {
  const r = JSON.parse(fs.readFileSync(report, 'utf8')) as {
    numPassedTests: number
    numFailedTests: number
    numPendingTests: number
  }
  console.log(`\n${r.numPassedTests} passed, ${r.numFailedTests} failed, ${r.numPendingTests} skipped`)
}
process.exit(run.status ?? 1)
