/**
 * The company's settings (organisations.settings), written once: the settings form, the
 * PUT route and every server reader use this file. Input is checked strictly (messages per
 * field); what is stored is read leniently, field by field, so one stale or hand-edited value
 * falls back to its default instead of taking the company's other settings with it.
 */
import * as v from 'valibot'
import { THRESHOLD_SPECS } from '../cycle/thresholds'
import type { Thresholds } from '../cycle/types'
import { UnitSystemSchema } from './common'

export type ThresholdKey = keyof Thresholds

/** A company's own value for some engine thresholds, canonical units; missing keys use Tidewright's defaults. */
export type ThresholdOverrides = Partial<Record<ThresholdKey, number>>

/** Whether a text is a time zone the IANA database (as the runtime knows it) names. */
export function isTimeZone(value: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: value })
    return true
  }
  catch {
    return false
  }
}

const optionalText = (max: number, what: string) =>
  v.pipe(v.string(`Give ${what} as text.`), v.trim(), v.maxLength(max, `Keep ${what} under ${max} characters.`))

const wholeNumber = (min: number, max: number, what: string) => v.pipe(
  v.number(`Give ${what} as a number.`),
  v.integer(`Give ${what} as a whole number.`),
  v.minValue(min, `${what[0]!.toUpperCase()}${what.slice(1)} must be between ${min} and ${max}.`),
  v.maxValue(max, `${what[0]!.toUpperCase()}${what.slice(1)} must be between ${min} and ${max}.`),
)

const ContactEntries = {
  email: v.union([
    v.literal(''),
    v.pipe(v.string(), v.trim(), v.toLowerCase(), v.maxLength(254, 'That e-mail address is too long.'), v.email('Enter a valid e-mail address, or leave it empty.')),
  ], 'Enter a valid e-mail address, or leave it empty.'),
  phone: v.pipe(optionalText(40, 'the phone number'), v.regex(/^[\d\s()+./-]*$/, 'Use digits, spaces and + ( ) - . / only.')),
  address: optionalText(300, 'the address'),
}

const RemindersEntries = {
  enabled: v.boolean('Choose on or off.'),
  graceMinutes: wholeNumber(0, 720, 'the grace period'),
  missedDays: wholeNumber(1, 14, 'the number of missed days'),
}

const SignOffEntries = {
  /** May the person who asked for a sign-off approve it themselves (always with a written reason)? */
  requesterMayApprove: v.boolean('Choose yes or no.'),
}

const TimeZoneSchema = v.pipe(
  v.string('Choose a time zone.'),
  v.trim(),
  v.minLength(1, 'Choose a time zone.'),
  v.maxLength(64, 'Choose a time zone from the list.'),
  v.check(isTimeZone, 'Choose a time zone from the list.'),
)

/**
 * Why a company's value for a threshold is refused, or null when it is fine (canonical units).
 * The range is the rule engine's own (THRESHOLD_SPECS), so a stored value the form accepted
 * is always one the engine accepts.
 */
export function thresholdProblem(key: string, value: unknown): string | null {
  if (!Object.hasOwn(THRESHOLD_SPECS, key)) return 'Tidewright has no such threshold.'
  if (typeof value !== 'number' || !Number.isFinite(value)) return 'Give a number.'
  const { min, max, unit } = THRESHOLD_SPECS[key as ThresholdKey]
  if (value < min || value > max) return `Give a value from ${min} to ${max} (${unit}).`
  return null
}

const ThresholdOverridesSchema = v.pipe(
  v.record(v.string(), v.unknown(), 'Give the thresholds as a list of values.'),
  v.rawTransform(({ dataset, addIssue, NEVER }) => {
    const out: ThresholdOverrides = {}
    let failed = false
    for (const [key, value] of Object.entries(dataset.value)) {
      const problem = thresholdProblem(key, value)
      if (problem) {
        failed = true
        addIssue({ message: problem, path: [{ type: 'object', origin: 'value', input: dataset.value, key, value }] })
      }
      else out[key as ThresholdKey] = value as number
    }
    return failed ? NEVER : out
  }),
)

const OrganisationSettingsEntries = {
  contact: v.object(ContactEntries, 'Give the contact details.'),
  timeZone: TimeZoneSchema,
  defaultUnits: UnitSystemSchema,
  escalationMinutes: wholeNumber(5, 1440, 'the escalation delay'),
  reminders: v.object(RemindersEntries, 'Give the reminder settings.'),
  signOff: v.object(SignOffEntries, 'Give the sign-off policy.'),
  thresholds: ThresholdOverridesSchema,
}

/** The company settings as the form sends them and the server checks them. */
export const OrganisationSettingsSchema = v.object(OrganisationSettingsEntries, 'Give the company settings.')
export type OrganisationSettings = v.InferOutput<typeof OrganisationSettingsSchema>

/** Tidewright's defaults: what a new company starts with and what a missing or broken stored value reads as. */
export const DEFAULT_ORGANISATION_SETTINGS: Readonly<OrganisationSettings> = Object.freeze({
  contact: { email: '', phone: '', address: '' },
  timeZone: 'UTC',
  defaultUnits: 'metric',
  // An unanswered danger alert reaches the supervisor after an hour (common practice, no published source).
  escalationMinutes: 60,
  reminders: { enabled: true, graceMinutes: 60, missedDays: 2 },
  signOff: { requesterMayApprove: false },
  thresholds: {},
})

/** What organisations.settings may hold: any part of the settings (older rows hold fewer keys). */
export type StoredOrganisationSettings = { [K in keyof OrganisationSettings]?: unknown }

/** The company name and its settings, as the settings form sends them; `version` is the one the form was loaded with. */
export const CompanySettingsUpdateSchema = v.object({
  name: v.pipe(v.string('Enter the company name.'), v.trim(), v.minLength(1, 'Enter the company name.'), v.maxLength(120, 'Keep the company name under 120 characters.')),
  settings: OrganisationSettingsSchema,
  version: v.pipe(v.number('Reload the page and try again.'), v.integer('Reload the page and try again.'), v.minValue(0, 'Reload the page and try again.')),
})
export type CompanySettingsUpdate = v.InferOutput<typeof CompanySettingsUpdateSchema>

const isRecord = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value)

/** Each entry parsed on its own: a value that fails its schema reads as its default. */
function lenient<T extends Record<string, unknown>>(entries: v.ObjectEntries, defaults: T, raw: unknown): T {
  const source = isRecord(raw) ? raw : {}
  const out: Record<string, unknown> = {}
  for (const [key, fallback] of Object.entries(defaults)) {
    const result = v.safeParse(entries[key]!, source[key])
    out[key] = result.success ? result.output : fallback
  }
  return out as T
}

/**
 * The stored settings with defaults filled in. Never throws: a value the schema refuses
 * (hand-edited, or from an older version) reads as its default, and a threshold outside
 * today's range or unknown to this rule set is left out so the engine uses its default.
 */
export function parseStoredSettings(raw: unknown): OrganisationSettings {
  const source = isRecord(raw) ? raw : {}
  const d = DEFAULT_ORGANISATION_SETTINGS
  const thresholds: ThresholdOverrides = {}
  if (isRecord(source.thresholds)) {
    for (const [key, value] of Object.entries(source.thresholds)) {
      if (thresholdProblem(key, value) === null) thresholds[key as ThresholdKey] = value as number
    }
  }
  return {
    ...lenient({ timeZone: TimeZoneSchema, defaultUnits: OrganisationSettingsEntries.defaultUnits, escalationMinutes: OrganisationSettingsEntries.escalationMinutes }, { timeZone: d.timeZone, defaultUnits: d.defaultUnits, escalationMinutes: d.escalationMinutes }, source),
    contact: lenient(ContactEntries, d.contact, source.contact),
    reminders: lenient(RemindersEntries, d.reminders, source.reminders),
    signOff: lenient(SignOffEntries, d.signOff, source.signOff),
    thresholds,
  }
}
