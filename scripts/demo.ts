/**
 * npm run demo — migrate, seed if empty, build if the build is missing or stale, then
 * serve on port 3000 (or PORT) with a throwaway session secret.
 */
import { execSync, spawn } from 'node:child_process'
import { buildIsStale } from './build-state.mjs'

const run = (command: string) => execSync(command, { stdio: 'inherit' })

run('npx tsx scripts/db-seed.ts')
if (buildIsStale()) run('npx nuxt build')

const port = process.env.PORT || '3000'
console.log(`\nTidewright demo: http://localhost:${port}  (sign in as aquarist@tidewright.test / tidewright-demo)\n`)
const server = spawn(process.execPath, ['.output/server/index.mjs'], {
  stdio: 'inherit',
  env: {
    ...process.env,
    PORT: port,
    NODE_ENV: 'production',
    TIDEWRIGHT_DEMO: '1',
    // The demo is served over plain http on localhost.
    NUXT_SESSION_COOKIE_SECURE: process.env.NUXT_SESSION_COOKIE_SECURE ?? 'false',
  },
})
server.on('exit', code => process.exit(code ?? 0))
for (const signal of ['SIGINT', 'SIGTERM'] as const) process.on(signal, () => server.kill(signal))
