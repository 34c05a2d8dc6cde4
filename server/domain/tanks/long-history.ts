/**
 * Whether a tank's history is long enough that its verdict is made in the heavy-work pool
 * rather than on the request loop every company is served from. Reading a tank's tests back
 * and running the engine over them costs about 5 µs a test: nothing for a year of a client's
 * daily tests, half a second for an imported log of 100,000, during which every other request
 * would wait. Framework-free: takes a `Db`.
 */
import type { Db } from '../../db/connection'
import { storedReadingCount } from '../readings/current'
import { keptTestCount } from '../readings/engine-input-cache'

/**
 * Above this many tests (the stored ones, corrections included, or the current ones of a kept
 * copy) a tank's verdict leaves the request loop: a client testing three times a day takes
 * four years to reach it; only an imported log does.
 */
export const LONG_HISTORY_TESTS = 5_000

/**
 * Whether the tank holds more than LONG_HISTORY_TESTS tests: from the copy of its history the
 * connection keeps when it is current (a save has just placed its test in it), else counted.
 */
export function hasLongHistory(db: Db, tankId: string): boolean {
  return (keptTestCount(db, tankId) ?? storedReadingCount(db, tankId)) > LONG_HISTORY_TESTS
}
