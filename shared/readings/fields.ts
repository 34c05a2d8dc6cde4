/**
 * Field rules every path that writes a reading or an event shares (the form's schema, the
 * entry conversion, the CSV import and corrections), so a value refused in one is refused
 * in all.
 */

/** Longest note a reading or event keeps. */
export const ENTRY_NOTES_MAX = 2000

/**
 * Whether the calendar date at the start of a time exists. Date.parse rolls 2026-02-30 over
 * into March; a mistyped day must be refused instead, not stored as another day.
 */
export function calendarDateExists(text: string): boolean {
  const match = /^\s*(\d{4})-(\d{2})-(\d{2})/.exec(text)
  if (!match) return true
  const [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])]
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
