/**
 * Time arithmetic on epoch milliseconds. The engine never reads the clock: every
 * instant comes from the input, so a verdict can be reproduced later.
 */

/** Milliseconds in an hour. */
export const HOUR_MS = 3_600_000
/** Milliseconds in a day (UTC days: the engine never uses local time). */
export const DAY_MS = 24 * HOUR_MS

// ISO 8601 date or date-time. Anything else is refused: engines parse other formats differently.
const ISO_TIME = /^\d{4}-\d{2}-\d{2}(?:T\d{2}:\d{2}(?::\d{2}(?:\.\d{1,9})?)?(Z|[+-]\d{2}:?\d{2})?)?$/

/**
 * Epoch milliseconds of an ISO 8601 string, or NaN when it is not one. A date-time
 * without an offset is read as UTC, never as local time, so browser and server agree.
 */
export function parseTime(iso: string): number {
  if (typeof iso !== 'string') return Number.NaN
  // Every evaluation of a tank reads the same few thousand times again (a year of tests, twice
  // each, and the forecast reads them once more): parsing was near half the engine's time.
  // The answer depends on the text alone, so a remembered one is the same answer (and looking
  // it up is quicker than even reading the digits of a stored time).
  const known = parsedTimes.get(iso)
  if (known !== undefined) return known
  const ms = storedInstantMs(iso) ?? parseIsoTime(iso)
  if (parsedTimes.size >= PARSED_TIMES_KEPT) parsedTimes.clear()
  parsedTimes.set(iso, ms)
  return ms
}

/** How many parsed times are remembered before the memory starts afresh (some MB at most). */
const PARSED_TIMES_KEPT = 65_536
const parsedTimes = new Map<string, number>()

/** Reads an ISO time as parseTime does (epoch ms, or NaN). */
export type TimeReader = (iso: string) => number

/**
 * A history of more times than this is read from its digits, not through parseTime's memory:
 * once the memory holds the ten thousand times of ten years of tests (it and the history then
 * outgrow a core's cache), a lookup costs more than the digits (profiled in an evaluation: about
 * 180 ns a time at 20 years against 20 ns at one year; about even at 3 years).
 */
const REMEMBERED_PASS_TIMES = 2_048

/**
 * The reader for `count` times read in one pass (a tank's whole history being prepared):
 * parseTime for a short history, whose times its memory answers more quickly than their digits.
 * Past that (see REMEMBERED_PASS_TIMES, and past PARSED_TIMES_KEPT remembering each time would
 * only push out the ones read before it: 100,000 imported tests), a stored time is read from its
 * digits and not remembered; any other goes to parseTime. The answer is the same.
 */
export function timeReaderFor(count: number): TimeReader {
  return count <= REMEMBERED_PASS_TIMES ? parseTime : unrememberedTime
}

function unrememberedTime(iso: string): number {
  return (typeof iso === 'string' ? storedInstantMs(iso) : undefined) ?? parseTime(iso)
}

const ZERO = 48

/** The digit at `i` (0-9), or -1 when it is not a digit. */
function digit(text: string, i: number): number {
  const d = text.charCodeAt(i) - ZERO
  return d >= 0 && d <= 9 ? d : -1
}

/** The unsigned number the digits from `start` to `end` (excluded) spell, or -1 if one is not a digit. */
function digits(text: string, start: number, end: number): number {
  let n = 0
  for (let i = start; i < end; i += 1) {
    const d = digit(text, i)
    if (d < 0) return -1
    n = n * 10 + d
  }
  return n
}

/**
 * Epoch ms of a time in the form the database stores every time in ("2026-03-14T08:30:00.000Z",
 * as toISOString writes it), read from its digits; undefined for any other text, or one whose
 * fields leave the plain range (year before 1000, day past 28, hour past 23, ...), which the
 * full rule then reads. A year of tests is read at every evaluation: the regular expression and
 * Date.parse were most of the cost. Within these ranges Date.UTC and Date.parse agree exactly
 * (checked by a property test against the full rule).
 */
export function storedInstantMs(text: string): number | undefined {
  if (text.length !== 24 || text.charCodeAt(4) !== 45 || text.charCodeAt(7) !== 45 || text.charCodeAt(10) !== 84
    || text.charCodeAt(13) !== 58 || text.charCodeAt(16) !== 58 || text.charCodeAt(19) !== 46 || text.charCodeAt(23) !== 90) return undefined
  const year = digits(text, 0, 4)
  const month = digits(text, 5, 7)
  const day = digits(text, 8, 10)
  const hour = digits(text, 11, 13)
  const minute = digits(text, 14, 16)
  const second = digits(text, 17, 19)
  const ms = digits(text, 20, 23)
  if (year < 1000 || month < 1 || month > 12 || day < 1 || day > 28 || hour < 0 || hour > 23 || minute < 0 || minute > 59 || second < 0 || second > 59 || ms < 0) return undefined
  return Date.UTC(year, month - 1, day, hour, minute, second, ms)
}

function parseIsoTime(iso: string): number {
  const match = ISO_TIME.exec(iso)
  if (match === null) return Number.NaN
  const hasClock = iso.includes('T')
  return Date.parse(hasClock && match[1] === undefined ? `${iso}Z` : iso)
}

/** Epoch milliseconds of a required ISO time; throws a RangeError naming the field when it does not parse. */
export function requireTime(name: string, iso: string): number {
  const ms = parseTime(iso)
  if (!Number.isFinite(ms)) throw new RangeError(`${name} must be an ISO 8601 time (got ${String(iso)})`)
  return ms
}

/** Canonical ISO string (UTC, milliseconds) for epoch milliseconds. */
export function toIso(ms: number): string {
  return new Date(ms).toISOString()
}

/** "2026-03-14 08:00 UTC": unambiguous in a message whatever the reader's time zone. */
export function formatWhen(ms: number): string {
  return `${toIso(ms).slice(0, 16).replace('T', ' ')} UTC`
}

/** "2026-03-14". */
export function formatDate(ms: number): string {
  return toIso(ms).slice(0, 10)
}

/** A duration in words: hours below two days, days above. */
export function formatDuration(ms: number): string {
  const hours = ms / HOUR_MS
  if (hours < 48) return `${Math.round(hours)} h`
  const days = Math.round((hours / 24) * 10) / 10
  return `${days} days`
}
