import { migrateDatabase, openDatabase, type TidewrightDB } from '#server/db/connection'
import { whenWritable, WRITE_WAIT_MS, WriteWaitExceeded } from '#server/db/write-wait'

export * as tables from '#server/db/schema'

let db: TidewrightDB | undefined

/** The process's single database connection, opened on first use from runtimeConfig.dbPath. */
export function useDB(): TidewrightDB {
  if (!db) db = openDatabase(useRuntimeConfig().dbPath)
  return db
}

/** Applies pending migrations; called once by the migrate plugin at start. */
export function migrateDB(): void {
  migrateDatabase(useDB(), useRuntimeConfig().migrationsDir)
}

/** How long a write waits for the lock (runtime config `writeWaitMs`, NUXT_WRITE_WAIT_MS). */
export function writeWaitMs(): number {
  const configured = Number(useRuntimeConfig().writeWaitMs)
  return Number.isFinite(configured) && configured >= 0 ? configured : WRITE_WAIT_MS
}

/** What a refused write says when nothing of the request was written. */
const NOTHING_SAVED = 'Tidewright is busy saving other work; nothing was saved. Try again in a moment.'

/** What it says when the change was committed but its verdict could not be stored in time: entering it again would add it twice. */
export const SAVED_BUT_BUSY = 'Your change was saved, but Tidewright is busy and has not refreshed the tank\'s verdict yet. Reload the tank in a moment; do not enter it again.'

/**
 * A write that waited past the bound for the lock (WriteWaitExceeded), answered as the 503 every
 * loop path gives (Retry-After is added by server/plugins/04.write-wait-retry.ts); `message`
 * says what of the request was and was not saved.
 */
export async function answeredBusy<T>(write: Promise<T>, message = NOTHING_SAVED): Promise<T> {
  try {
    return await write
  }
  catch (error) {
    if (!(error instanceof WriteWaitExceeded)) throw error
    throw createError({ statusCode: 503, statusMessage: message, message, cause: error })
  }
}

/**
 * The one way the request loop writes: `work` (synchronous; its writes, reads and nested
 * `db.transaction`s) runs in one write transaction once no other connection holds SQLite's
 * write lock, waited for without holding the loop (server/db/write-wait.ts), so every other
 * request goes on being served meanwhile. Past the bound: 503 (answeredBusy), nothing of
 * `work` written.
 */
export function writeTransaction<T>(work: (db: TidewrightDB) => T, message?: string): Promise<T> {
  const db = useDB()
  return answeredBusy(whenWritable(db, () => work(db), writeWaitMs()), message)
}

/**
 * `work` in one write transaction if no other connection holds the write lock right now;
 * undefined, with nothing written and no wait, if one does. Only for a write that may be put
 * off to a later request, such as a session's last-seen time.
 */
export async function writeIfFree<T>(work: (db: TidewrightDB) => T): Promise<T | undefined> {
  const db = useDB()
  try {
    return await whenWritable(db, () => work(db), 0)
  }
  catch (error) {
    if (error instanceof WriteWaitExceeded) return undefined
    throw error
  }
}
