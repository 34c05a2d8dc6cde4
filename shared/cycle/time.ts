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

/** The two digits at `i` and `i + 1` as a number (0-99), or -1 when either is not a digit. */
function twoDigits(text: string, i: number): number {
  const tens = text.charCodeAt(i) - ZERO
  const ones = text.charCodeAt(i + 1) - ZERO
  return tens >= 0 && tens <= 9 && ones >= 0 && ones <= 9 ? tens * 10 + ones : -1
}

/** Days of the year before the first of each month, in a common year. */
const DAYS_BEFORE_MONTH = [0, 31, 59, 90, 120, 151, 181, 212, 243, 273, 304, 334] as const

function isLeapYear(year: number): boolean {
  return year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0)
}

function daysInMonth(year: number, month: number): number {
  if (month === 2) return isLeapYear(year) ? 29 : 28
  return month === 4 || month === 6 || month === 9 || month === 11 ? 30 : 31
}

/** Days from 1970-01-01 to the date (proleptic Gregorian, as Date counts them). */
function daysSinceEpoch(year: number, month: number, day: number): number {
  const before = year - 1
  const leapDays = Math.floor(before / 4) - Math.floor(before / 100) + Math.floor(before / 400) - 477 // 477: leap days before 1970
  return 365 * (year - 1970) + leapDays + DAYS_BEFORE_MONTH[month - 1]! + (month > 2 && isLeapYear(year) ? 1 : 0) + day - 1
}

/**
 * Epoch ms of a time in the form the database stores every time in ("2026-03-14T08:30:00.000Z",
 * as toISOString writes it), read from its digits; undefined for any other text, or one whose
 * fields leave the plain range (year before 1000, a day the month does not have, hour past 23,
 * ...), which the full rule then reads. A year of tests is read at every evaluation: the regular
 * expression and Date.parse were most of the cost. The instant is counted here rather than by
 * Date.UTC, and every day that exists is read (days 29 to 31 went to the full rule and its
 * memory before): a long history reads each of its times this way (timeReaderFor), about half
 * the cost of reading the digits one by one and calling Date.UTC. For every existing day this is
 * the instant Date.parse gives (property tests over every day of leap, common and century years,
 * and random times from year 1000 to 9999).
 */
export function storedInstantMs(text: string): number | undefined {
  if (text.length !== 24 || text.charCodeAt(4) !== 45 || text.charCodeAt(7) !== 45 || text.charCodeAt(10) !== 84
    || text.charCodeAt(13) !== 58 || text.charCodeAt(16) !== 58 || text.charCodeAt(19) !== 46 || text.charCodeAt(23) !== 90) return undefined
  const century = twoDigits(text, 0)
  const yearOfCentury = twoDigits(text, 2)
  const month = twoDigits(text, 5)
  const day = twoDigits(text, 8)
  const hour = twoDigits(text, 11)
  const minute = twoDigits(text, 14)
  const second = twoDigits(text, 17)
  const centiseconds = twoDigits(text, 20)
  const lastMsDigit = text.charCodeAt(22) - ZERO
  if (century < 10 || yearOfCentury < 0 || month < 1 || month > 12 || day < 1 || hour < 0 || hour > 23 || minute < 0 || minute > 59
    || second < 0 || second > 59 || centiseconds < 0 || lastMsDigit < 0 || lastMsDigit > 9) return undefined
  const year = century * 100 + yearOfCentury
  if (day > daysInMonth(year, month)) return undefined
  return ((daysSinceEpoch(year, month, day) * 24 + hour) * 60 + minute) * 60_000 + second * 1000 + centiseconds * 10 + lastMsDigit
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
