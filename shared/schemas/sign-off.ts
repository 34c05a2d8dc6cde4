/** Inputs for sign-off: request, decision, reopening, corrections and the start of stocking. */
import * as v from 'valibot'
import { MAX_LIVESTOCK_COUNT } from '../readings/events'
import { ENTRY_NOTES_MAX } from '../readings/fields'
import { LIVESTOCK_GROUPS, MEASURED_FIELDS, PHYSICAL_BOUNDS, type MeasuredField } from '../vocabulary'
import { isoTimestampText } from './common'

const note = (max: number) => v.pipe(v.string('Write a note.'), v.trim(), v.maxLength(max, `Keep it under ${max} characters.`))
const requiredNote = (what: string, max = 2000) => v.pipe(v.string(`Write ${what}.`), v.trim(), v.minLength(3, `Write ${what}.`), v.maxLength(max, `Keep it under ${max} characters.`))
const isoTime = isoTimestampText('Give a date and time.')

/** Asking the tank's supervisor to sign the cycle off. */
export const SignOffRequestSchema = v.object({
  note: v.optional(note(2000), ''),
})
export type SignOffRequestInput = v.InferOutput<typeof SignOffRequestSchema>

/**
 * A supervisor's decision. Returning needs a note for the aquarist; approving against
 * the engine's verdict needs a reason, which the server enforces (it knows the verdict).
 */
export const SignOffDecisionSchema = v.pipe(
  v.object({
    decision: v.picklist(['approve', 'return'], 'Choose to sign off or to return the tank.'),
    note: v.optional(note(2000), ''),
  }),
  v.forward(
    v.check(input => input.decision !== 'return' || input.note.length >= 3, 'Say what needs doing before the tank comes back.'),
    ['note'],
  ),
)
export type SignOffDecisionInput = v.InferOutput<typeof SignOffDecisionSchema>

/** The message the server gives when an override arrives without a reason. */
export const OVERRIDE_REASON_MESSAGE = 'The engine does not judge this cycle complete: write why you sign it off anyway.'

/** Reopening a signed-off record, always with a reason. */
export const SignOffReopenSchema = v.object({
  reason: requiredNote('why the sign-off is reopened'),
})

/** A canonical value within the same physical bounds a reading must meet; null clears it. */
const measured = (field: MeasuredField) => {
  const [min, max] = PHYSICAL_BOUNDS[field]
  return v.optional(v.nullable(v.pipe(v.number('Give a number.'), v.finite('Give a number.'), v.minValue(min, `At least ${min}.`), v.maxValue(max, `At most ${max}.`))))
}

/**
 * A correction of a reading: canonical values (mg/L as N, degrees C, practical salinity)
 * that replace the corrected entry's; a value left out is carried over unchanged.
 */
export const ReadingCorrectionSchema = v.object({
  reason: requiredNote('what was wrong', 1000),
  ...Object.fromEntries(MEASURED_FIELDS.map(field => [field, measured(field)])) as Record<MeasuredField, ReturnType<typeof measured>>,
  notes: v.optional(v.nullable(note(2000))),
})
export type ReadingCorrectionInput = v.InferOutput<typeof ReadingCorrectionSchema>

/** A correction of an event; fields left out are carried over. */
export const EventCorrectionSchema = v.object({
  reason: requiredNote('what was wrong', 1000),
  amount: v.optional(v.nullable(v.pipe(v.number('Give a number.'), v.finite('Give a number.'), v.minValue(0, 'At least 0.'), v.maxValue(100000, 'Too large.')))),
  group: v.optional(v.nullable(v.picklist(LIVESTOCK_GROUPS, 'Choose a livestock group.'))),
  notes: v.optional(v.nullable(note(2000))),
})
export type EventCorrectionInput = v.InferOutput<typeof EventCorrectionSchema>

/** "Start stocking", optionally with the first livestock that went in. */
export const StartStockingSchema = v.object({
  livestock: v.optional(v.object({
    group: v.picklist(LIVESTOCK_GROUPS, 'Choose a livestock group.'),
    // Required, as in the event form: a livestock entry says how many went in.
    count: v.pipe(v.number('Give how many.'), v.integer('A whole number.'), v.minValue(1, 'At least 1.'), v.maxValue(MAX_LIVESTOCK_COUNT, `At most ${MAX_LIVESTOCK_COUNT}.`)),
    notes: v.optional(note(ENTRY_NOTES_MAX)),
    at: v.optional(isoTime),
  })),
})
export type StartStockingInput = v.InferOutput<typeof StartStockingSchema>

const uuid = v.pipe(v.string(), v.uuid('Not a valid id.'))
/** Route parameters of a reading correction. */
export const ReadingParams = v.object({ id: uuid, readingId: uuid })
/** Route parameters of an event correction. */
export const EventParams = v.object({ id: uuid, eventId: uuid })

/** Verification codes look like TW-XXXX-XXXX-XXXX-XXXX-XXXX-XXXX (Crockford base32). */
export const VERIFICATION_CODE_PATTERN = /^TW(?:-[0-9A-HJKMNP-TV-Z]{4}){6}$/
export const VerifyParams = v.object({
  code: v.pipe(v.string(), v.trim(), v.toUpperCase(), v.regex(VERIFICATION_CODE_PATTERN, 'Not a Tidewright verification code.')),
})

/** GET /api/tanks/:id/evidence query: which page of readings and events (1, the default: the newest). */
export const EvidenceQuerySchema = v.object({
  page: v.optional(v.pipe(v.string(), v.toNumber('Page must be a number.'), v.integer('Page must be a whole number.'), v.minValue(1, 'Page starts at 1.'), v.maxValue(1_000_000, 'Page is too large.')), '1'),
})
