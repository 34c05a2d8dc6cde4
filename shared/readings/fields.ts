/**
 * Field rules every path that writes a reading or an event shares (the form's schema, the
 * entry conversion, the CSV import and corrections), so a value refused in one is refused
 * in all.
 */

import { storedInstantMs } from '../cycle/time'

/** Longest note a reading or event keeps. */
export const ENTRY_NOTES_MAX = 2000

/**
 * Whether the calendar date at the start of a time exists. Date.parse rolls 2026-02-30 over
 * into March; a mistyped day must be refused instead, not stored as another day.
 */
export function calendarDateExists(text: string): boolean {
  const match = /^\s*(\d{4})-(\d{2})-(\d{2})/.exec(text)
  if (!match) return true
  return dayExists(Number(match[1]), Number(match[2]), Number(match[3]))
}

/** Whether year-month-day (month 1-12) is a day of the calendar. */
function dayExists(year: number, month: number, day: number): boolean {
  const date = new Date(Date.UTC(year, month - 1, day))
  return month >= 1 && month <= 12 && date.getUTCMonth() === month - 1 && date.getUTCDate() === day
}

/** A plain decimal number as people write it ("7", "-0.25", ".5", "1e-3"); hex, binary, "Infinity" and blanks are not numbers. */
export function parseDecimal(text: string): number | null {
  const trimmed = text.trim()
  if (!/^[+-]?(\d+(\.\d*)?|\.\d+)(e[+-]?\d+)?$/i.test(trimmed)) return null
  const value = Number(trimmed)
  return Number.isFinite(value) ? value : null
}

// A date, optionally with a time ('T' or one space between) and an offset; nothing else.
const ISO_LIKE = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,9}))?)?(Z|[+-]\d{2}:?\d{2})?)?$/

/** An instant read from text, and whether the text held a date only. */
export interface ParsedTime {
  ms: number
  dateOnly: boolean
}

/**
 * Reads "2026-03-14", "2026-03-14 08:30", "2026-03-14T08:30:00" (both read as UTC) or ISO 8601
 * with "Z" or an offset such as "+02:00". Anything else is null, including what Date.parse
 * would guess at ("03/04/2026" is 4 March to some readers and 3 April to others), days that
 * do not exist, 24:00 and offsets beyond 14 hours. The numbers are read here, not by
 * Date.parse, so the browser and the server read a text the same way.
 */
export function parseIsoTime(text: string): ParsedTime | null {
  // The stored form within its plain ranges, read from its digits: the same instant this rule
  // gives it (checked by a property test), without the pattern and the Date a day check makes.
  // A file exported from Tidewright and imported again holds 100,000 of them.
  const stored = storedInstantMs(text)
  if (stored !== undefined) return { ms: stored, dateOnly: false }
  const match = ISO_LIKE.exec(text.trim())
  if (!match) return null
  const [, year, month, day, hour = '0', minute = '0', second = '0', fraction = '0', offset] = match
  // The day read from the groups already matched (a CSV import reads 100,000 of these).
  if (!dayExists(Number(year), Number(month), Number(day))) return null
  if (Number(hour) > 23 || Number(minute) > 59 || Number(second) > 59) return null
  let offsetMinutes = 0
  if (offset && offset !== 'Z') {
    const [hours, minutes] = [Number(offset.slice(1, 3)), Number(offset.slice(-2))]
    if (hours > 14 || minutes > 59) return null
    offsetMinutes = (offset.startsWith('-') ? -1 : 1) * (hours * 60 + minutes)
  }
  const utc = Date.UTC(Number(year), Number(month) - 1, Number(day), Number(hour), Number(minute), Number(second), Math.round(Number(`0.${fraction}`) * 1000))
  return { ms: utc - offsetMinutes * 60_000, dateOnly: match[4] === undefined }
}

/** The stored form of an instant: "2026-03-14T08:30:00.000Z", as toISOString writes it. */
export const STORED_TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/

/** The instant a text names, as stored ("2026-03-14T08:30:00.000Z"), read by parseIsoTime; null when it names none. */
export function toIsoInstant(text: string): string | null {
  const parsed = parseIsoTime(text)
  return parsed ? new Date(parsed.ms).toISOString() : null
}
