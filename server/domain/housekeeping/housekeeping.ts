/**
 * Clocked upkeep of the database, framework-free: ended sessions and old throttle marks
 * go, and the write-ahead log is checkpointed and emptied so a big import does not leave
 * it large on disk. Run by the worker with the other clocked jobs (and by POST /api/dev/worker-tick in tests).
 */
import { checkpointWal, type TidewrightDB } from '#server/db/connection'
import { pruneSessions } from '#server/domain/sessions/sessions'
import { pruneAttempts } from '#server/domain/throttle/throttle'

/** The longest window any throttle counts over (invitation mail: a day). */
const LONGEST_THROTTLE_WINDOW_MS = 24 * 3_600_000

export interface HousekeepingResult {
  sessionsPruned: number
  throttleMarksPruned: number
  /** Pages the WAL held before the checkpoint. */
  walPages: number
}

/**
 * Prunes, then checkpoints. `write` runs the prunes in a write transaction (the request loop's
 * `writeTransaction`, which waits for the lock off the loop); the checkpoint runs outside any
 * transaction, as it must, and does not wait (checkpointWal).
 */
export async function runHousekeeping(db: TidewrightDB, now: Date, write: <T>(work: (db: TidewrightDB) => T) => Promise<T>): Promise<HousekeepingResult> {
  const pruned = await write(tx => ({
    sessionsPruned: pruneSessions(tx, now),
    throttleMarksPruned: pruneAttempts(tx, new Date(now.getTime() - LONGEST_THROTTLE_WINDOW_MS)),
  }))
  return { ...pruned, walPages: checkpointWal(db).walPages }
}
