/**
 * Vitest global setup for the api and browser tiers: builds the app if the build is
 * stale, seeds a fresh temporary SQLite file, starts the real built server on a free
 * port and hands its address to the tests. Teardown stops it and removes the file.
 */
import { execSync } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { TestProject } from 'vitest/node'
import { migrateDatabase, openDatabase } from '../../server/db/connection'
import { startMailCatcher, type MailCatcher } from '../../scripts/mail-catcher'
import { mailCatcherEnv } from './mail-env'
import { buildIsStale } from '../../scripts/build-state.mjs'
import { seedFixtures, type Fixtures } from './fixtures'
import { startServer, type RunningServer } from './server'

declare module 'vitest' {
  export interface ProvidedContext {
    baseURL: string
    dbPath: string
    fixtures: Fixtures
    /** The mail catcher's control URL: POST /smtp/stop, POST /smtp/start, GET /messages. */
    mailControlURL: string
  }
}

let server: RunningServer | undefined
let catcher: MailCatcher | undefined
let dir: string | undefined

export async function setup(project: TestProject) {
  if (buildIsStale()) execSync('npx nuxt build', { stdio: 'inherit' })
  dir = mkdtempSync(join(tmpdir(), 'tidewright-test-'))
  const dbPath = join(dir, 'test.sqlite')
  const db = openDatabase(dbPath)
  migrateDatabase(db)
  const fixtures = await seedFixtures(db)
  db.$client.close()
  // The real SMTP path: the server's worker sends to a local catcher, as in the demo.
  catcher = await startMailCatcher({ port: 0, file: join(dir, 'mail.jsonl'), controlPort: 0 })
  server = await startServer({ dbPath, env: { NUXT_UPLOADS_DIR: join(dir, 'uploads'), ...mailCatcherEnv(catcher) } })
  project.provide('baseURL', server.baseURL)
  project.provide('dbPath', dbPath)
  project.provide('fixtures', fixtures)
  project.provide('mailControlURL', catcher.controlURL ?? '')
}

export async function teardown() {
  await server?.stop()
  await catcher?.close()
  if (dir) rmSync(dir, { recursive: true, force: true })
}
