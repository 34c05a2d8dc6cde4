/**
 * A real migrated SQLite file in a temporary folder with the demo company seeded, for unit
 * tests of server code that runs against the database (and of worker functions that open their
 * own connection from `dbPath`). Await it at the top of a test file; it closes the connection
 * and removes the folder after the file's tests.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll } from 'vitest'
import { migrateDatabase, openDatabase, type TidewrightDB } from '../../server/db/connection'
import { seedDemo, type DemoIds } from '../../server/db/seed/demo'

export interface SeededDatabase {
  db: TidewrightDB
  dbPath: string
  demo: DemoIds
  /** The moment the demo histories were seeded up to. */
  now: Date
}

/** `name` names the temporary folder and file, so a left-over one says which test made it. */
export async function seededDatabase(name: string, now = new Date()): Promise<SeededDatabase> {
  const dir = mkdtempSync(join(tmpdir(), `tidewright-${name}-`))
  const dbPath = join(dir, `${name}.sqlite`)
  const db = openDatabase(dbPath)
  afterAll(() => {
    db.$client.close()
    rmSync(dir, { recursive: true, force: true })
  })
  migrateDatabase(db)
  const demo = await seedDemo(db, now)
  return { db, dbPath, demo, now }
}
