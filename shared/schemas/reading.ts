/**
 * Input schemas for readings, events and CSV import: the form and the handlers parse
 * with the same schemas. Shapes and types only; physical bounds and unit conversion
 * are in shared/readings/entry.ts (they depend on the basis and unit chosen).
 */
import * as v from 'valibot'
import { SG_BASES } from '../chemistry/seawater'
import { ENTRY_NOTES_MAX } from '../readings/fields'
import { UPLOAD_EMPTY_MESSAGE } from '../uploads/files'
import { isoTimeText as isoTime } from './common'
import {
  AMMONIA_BASES, EVENT_KINDS, INPUT_FIELDS, LIVESTOCK_GROUPS, NITRATE_BASES, NITRITE_BASES, SALINITY_MODES, TEMPERATURE_UNITS, VOLUME_UNITS,
} from '../vocabulary'

const SG_KEYS = Object.keys(SG_BASES) as [keyof typeof SG_BASES, ...(keyof typeof SG_BASES)[]]

const measured = (label: string) => v.nullish(v.pipe(v.number(`${label} must be a number.`), v.finite(`${label} must be a number.`)))

export const KitBasisSchema = v.object({
  ammonia: v.picklist(AMMONIA_BASES, 'Ammonia basis is NH3, NH4 or N.'),
  nitrite: v.picklist(NITRITE_BASES, 'Nitrite basis is NO2 or N.'),
  nitrate: v.picklist(NITRATE_BASES, 'Nitrate basis is NO3 or N.'),
})

const readingEntries = {
  takenAt: isoTime('Give the date and time the test was taken.'),
  ammonia: measured('Ammonia'),
  nitrite: measured('Nitrite'),
  nitrate: measured('Nitrate'),
  basis: KitBasisSchema,
  pH: measured('pH'),
  temperature: measured('Temperature'),
  temperatureUnit: v.picklist(TEMPERATURE_UNITS, 'Temperature unit is C or F.'),
  salinity: measured('Salinity'),
  salinityMode: v.picklist(SALINITY_MODES, 'Salinity is practical salinity, specific gravity or conductivity.'),
  sgBasis: v.optional(v.picklist(SG_KEYS, 'Unknown specific-gravity basis.')),
  conductivityTemperatureC: measured('Conductivity temperature'),
  alkalinityDkh: measured('Alkalinity'),
  calciumMgL: measured('Calcium'),
  magnesiumMgL: measured('Magnesium'),
  phosphateMgL: measured('Phosphate'),
  notes: v.nullish(v.pipe(v.string('Notes must be text.'), v.maxLength(ENTRY_NOTES_MAX, `Notes are at most ${ENTRY_NOTES_MAX} characters.`))),
}

/** POST /api/tanks/:id/readings. `rememberBasis` stores the kit basis on the tank for next time. */
export const ReadingInputSchema = v.object({
  ...readingEntries,
  rememberBasis: v.optional(v.boolean(), true),
  /** Id of a photo of the test, from the uploads feature; attached when that lands. */
  photoUploadId: v.optional(v.pipe(v.string(), v.uuid('Not a valid upload id.'))),
})
export type ReadingInput = v.InferOutput<typeof ReadingInputSchema>

/** PATCH /api/tanks/:id/readings/:readingId: any subset; null clears a value. */
export const ReadingPatchSchema = v.partial(v.object(readingEntries))
export type ReadingPatch = v.InferOutput<typeof ReadingPatchSchema>

export const ReadingParams = v.object({
  id: v.pipe(v.string(), v.uuid('Not a valid id.')),
  readingId: v.pipe(v.string(), v.uuid('Not a valid id.')),
})

export const EventParams = v.object({
  id: v.pipe(v.string(), v.uuid('Not a valid id.')),
  eventId: v.pipe(v.string(), v.uuid('Not a valid id.')),
})

const pageQuery = (maxPageSize: number) => ({
  page: v.optional(v.pipe(v.string(), v.toNumber('Page must be a number.'), v.integer('Page must be a whole number.'), v.minValue(1, 'Page starts at 1.'), v.maxValue(1_000_000, 'Page is too large.')), '1'),
  pageSize: v.optional(v.pipe(v.string(), v.toNumber('Page size must be a number.'), v.integer('Page size must be a whole number.'), v.minValue(1, 'Page size is at least 1.'), v.maxValue(maxPageSize, `Page size is at most ${maxPageSize}.`)), '25'),
  from: v.optional(isoTime('From must be a date.')),
  to: v.optional(isoTime('To must be a date.')),
  dir: v.optional(v.picklist(['asc', 'desc'], 'Sort direction is asc or desc.'), 'desc'),
})

export const READING_SORT_FIELDS = ['takenAt', 'ammoniaN', 'nitriteN', 'nitrateN', 'pH', 'temperatureC', 'salinity', 'createdAt'] as const
export type ReadingSortField = (typeof READING_SORT_FIELDS)[number]

/** GET /api/tanks/:id/readings query. */
export const ReadingListQuerySchema = v.object({
  ...pageQuery(500),
  sort: v.optional(v.picklist(READING_SORT_FIELDS, 'Unknown sort field.'), 'takenAt'),
})
export type ReadingListQuery = v.InferOutput<typeof ReadingListQuerySchema>

export const EVENT_SORT_FIELDS = ['at', 'kind', 'createdAt'] as const

/** GET /api/tanks/:id/events query. */
export const EventListQuerySchema = v.object({
  ...pageQuery(500),
  sort: v.optional(v.picklist(EVENT_SORT_FIELDS, 'Unknown sort field.'), 'at'),
})
export type EventListQuery = v.InferOutput<typeof EventListQuerySchema>

const eventEntries = {
  at: isoTime('Give the date and time.'),
  kind: v.picklist(EVENT_KINDS, 'Unknown kind of event.'),
  /** ammonia-dose: mg/L in `doseBasis`. water-change: volume in `volumeUnit`. livestock-added: count. */
  amount: measured('Amount'),
  doseBasis: v.optional(v.picklist(AMMONIA_BASES, 'Dose basis is NH3, NH4 or N.'), 'N'),
  volumeUnit: v.optional(v.picklist(VOLUME_UNITS, 'Volume is in litres or US gallons.'), 'L'),
  group: v.nullish(v.picklist(LIVESTOCK_GROUPS, 'Unknown livestock group.')),
  notes: v.nullish(v.pipe(v.string('Notes must be text.'), v.maxLength(ENTRY_NOTES_MAX, `Notes are at most ${ENTRY_NOTES_MAX} characters.`))),
}

/** POST /api/tanks/:id/events. */
export const EventInputSchema = v.object(eventEntries)
export type EventInput = v.InferOutput<typeof EventInputSchema>

/** PATCH /api/tanks/:id/events/:eventId. */
export const EventPatchSchema = v.partial(v.object(eventEntries))
export type EventPatch = v.InferOutput<typeof EventPatchSchema>

/** Column names the importer maps onto. */
export const IMPORT_TARGETS = ['takenAt', ...INPUT_FIELDS, 'notes'] as const
export type ImportTarget = (typeof IMPORT_TARGETS)[number]

/** How the import reads a file: the same options whether the file comes as JSON text or as the request's body. */
const importOptionEntries = {
  /** Target -> the CSV header that holds it. Unmapped targets are guessed from the header. */
  mapping: v.optional(v.record(v.picklist(IMPORT_TARGETS, 'Unknown column target.'), v.pipe(v.string(), v.maxLength(200))), {}),
  /** How the kit reads; when left out, as the file's headers say (Tidewright's export: as N), else the tank's remembered kit. */
  basis: v.optional(KitBasisSchema),
  temperatureUnit: v.optional(v.picklist(TEMPERATURE_UNITS, 'Temperature unit is C or F.'), 'C'),
  salinityMode: v.optional(v.picklist(SALINITY_MODES, 'Unknown salinity mode.'), 'practical'),
  sgBasis: v.optional(v.picklist(SG_KEYS, 'Unknown specific-gravity basis.')),
}
const DRY_RUN_MESSAGE = 'dryRun is true or false.'

/** The import's options without the file (what the form checks, and what a file sent as the body comes with). */
export const ReadingImportOptionsSchema = v.object(importOptionEntries)
export type ReadingImportOptions = v.InferOutput<typeof ReadingImportOptionsSchema>

/** POST /api/tanks/:id/readings/import as JSON, the file's text in `csv`. Nothing is written unless dryRun is false. */
export const ReadingImportSchema = v.object({
  csv: v.pipe(v.string('Attach the CSV text.'), v.minLength(1, UPLOAD_EMPTY_MESSAGE)),
  ...importOptionEntries,
  dryRun: v.optional(v.boolean(DRY_RUN_MESSAGE), true),
})

/**
 * The same options in the query string, for a file sent as the request's body (text/csv):
 * `?dryRun=false&basis.ammonia=NH3&mapping.takenAt=Date`, so a long file is never JSON text.
 * Keys with a dot fill the option they name (basis, mapping); an issue names the field as
 * the JSON way does (`basis.ammonia`).
 */
export const ReadingImportQuerySchema = v.pipe(
  v.record(v.string(), v.string('Give each option once.')),
  v.transform(nestedQuery),
  v.object({
    ...importOptionEntries,
    dryRun: v.pipe(v.optional(v.picklist(['true', 'false'], DRY_RUN_MESSAGE), 'true'), v.transform(text => text === 'true')),
  }),
)

/** The options as query-string pairs (ReadingImportQuerySchema reads them back): what the form sends with a file. */
export function importOptionsQuery(options: ReadingImportOptions & { dryRun: boolean }): Record<string, string> {
  const query: Record<string, string> = { dryRun: String(options.dryRun), temperatureUnit: options.temperatureUnit, salinityMode: options.salinityMode }
  if (options.sgBasis) query.sgBasis = options.sgBasis
  for (const [key, value] of Object.entries(options.basis ?? {})) query[`basis.${key}`] = value
  for (const [key, value] of Object.entries(options.mapping)) if (value) query[`mapping.${key}`] = value
  return query
}

/** `{ 'basis.ammonia': 'NH3' }` -> `{ basis: { ammonia: 'NH3' } }`, in maps first so no key (`__proto__.x`) reaches a prototype. */
function nestedQuery(query: Record<string, string>): Record<string, unknown> {
  const entries = new Map<string, unknown>()
  for (const [key, value] of Object.entries(query)) {
    const dot = key.indexOf('.')
    if (dot < 0) {
      entries.set(key, value)
      continue
    }
    const outer = key.slice(0, dot)
    const inner = entries.get(outer) instanceof Map ? entries.get(outer) as Map<string, string> : new Map<string, string>()
    entries.set(outer, inner.set(key.slice(dot + 1), value))
  }
  return Object.fromEntries([...entries].map(([key, value]) => [key, value instanceof Map ? Object.fromEntries(value) : value]))
}

export type ReadingImportInput = v.InferOutput<typeof ReadingImportSchema>
