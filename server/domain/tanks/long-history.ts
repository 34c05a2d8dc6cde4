/**
 * Whether a tank's history is long enough that its verdict is made in the heavy-work pool
 * rather than on the request loop every company is served from. Reading a tank's tests back
 * and running the engine over them costs about 5 µs a test: nothing for a year of a client's
 * daily tests, half a second for an imported log of 100,000, during which every other request
 * would wait. Framework-free: takes a `Db`.
 */
import type { Db } from '../../db/connection'
import { storedReadingCount } from '../readings/current'
import { keptCopyKind, keptTestCount } from '../readings/engine-input-cache'

/**
 * Above this many tests (the stored ones, corrections included, or the current ones of a kept
 * copy) a tank's verdict leaves the request loop: a client testing three times a day takes
 * four years to reach it; only an imported log does.
 */
export const LONG_HISTORY_TESTS = 5_000

/**
 * Above this many tests a tank's history is not kept whole in memory between its evaluations: it
 * is folded as its tests stream from the database and only the last HISTORY_WINDOW_DAYS of them
 * are held (about 4,000 tests at the day cap; the fold is kept and a saved test goes on from it),
 * so a tank's memory stops growing with its history. Up to it a year of tests at the day cap is
 * kept whole (about 5 MB) and a new test costs its own place.
 */
export const STREAMED_HISTORY_TESTS = 20_000

/**
 * Days of tests a streamed history holds: longer than any stretch a rule looks back over at the
 * longest a company may set it (stall and salinity days, at most 60). A verdict that needs older
 * tests is made from the whole history instead, so this bounds memory, never the verdict.
 */
export const HISTORY_WINDOW_DAYS = 90

/**
 * Whether the tank's history is folded as it streams past rather than kept whole: a fold is kept
 * for it at its current count (`revision`, as the caller read it), or no copy is and it stores more
 * than STREAMED_HISTORY_TESTS tests (a whole copy, kept after a window could not settle a verdict,
 * is used while it is current).
 */
export function streamsHistory(db: Db, tankId: string, revision: number): boolean {
  const kind = keptCopyKind(db, tankId, revision)
  return kind === undefined ? storedReadingCount(db, tankId) > STREAMED_HISTORY_TESTS : kind === 'stream'
}

/**
 * Whether the tank holds more than LONG_HISTORY_TESTS tests: from the copy of its history the
 * connection keeps when it is current (a save has just placed its test in it), else counted.
 */
export function hasLongHistory(db: Db, tankId: string): boolean {
  return (keptTestCount(db, tankId) ?? storedReadingCount(db, tankId)) > LONG_HISTORY_TESTS
}
