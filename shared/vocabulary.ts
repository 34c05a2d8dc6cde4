/**
 * Tidewright's vocabulary: every fixed list of names the product uses, written once.
 * The Drizzle schema takes these lists as its text enums, the valibot schemas as their
 * picklists, the rule engine and the pages as their types and options. Adding a value
 * here (and a migration if a column holds it) is the whole change.
 *
 * Pure data, no imports: safe for the browser, the server, drizzle-kit and the tests.
 */

/** The four kinds of Tidewright user. */
export const ROLES = ['admin', 'aquarist', 'supervisor', 'client'] as const
export type Role = (typeof ROLES)[number]

/** Staff roles: everyone at the company who is not a client. */
export const STAFF_ROLES = ['admin', 'aquarist', 'supervisor'] as const satisfies readonly Role[]
export type StaffRole = (typeof STAFF_ROLES)[number]

/** Where a tank stands in its life, from the plan to living animals. */
export const TANK_STATUSES = ['planned', 'building', 'cycling', 'cycled', 'signed-off', 'stocking'] as const
export type TankStatus = (typeof TANK_STATUSES)[number]

export const TANK_SHAPES = ['rectangular', 'cube', 'cylinder', 'bow-front', 'corner', 'hexagonal'] as const
export type TankShape = (typeof TANK_SHAPES)[number]

export const TANK_MATERIALS = ['glass', 'acrylic'] as const
export type TankMaterial = (typeof TANK_MATERIALS)[number]

/** Natural seawater, or salt mixed into purified water. */
export const WATER_SOURCES = ['natural', 'mixed'] as const
export type WaterSource = (typeof WATER_SOURCES)[number]

/** How the tank is being cycled: fishless with dosed ammonia, or with a few hardy fish. */
export const CYCLE_METHODS = ['fishless', 'fish-in'] as const
export type CycleMethod = (typeof CYCLE_METHODS)[number]

/** A build-plan stage's progress. */
export const STAGE_STATUSES = ['not-started', 'in-progress', 'done', 'skipped'] as const
export type StageStatus = (typeof STAGE_STATUSES)[number]

/** Where the nitrogen cycle stands, in the order a cycle passes through them. */
export const CYCLE_PHASES = ['not-started', 'ammonia', 'nitrite', 'settling', 'complete'] as const
export type CyclePhase = (typeof CYCLE_PHASES)[number]

/** Kinds of livestock the engine gives a go/no-go for, least to most demanding. */
export const LIVESTOCK_GROUPS = ['fish', 'invertebrates', 'soft-coral', 'lps-coral', 'sps-coral'] as const
export type LivestockGroup = (typeof LIVESTOCK_GROUPS)[number]

/** Things done to a tank that are logged beside the tests. */
export const EVENT_KINDS = ['ammonia-dose', 'bacteria-dose', 'water-change', 'livestock-added', 'lighting-change', 'note'] as const
export type EventKind = (typeof EVENT_KINDS)[number]

/** The event kinds the rule engine reads; a lighting change does not touch the cycle. */
export const CYCLE_EVENT_KINDS = ['ammonia-dose', 'bacteria-dose', 'water-change', 'livestock-added', 'note'] as const satisfies readonly EventKind[]
export type CycleEventKind = (typeof CYCLE_EVENT_KINDS)[number]

/** A person's display units; the database is always metric. */
export const UNIT_SYSTEMS = ['us', 'metric'] as const
export type UnitSystem = (typeof UNIT_SYSTEMS)[number]

/** What a test kit's nitrogen result is expressed as (mg/L of the ion, or of nitrogen). */
export const AMMONIA_BASES = ['NH3', 'NH4', 'N'] as const
export type AmmoniaBasis = (typeof AMMONIA_BASES)[number]
export const NITRITE_BASES = ['NO2', 'N'] as const
export type NitriteBasis = (typeof NITRITE_BASES)[number]
export const NITRATE_BASES = ['NO3', 'N'] as const
export type NitrateBasis = (typeof NITRATE_BASES)[number]

/** How a salinity value was read: practical salinity, specific gravity or conductivity. */
export const SALINITY_MODES = ['practical', 'sg', 'conductivity'] as const
export type SalinityMode = (typeof SALINITY_MODES)[number]

export const TEMPERATURE_UNITS = ['C', 'F'] as const
export type TemperatureUnit = (typeof TEMPERATURE_UNITS)[number]

/** Litres or US gallons, for water-change volumes typed by hand. */
export const VOLUME_UNITS = ['L', 'usgal'] as const
export type VolumeUnit = (typeof VOLUME_UNITS)[number]

/** How much a finding matters. */
export const SEVERITIES = ['info', 'caution', 'danger'] as const
export type Severity = (typeof SEVERITIES)[number]

/** The severities a stored-but-worrying reading value is flagged with. */
export const FLAG_SEVERITIES = ['caution', 'danger'] as const satisfies readonly Severity[]
export type FlagSeverity = (typeof FLAG_SEVERITIES)[number]

/** A danger alert's life: raised, seen by someone, cleared. */
export const ALERT_STATUSES = ['open', 'acknowledged', 'resolved'] as const
export type AlertStatus = (typeof ALERT_STATUSES)[number]

/** Alert statuses still asking for attention. */
export const ACTIVE_ALERT_STATUSES = ['open', 'acknowledged'] as const satisfies readonly AlertStatus[]

/** A sign-off request's life. */
export const SIGN_OFF_STATUSES = ['requested', 'approved', 'returned', 'reopened'] as const
export type SignOffStatus = (typeof SIGN_OFF_STATUSES)[number]

/** An outbox e-mail's delivery state. */
export const MAIL_STATUSES = ['pending', 'sending', 'sent', 'failed'] as const
export type MailStatus = (typeof MAIL_STATUSES)[number]

/** What a single-use link is for. */
export const AUTH_TOKEN_PURPOSES = ['invite', 'reset'] as const
export type AuthTokenPurpose = (typeof AUTH_TOKEN_PURPOSES)[number]

/**
 * The measured values of one test session, canonical units (mg/L as N, practical salinity, C).
 * The rule engine reads a test's values through it too (shared/cycle/history.ts, snapshot.ts),
 * and orders two tests of one time, entry and id by their values in this order.
 */
export const MEASURED_FIELDS = ['ammoniaN', 'nitriteN', 'nitrateN', 'pH', 'temperatureC', 'salinity', 'alkalinityDkh', 'calciumMgL', 'magnesiumMgL', 'phosphateMgL'] as const
export type MeasuredField = (typeof MEASURED_FIELDS)[number]

/** The nitrogen tests, entered as the kit reads them (as the ion, or as N). */
export const NITROGEN_INPUT_FIELDS = ['ammonia', 'nitrite', 'nitrate'] as const
export type NitrogenInputField = (typeof NITROGEN_INPUT_FIELDS)[number]

/** The tests of a daily session: the nitrogen tests and the water's pH, temperature and salinity (a correction edits these in place). */
export const DAILY_INPUT_FIELDS = [...NITROGEN_INPUT_FIELDS, 'pH', 'temperature', 'salinity'] as const

/** Reef chemistry, entered as it is stored: no kit basis or unit to convert from. */
export const REEF_INPUT_FIELDS = ['alkalinityDkh', 'calciumMgL', 'magnesiumMgL', 'phosphateMgL'] as const satisfies readonly MeasuredField[]

/**
 * Every measured quantity a daily test form or a CSV row can carry, named as the body field it
 * arrives in (in the kit's basis or the person's unit; MEASURED_FIELDS are the canonical values it
 * becomes). The form's fields, the importer's columns and targets and the entry check read it.
 */
export const INPUT_FIELDS = [...DAILY_INPUT_FIELDS, ...REEF_INPUT_FIELDS] as const
export type InputField = (typeof INPUT_FIELDS)[number]

/**
 * Physical bounds, canonical units: outside them a value cannot be a real test of a
 * tank's water and is refused, however it arrives (form, CSV import, edit, correction).
 * Nitrogen limits are far above anything a test kit reads (the top colour steps are about
 * 8 ppm NH3, 5 ppm NO2, 160 ppm NO3); pH is the scale itself; temperature is liquid sea
 * water near the surface; salinity is the EOS-80 / PSS-78 range the conversions are valid
 * for. The rest: common practice, no published source.
 */
export const PHYSICAL_BOUNDS: Readonly<Record<MeasuredField, readonly [min: number, max: number]>> = Object.freeze({
  ammoniaN: [0, 50],
  nitriteN: [0, 50],
  nitrateN: [0, 500],
  pH: [0, 14],
  temperatureC: [-2, 40],
  salinity: [0, 42],
  alkalinityDkh: [0, 40],
  calciumMgL: [0, 2000],
  magnesiumMgL: [0, 3000],
  phosphateMgL: [0, 50],
})
