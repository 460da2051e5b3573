/**
 * Gzipped JavaScript and CSS that the sign-in page and the buyer's catalogue load, read from the
 * client build's manifest (the entry, each page's lazy chunk, and every chunk and stylesheet they
 * import statically), against the framework floor: scripts/bench/floor (React, react-dom, the data
 * router and the query client alone) built with the same vite.config.ts.
 */
import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { gzipSync } from 'node:zlib'
import { build } from 'vite'

type ManifestChunk = { file: string; isEntry?: boolean; imports?: string[]; css?: string[] }
type Manifest = Record<string, ManifestChunk>

/** Files a chunk loads before it runs: itself, its static imports (transitively) and their CSS. */
export function filesLoadedBy(manifest: Manifest, keys: readonly string[]): string[] {
  const seen = new Set<string>()
  const files = new Set<string>()
  const visit = (key: string) => {
    if (seen.has(key)) return
    seen.add(key)
    const chunk = manifest[key]
    if (!chunk) throw new Error(`not in the manifest: ${key}`)
    files.add(chunk.file)
    for (const css of chunk.css ?? []) files.add(css)
    for (const dep of chunk.imports ?? []) visit(dep)
  }
  keys.forEach(visit)
  return [...files].filter((f) => /\.(js|css)$/.test(f)).sort()
}

function gzipBytes(dir: string, files: readonly string[]): number {
  return files.reduce((sum, f) => sum + gzipSync(fs.readFileSync(path.join(dir, f)), { level: 9 }).length, 0)
}

function readManifest(dir: string): Manifest {
  return JSON.parse(fs.readFileSync(path.join(dir, '.vite', 'manifest.json'), 'utf8')) as Manifest
}

export async function clientSizes(root: string, log: (l: string) => void) {
  const dist = path.join(root, 'dist', 'client')
  const app = readManifest(dist)
  const entry = Object.keys(app).find((k) => app[k]!.isEntry)!
  const signInFiles = filesLoadedBy(app, [entry, 'src/app/routes/sign-in.tsx'])
  const catalogueFiles = filesLoadedBy(app, [entry, 'src/app/routes/buyer-catalogue.tsx'])
  const both = [...new Set([...signInFiles, ...catalogueFiles])].sort()

  log('Building the framework floor with the same Vite settings…')
  const out = fs.mkdtempSync(path.join(os.tmpdir(), 'lathercase-floor-'))
  // vite's build() sets NODE_ENV=production for the whole process; the caller's stays as it was.
  const nodeEnv = process.env.NODE_ENV
  try {
    await build({
      configFile: path.join(root, 'vite.config.ts'),
      root: path.join(root, 'scripts', 'bench', 'floor'),
      logLevel: 'warn',
      build: { outDir: out, emptyOutDir: true, manifest: true },
    })
    const floor = readManifest(out)
    const floorEntry = Object.keys(floor).find((k) => floor[k]!.isEntry)!
    const floorFiles = filesLoadedBy(floor, [floorEntry])
    const floorGzipBytes = gzipBytes(out, floorFiles)
    const initialGzipBytes = gzipBytes(dist, both)
    const signInGzipBytes = gzipBytes(dist, signInFiles)
    const catalogueGzipBytes = gzipBytes(dist, catalogueFiles)
    return {
      // Each page's initial load: what a person opening that page first downloads.
      signInGzipBytes,
      catalogueGzipBytes,
      signInRatio: signInGzipBytes / floorGzipBytes,
      catalogueRatio: catalogueGzipBytes / floorGzipBytes,
      // Both pages together (sign in, then open the catalogue).
      initialGzipBytes,
      floorGzipBytes,
      ratio: initialGzipBytes / floorGzipBytes,
      files: both.map((f) => ({ file: f, gzipBytes: gzipBytes(dist, [f]) })),
    }
  } finally {
    if (nodeEnv === undefined) delete process.env.NODE_ENV
    else process.env.NODE_ENV = nodeEnv
    fs.rmSync(out, { recursive: true, force: true })
  }
}
