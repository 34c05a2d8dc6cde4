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
import { buildIsStale } from '../../scripts/build-state.mjs'
import { seedFixtures, type Fixtures } from './fixtures'
import { startServer, type RunningServer } from './server'

declare module 'vitest' {
  export interface ProvidedContext {
    baseURL: string
    dbPath: string
    fixtures: Fixtures
  }
}

let server: RunningServer | undefined
let dir: string | undefined

export async function setup(project: TestProject) {
  if (buildIsStale()) execSync('npx nuxt build', { stdio: 'inherit' })
  dir = mkdtempSync(join(tmpdir(), 'tidewright-test-'))
  const dbPath = join(dir, 'test.sqlite')
  const db = openDatabase(dbPath)
  migrateDatabase(db)
  const fixtures = await seedFixtures(db)
  db.$client.close()
  server = await startServer({ dbPath, env: { NUXT_UPLOADS_DIR: join(dir, 'uploads') } })
  project.provide('baseURL', server.baseURL)
  project.provide('dbPath', dbPath)
  project.provide('fixtures', fixtures)
}

export async function teardown() {
  await server?.stop()
  if (dir) rmSync(dir, { recursive: true, force: true })
}
