/**
 * npm run demo — migrate, seed if empty, build if the build is missing or stale, then
 * serve on port 3000 (or PORT) with a throwaway session secret.
 */
import { execSync, spawn } from 'node:child_process'
import { buildIsStale } from './build-state.mjs'
import { startMailCatcher } from './mail-catcher'

const run = (command: string) => execSync(command, { stdio: 'inherit' })

run('npx tsx scripts/db-seed.ts')
if (buildIsStale()) run('npx nuxt build')

const port = process.env.PORT || '3000'
// The demo's mail goes to a local catcher; an admin reads it at /admin/mail. A real SMTP host in the environment wins.
const catcher = process.env.NUXT_SMTP_HOST
  ? null
  : await startMailCatcher({ port: Number(process.env.MAIL_CATCHER_PORT || 2525), file: process.env.MAIL_CATCHER_FILE || 'data/mail-caught.jsonl' })
if (catcher) console.log(`Mail catcher on smtp://127.0.0.1:${catcher.port}; caught mail at http://localhost:${port}/admin/mail`)
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
    NUXT_PUBLIC_BASE_URL: process.env.NUXT_PUBLIC_BASE_URL ?? `http://localhost:${port}`,
    ...(catcher ? { NUXT_SMTP_HOST: '127.0.0.1', NUXT_SMTP_PORT: String(catcher.port), NUXT_DEV_MAIL: '1', NUXT_DEV_MAIL_FILE: catcher.file } : {}),
  },
})
server.on('exit', (code) => {
  void catcher?.close()
  process.exit(code ?? 0)
})
for (const signal of ['SIGINT', 'SIGTERM'] as const) process.on(signal, () => server.kill(signal))
