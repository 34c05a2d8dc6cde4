// Bundles each worker-thread entry (server/workers/*.worker.ts) into a file of its own next to
// the built server: .output/server/workers/<name>.worker.mjs (in `nuxt dev`: .nuxt/dev/workers/).
// Nitro bundles only what the server imports, and a worker thread is started from a file
// path, so these are built here, by esbuild, right after Nitro has written its output.
// better-sqlite3 stays external (a native module): Nitro has already copied it into
// .output/server/node_modules, where the worker resolves it.
import { readdirSync } from 'node:fs'
import { join } from 'node:path'
import { build } from 'esbuild'

export const WORKERS_DIR = 'server/workers'

/** Builds every worker entry into `outDir`/workers. */
export async function buildWorkers(rootDir, outDir) {
  const entries = readdirSync(join(rootDir, WORKERS_DIR)).filter(f => f.endsWith('.worker.ts')).map(f => join(rootDir, WORKERS_DIR, f))
  await build({
    entryPoints: entries,
    outdir: join(outDir, 'workers'),
    outExtension: { '.js': '.mjs' },
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    external: ['better-sqlite3'],
    // The project's own aliases, as Nuxt resolves them.
    alias: { '#shared': join(rootDir, 'shared'), '#server': join(rootDir, 'server') },
    // Some bundled CommonJS (papaparse) calls require(); give ESM output one.
    banner: { js: 'import { createRequire as __twCreateRequire } from \'node:module\'; const require = __twCreateRequire(import.meta.url);' },
    logLevel: 'warning',
  })
}
