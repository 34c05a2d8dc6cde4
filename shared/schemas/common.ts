import * as v from 'valibot'
import { UNIT_SYSTEMS } from '../vocabulary'
import { calendarDateExists, parseIsoTime } from '../readings/fields'

const NO_SUCH_DAY = 'That date does not exist. Check the day and the month.'

/**
 * A date and time as every path reads it (shared/readings/fields.ts parseIsoTime, the CSV
 * import's rule): 2026-02-30 and 24:00 are refused, not rolled over, and 03/04/2026 is
 * refused, not guessed.
 */
export const isoTimeText = (message: string) => v.pipe(
  v.string(message),
  v.maxLength(40, message),
  v.check(calendarDateExists, NO_SUCH_DAY),
  v.check(text => parseIsoTime(text) !== null, message),
)

/** A full ISO 8601 timestamp with its offset ("2026-03-14T08:30:00Z"), read by the same rule. */
export const isoTimestampText = (message: string) => v.pipe(
  v.string(message),
  v.isoTimestamp(message),
  v.check(calendarDateExists, NO_SUCH_DAY),
  v.check(text => parseIsoTime(text) !== null, message),
)

/** A calendar day (YYYY-MM-DD) that exists. */
export const isoDayText = (what: string) => v.pipe(
  v.string(`${what} must be a date (YYYY-MM-DD).`),
  v.regex(/^\d{4}-\d{2}-\d{2}$/, `${what} must be a date (YYYY-MM-DD).`),
  v.check(calendarDateExists, `${what} must be a real date.`),
)

/** Route parameter `:id` — our ids are UUIDs. */
export const IdParams = v.object({
  id: v.pipe(v.string(), v.uuid('Not a valid id.')),
})

/** Body of an archive route: archive (the default) or restore with `{ archived: false }`. */
export const ArchiveSchema = v.object({
  archived: v.optional(v.boolean('archived is true or false.'), true),
})

/** A unit system choice: US (gallons, °F, inches) or metric (litres, °C, millimetres). */
export const UnitSystemSchema = v.picklist(UNIT_SYSTEMS, 'Choose US or metric units.')
