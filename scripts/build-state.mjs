// Decides whether .output must be rebuilt; used by the demo, the test runner and the test setup.
import { existsSync, readdirSync, statSync } from 'node:fs'
import { join } from 'node:path'

const SOURCES = ['app', 'server', 'shared', 'public', 'drizzle', 'modules', 'nuxt.config.ts', 'tailwind.config.ts', 'package-lock.json', 'scripts/client-chunks.mjs', 'scripts/build-workers.mjs']
const BUILT = '.output/server/index.mjs'

function newestMtime(path) {
  if (!existsSync(path)) return 0
  const stat = statSync(path)
  if (!stat.isDirectory()) return stat.mtimeMs
  return readdirSync(path).reduce((max, name) => Math.max(max, newestMtime(join(path, name))), stat.mtimeMs)
}

/** True when .output is missing or older than any source file it is built from. */
export function buildIsStale(root = process.cwd()) {
  const built = join(root, BUILT)
  if (!existsSync(built)) return true
  const builtAt = statSync(built).mtimeMs
  return SOURCES.some(source => newestMtime(join(root, source)) > builtAt)
}
