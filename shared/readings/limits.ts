/**
 * How much one tank may take in: the caps every write path applies (the reading form,
 * its edit, a correction, the CSV import) and the sizes the heavy answers are cut to.
 * One home for these numbers and their words, so the routes, the import worker and the
 * pages say the same thing.
 *
 * The numbers are ours (common practice, no published source): a client tests a few
 * times a day while a tank cycles, an aquarist may add re-tests; 48 a day (one every
 * half hour around the clock) is far beyond a real tank and still bounds what one
 * tank can cost the rule engine. A history import of years (five years at 48 a day, or
 * thirty at 8) fits in one file of 100,000 rows.
 *
 * Pure data and words, no imports: safe for the browser, the server and the worker.
 */

/** Current (not corrected-away) tests one tank may hold for one calendar day (UTC). */
export const TESTS_PER_TANK_PER_DAY = 48

/** The calendar day (UTC) a canonical time falls on, the day the cap counts: its first ten characters. */
export const dayOf = (takenAt: string): string => takenAt.slice(0, 10)

/** Data rows one CSV import may hold (the header row not counted). */
export const MAX_IMPORT_ROWS = 100_000

/**
 * Tests one chart draws: the latest ones (the chart says when there are older ones; the
 * history and the CSV export hold every one). A cycle, or a year and more of a client's daily
 * tests, fits; an imported log of 100,000 was megabytes to a phone and two seconds of the
 * server's time, and 2,000 points are already more than a phone's chart is wide.
 */
export const CHART_MAX_TESTS = 2_000

/** Readings and events the evidence answer carries per page, newest first. */
export const EVIDENCE_PAGE_SIZE = 1_000

/** The 429 answer when a day of the tank is full. */
export function dayFullMessage(day: string): string {
  return `This tank already holds ${TESTS_PER_TANK_PER_DAY} tests for ${day} (UTC), the most one day may hold. Correct one of that day's tests instead of adding another.`
}

/** The same refusal for one row of a CSV import. */
export function dayFullRowMessage(day: string): string {
  return `${day} (UTC) already holds ${TESTS_PER_TANK_PER_DAY} tests for this tank, the most one day may hold; this row was not imported.`
}

/** The 413 answer when a CSV file has too many rows. */
export function importTooLargeMessage(): string {
  return `This file has more than ${MAX_IMPORT_ROWS.toLocaleString('en')} rows, the most one import takes. Split it into smaller files and import them one after another; rows already imported are skipped.`
}
