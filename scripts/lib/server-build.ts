/**
 * The started server runs from one bundled file (dist/server/index.mjs, built with esbuild, the
 * packages left as imports) rather than through tsx: the in-process transpiler and its per-module
 * source maps cost about 40 MB of resident memory at start. Rebuilt when server/, shared/ or
 * templates/ changed since the last build. Migrations stay TypeScript: the start and bench scripts
 * apply them (through tsx) before the server starts, so the server finds none pending.
 */
import fs from 'node:fs'
import path from 'node:path'
import { build } from 'esbuild'

/**
 * Node's flags for the started server (npm start and the benchmark alike). The old generation is
 * capped at 192 MB: on a machine with plenty of memory V8 otherwise lets garbage (a PDF's parsed
 * fonts, a busy minute's requests) pile up to well over 100 MB before it collects, while the
 * server lives in about 70 MB. SERVER_HEAP_MB raises it, should a studio's exports outgrow it.
 */
export const SERVER_NODE_FLAGS = [`--max-old-space-size=${Number(process.env.SERVER_HEAP_MB) || 192}`]

function newestMtime(p: string): number {
  if (!fs.existsSync(p)) return 0
  const st = fs.statSync(p)
  if (!st.isDirectory()) return st.mtimeMs
  return Math.max(st.mtimeMs, ...fs.readdirSync(p).map((f) => newestMtime(path.join(p, f))))
}

/** Builds dist/server/index.mjs when stale and returns its path. */
export async function buildServerIfStale(root: string, log: (l: string) => void): Promise<string> {
  const out = path.join(root, 'dist', 'server', 'index.mjs')
  const sources = ['server', 'shared', 'templates', 'tsconfig.json', 'package-lock.json']
  const newest = Math.max(...sources.map((s) => newestMtime(path.join(root, s))))
  if (fs.existsSync(out) && fs.statSync(out).mtimeMs >= newest) return out
  log('Building the server…')
  await build({
    entryPoints: [path.join(root, 'server', 'index.ts')],
    outfile: out,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
    tsconfig: path.join(root, 'tsconfig.json'),
    // A map beside the file for reading stack traces by hand; node does not load it.
    sourcemap: 'linked',
    logLevel: 'warning',
  })
  return out
}
