/**
 * Opens Tidewright's SQLite database and applies migrations. Framework-free so the
 * server, the scripts (migrate, seed, backup) and the test support share one path.
 */
import { mkdirSync } from 'node:fs'
import { dirname, resolve } from 'node:path'
import Database from 'better-sqlite3'
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3'
import { migrate } from 'drizzle-orm/better-sqlite3/migrator'
import type { BaseSQLiteDatabase } from 'drizzle-orm/sqlite-core'
import * as schema from './schema'

export type TidewrightDB = BetterSQLite3Database<typeof schema> & { $client: Database.Database }

/**
 * A database handle or a transaction on it. Domain commands and queries take a `Db`, so
 * the same function runs on its own or inside the caller's transaction.
 */
export type Db = BaseSQLiteDatabase<'sync', Database.RunResult, typeof schema>

export const DEFAULT_DB_PATH = 'data/tidewright.sqlite'

/** Largest size the WAL file keeps after a checkpoint (16 MB). */
export const WAL_SIZE_LIMIT_BYTES = 16 * 1024 * 1024

/** Opens (creating if needed) the database file with WAL, foreign keys and a busy timeout. */
export function openDatabase(path: string): TidewrightDB {
  const file = resolve(path)
  mkdirSync(dirname(file), { recursive: true })
  const sqlite = new Database(file)
  sqlite.pragma('journal_mode = WAL')
  sqlite.pragma('foreign_keys = ON')
  // Writers queue briefly instead of surfacing SQLITE_BUSY under concurrent requests.
  sqlite.pragma('busy_timeout = 5000')
  sqlite.pragma('synchronous = NORMAL')
  // After a checkpoint resets the write-ahead log, SQLite cuts the file back to this size;
  // without it a big import leaves a WAL file of hundreds of MB on disk for good.
  sqlite.pragma(`journal_size_limit = ${WAL_SIZE_LIMIT_BYTES}`)
  return drizzle(sqlite, { schema }) as TidewrightDB
}

/**
 * Copies the write-ahead log into the database file and empties it (TRUNCATE), if no reader
 * or writer is in the way. Returns how many pages were in the log and whether the checkpoint was blocked.
 * It does not wait: a TRUNCATE checkpoint waits (in SQLite's busy handler, holding the caller's
 * thread, the request loop's in the clocked jobs) for every reader to finish, and a pool thread's
 * import reads for seconds; a blocked checkpoint is tried again by the next round.
 */
export function checkpointWal(db: TidewrightDB): { walPages: number, busy: boolean } {
  const sqlite = db.$client
  const timeout = sqlite.pragma('busy_timeout', { simple: true }) as number
  sqlite.pragma('busy_timeout = 0')
  try {
    const [row] = sqlite.pragma('wal_checkpoint(TRUNCATE)') as { busy: number, log: number, checkpointed: number }[]
    return { walPages: row?.log ?? 0, busy: Boolean(row?.busy) }
  }
  finally {
    sqlite.pragma(`busy_timeout = ${timeout}`)
  }
}

/** Applies every migration in drizzle/ that the file has not seen yet. */
export function migrateDatabase(db: TidewrightDB, migrationsFolder = resolve('drizzle')): void {
  migrate(db, { migrationsFolder })
}
