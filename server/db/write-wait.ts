/**
 * The request loop's writes wait for SQLite's write lock without holding the loop.
 *
 * better-sqlite3 is synchronous: a write on a connection whose busy timeout is spent waiting
 * for another connection's lock (the heavy-work pool's CSV import holds it for most of a
 * second) freezes the one loop every company is served from, for as long as the lock is held.
 * Here the lock is taken with BEGIN IMMEDIATE under no busy wait; when another connection holds
 * it, the caller awaits a short pause and tries again, so other requests are served meanwhile,
 * until the bound, then `WriteWaitExceeded` and nothing written. Once taken, the caller's work
 * runs synchronously to its COMMIT: no await can let another request in between, and a WAL
 * commit never waits for readers. Transactions inside the work (`db.transaction`) become
 * savepoints of this one (better-sqlite3 nests them), so existing commands run unchanged.
 *
 * Framework-free: the Nitro glue (`writeTransaction`, server/utils/db.ts) gives every loop
 * path the same bound and answers 503 past it. The connection's own busy timeout stays as the
 * safety net of a write that does not come through here.
 */
import { setTimeout as sleep } from 'node:timers/promises'
import type Database from 'better-sqlite3'
import type { TidewrightDB } from './connection'

/** How long a write waits for the lock before giving up: the connection's busy timeout of before. */
export const WRITE_WAIT_MS = 5000

/** First pause after finding the lock taken, then doubled up to the longest (a lock freed is taken within that). */
const FIRST_PAUSE_MS = 1
const LONGEST_PAUSE_MS = 16

/** Thrown when another connection held the write lock past the bound; nothing of the work ran. */
export class WriteWaitExceeded extends Error {
  constructor(readonly waitedMs: number) {
    super(`The database stayed locked by another writer for ${Math.round(waitedMs)} ms.`)
    this.name = 'WriteWaitExceeded'
  }
}

interface LockStatements {
  /** The connection's own busy timeout in ms, put back after each try. */
  timeoutMs: number
  begin: Database.Statement
  commit: Database.Statement
  rollback: Database.Statement
}

const statementsPerConnection = new WeakMap<Database.Database, LockStatements>()

function lockStatements(sqlite: Database.Database): LockStatements {
  let statements = statementsPerConnection.get(sqlite)
  if (!statements) {
    statements = {
      timeoutMs: Number(sqlite.pragma('busy_timeout', { simple: true })),
      begin: sqlite.prepare('BEGIN IMMEDIATE'),
      commit: sqlite.prepare('COMMIT'),
      rollback: sqlite.prepare('ROLLBACK'),
    }
    statementsPerConnection.set(sqlite, statements)
  }
  return statements
}

function isBusy(error: unknown): boolean {
  const code = (error as { code?: unknown } | null)?.code
  return typeof code === 'string' && code.startsWith('SQLITE_BUSY')
}

/** BEGIN IMMEDIATE if no other connection holds the write lock right now; false (and no transaction) if one does. */
function tryBegin(sqlite: Database.Database, statements: LockStatements): boolean {
  // Through pragma(), not a statement prepared once: SQLite sets the busy timeout while preparing the PRAGMA.
  sqlite.pragma('busy_timeout = 0')
  try {
    statements.begin.run()
    return true
  }
  catch (error) {
    if (isBusy(error)) return false
    throw error
  }
  finally {
    sqlite.pragma(`busy_timeout = ${statements.timeoutMs}`)
  }
}

/**
 * Runs `work` in one write transaction on `db` once the write lock is free, waiting for it
 * asynchronously (at most `boundMs`, else WriteWaitExceeded). `work` must be synchronous: its
 * writes, and the reads they rest on, commit together, or roll back together if it throws.
 */
export async function whenWritable<T>(db: TidewrightDB, work: () => T, boundMs = WRITE_WAIT_MS): Promise<T> {
  const sqlite = db.$client
  // A call from inside a synchronous transaction would commit or roll back that caller's transaction.
  if (sqlite.inTransaction) throw new Error('whenWritable was called inside a transaction: await it before or after, not within.')
  const statements = lockStatements(sqlite)
  const start = performance.now()
  for (let pause = FIRST_PAUSE_MS; !tryBegin(sqlite, statements); pause = Math.min(pause * 2, LONGEST_PAUSE_MS)) {
    const waited = performance.now() - start
    if (waited >= boundMs) throw new WriteWaitExceeded(waited)
    await sleep(Math.min(pause, boundMs - waited))
  }
  try {
    const result = work()
    if (result instanceof Promise) throw new TypeError('whenWritable\'s work must be synchronous: an await inside it would let other requests into its transaction.')
    statements.commit.run()
    return result
  }
  catch (error) {
    if (sqlite.inTransaction) statements.rollback.run()
    throw error
  }
}
