/**
 * A server of the test's own: a fresh temporary SQLite file seeded with the demo and the
 * other company, the built server started on it with a known session password. For
 * tests that write a lot (matrix, fuzzing), kill the server, or read its log, so the
 * shared server of the api tier stays as the fixtures describe it.
 */
import { randomBytes } from 'node:crypto'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { migrateDatabase, openDatabase } from '../../server/db/connection'
import { seedFixtures, type Fixtures } from './fixtures'
import { startServer, type RunningServer } from './server'

export interface OwnServer {
  server: RunningServer
  dir: string
  dbPath: string
  fixtures: Fixtures
  sessionPassword: string
  env: Record<string, string>
  /** Starts the server again on the same file (after a stop or a kill). */
  restart: () => Promise<RunningServer>
  cleanup: () => Promise<void>
}

/** Seeds a new database file (demo + other company) and returns its path and ids. */
export async function seededDatabase(dir: string): Promise<{ dbPath: string, fixtures: Fixtures }> {
  const dbPath = join(dir, 'test.sqlite')
  const db = openDatabase(dbPath)
  migrateDatabase(db)
  const fixtures = await seedFixtures(db)
  db.$client.close()
  return { dbPath, fixtures }
}

export async function startOwnServer(env: Record<string, string> = {}): Promise<OwnServer> {
  const dir = mkdtempSync(join(tmpdir(), 'tidewright-own-'))
  const { dbPath, fixtures } = await seededDatabase(dir)
  const sessionPassword = randomBytes(32).toString('hex')
  const fullEnv = {
    NUXT_SESSION_PASSWORD: sessionPassword,
    NUXT_UPLOADS_DIR: join(dir, 'uploads'),
    // The background worker (escalations, reminders, mail) writes on its own clock; tests that
    // compare table checksums keep it asleep. A test that needs it passes a short interval.
    NUXT_WORKER_INTERVAL_MS: '86400000',
    ...env,
  }
  const own: OwnServer = {
    server: await startServer({ dbPath, env: fullEnv }),
    dir,
    dbPath,
    fixtures,
    sessionPassword,
    env: fullEnv,
    restart: async () => {
      own.server = await startServer({ dbPath, port: Number(new URL(own.server.baseURL).port), env: fullEnv })
      return own.server
    },
    cleanup: async () => {
      await own.server.stop()
      rmSync(dir, { recursive: true, force: true })
    },
  }
  return own
}
