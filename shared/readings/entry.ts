/**
 * From what a client typed on the test form to the canonical reading the database holds:
 * mg/L as nitrogen, practical salinity, degrees Celsius. Pure and shared, so the form
 * shows the same refusals and flags the server answers with.
 *
 * Two kinds of limit:
 * - physical bounds: a value outside them cannot be a real test of a tank's water and is
 *   refused with a message for its field;
 * - alarm ranges: a value that is possible but worrying is stored and flagged, so the
 *   client sees at once that it matters.
 */
import { toNitrogen } from '../chemistry/nitrogen'
import {
  PSS78_SALINITY_RANGE, PSS78_TEMPERATURE_RANGE_C, SG_BASES, SPECIFIC_GRAVITY_RANGE,
  conductivityRangeMsCm, salinityFromConductivity, salinityFromSpecificGravity,
} from '../chemistry/seawater'
import { DEFAULT_THRESHOLDS } from '../cycle/thresholds'
import { celsiusToFahrenheit, fahrenheitToCelsius } from '../units'
import { calendarDateExists, ENTRY_NOTES_MAX, parseIsoTime, STORED_TIME, toIsoInstant } from './fields'
import { nitrogenFromKit, nitrogenToKit } from './kit-basis'
import { numberText } from './number-text'
import {
  AMMONIA_BASES, MEASURED_FIELDS, NITRATE_BASES, NITRITE_BASES, NITROGEN_INPUT_FIELDS, PHYSICAL_BOUNDS, REEF_INPUT_FIELDS, TEMPERATURE_UNITS,
  type AmmoniaBasis, type FlagSeverity, type MeasuredField, type NitrateBasis, type NitriteBasis, type NitrogenInputField, type SalinityMode, type TemperatureUnit,
} from '../vocabulary'

export type SgBasisKey = keyof typeof SG_BASES

export interface KitBasisChoice {
  ammonia: AmmoniaBasis
  nitrite: NitriteBasis
  nitrate: NitrateBasis
}

export const DEFAULT_KIT_BASIS: Readonly<KitBasisChoice> = Object.freeze({ ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' })
export const SG_BASIS_KEYS = Object.keys(SG_BASES) as SgBasisKey[]

/** What the entry form (or a CSV row) sends. Missing or null values were not tested. */
export interface ReadingEntry {
  takenAt: string
  ammonia?: number | null
  nitrite?: number | null
  nitrate?: number | null
  basis: KitBasisChoice
  pH?: number | null
  temperature?: number | null
  temperatureUnit: TemperatureUnit
  salinity?: number | null
  salinityMode: SalinityMode
  /** Specific-gravity basis when salinityMode is 'sg'. */
  sgBasis?: SgBasisKey
  /**
   * Sample temperature (C) a conductivity value was measured at. Meters with automatic
   * temperature compensation report at 25 C, the default (common practice, no published source).
   */
  conductivityTemperatureC?: number | null
  alkalinityDkh?: number | null
  calciumMgL?: number | null
  magnesiumMgL?: number | null
  phosphateMgL?: number | null
  notes?: string | null
}

/** The canonical values of one test session. */
export interface CanonicalValues {
  ammoniaN: number | null
  nitriteN: number | null
  nitrateN: number | null
  pH: number | null
  temperatureC: number | null
  salinity: number | null
  alkalinityDkh: number | null
  calciumMgL: number | null
  magnesiumMgL: number | null
  phosphateMgL: number | null
}

export interface EntryIssue {
  field: string
  message: string
}

/** A possible but worrying value: stored, and shown to the user. */
export interface EntryFlag {
  field: string
  severity: FlagSeverity
  message: string
}

export interface CanonicalReading {
  takenAt: string
  values: CanonicalValues
  notes: string | null
  /** What was typed and in which basis/unit, kept beside the canonical values. */
  entered: Record<string, unknown>
  flags: EntryFlag[]
}

export type EntryResult = { ok: true, reading: CanonicalReading } | { ok: false, issues: EntryIssue[] }

/** A back-dated reading is fine; one from the future beyond this clock skew is refused. */
export const FUTURE_SKEW_MS = 5 * 60_000
/** Readings older than this are refused as typing mistakes. */
export const OLDEST_READING_YEARS = 20

const NH3_N = (ppm: number) => toNitrogen(ppm, 'NH3')
const NO2_N = (ppm: number) => toNitrogen(ppm, 'NO2')

/**
 * Alarm ranges, canonical units. Outside them a value is accepted and flagged.
 * Nitrogen: ammonia above 4 ppm NH3 and nitrite above 5 ppm NO2 are beyond what a
 * fishless cycle is usually dosed to (common practice, no published source); nitrate
 * above 20 mg NO3-N/L (Camargo, Alonso & Salamanca 2005, Chemosphere 58: 1255-1267).
 * pH 7.6-8.6 (common practice, no published source). The rest: DEFAULT_THRESHOLDS.
 */
export const ALARM_RANGES: Readonly<Record<MeasuredField, readonly [number, number]>> = Object.freeze({
  ammoniaN: [0, NH3_N(4)],
  nitriteN: [0, NO2_N(5)],
  nitrateN: [0, 20],
  pH: [7.6, 8.6],
  temperatureC: [DEFAULT_THRESHOLDS.temperatureMinC, DEFAULT_THRESHOLDS.temperatureMaxC],
  salinity: [DEFAULT_THRESHOLDS.salinityMin, DEFAULT_THRESHOLDS.salinityMax],
  alkalinityDkh: [DEFAULT_THRESHOLDS.alkalinityMinDkh - 2, DEFAULT_THRESHOLDS.alkalinityMaxDkh + 3],
  calciumMgL: [DEFAULT_THRESHOLDS.calciumMinMgL - 60, DEFAULT_THRESHOLDS.calciumMaxMgL + 60],
  magnesiumMgL: [DEFAULT_THRESHOLDS.magnesiumMinMgL - 150, DEFAULT_THRESHOLDS.magnesiumMaxMgL + 150],
  phosphateMgL: [0, 0.5],
})

export const FIELD_LABELS: Readonly<Record<string, string>> = Object.freeze({
  ammoniaN: 'Ammonia',
  nitriteN: 'Nitrite',
  nitrateN: 'Nitrate',
  pH: 'pH',
  temperatureC: 'Temperature',
  salinity: 'Salinity',
  alkalinityDkh: 'Alkalinity',
  calciumMgL: 'Calcium',
  magnesiumMgL: 'Magnesium',
  phosphateMgL: 'Phosphate',
})

/** The form field each canonical value comes from, so messages land next to the right input. */
const INPUT_FIELD: Record<MeasuredField, string> = {
  ammoniaN: 'ammonia',
  nitriteN: 'nitrite',
  nitrateN: 'nitrate',
  pH: 'pH',
  temperatureC: 'temperature',
  salinity: 'salinity',
  alkalinityDkh: 'alkalinityDkh',
  calciumMgL: 'calciumMgL',
  magnesiumMgL: 'magnesiumMgL',
  phosphateMgL: 'phosphateMgL',
}

const present = (value: number | null | undefined): value is number => value !== null && value !== undefined

// The kit basis <-> N conversion lives in kit-basis.ts; entry's importers keep reaching it here.
export { nitrogenFromKit, nitrogenToKit }

/** Temperature as typed -> degrees C. */
export function temperatureToC(value: number, unit: TemperatureUnit): number {
  return unit === 'F' ? fahrenheitToCelsius(value) : value
}

/** Degrees C -> the user's unit. */
export function temperatureFromC(valueC: number, unit: TemperatureUnit): number {
  return unit === 'F' ? celsiusToFahrenheit(valueC) : valueC
}

/** Refuses a time that is not a time, is in the future beyond clock skew, or is implausibly old. */
export function checkTakenAt(takenAt: string, now: Date): EntryIssue | null {
  if (!calendarDateExists(takenAt)) return { field: 'takenAt', message: 'That date does not exist. Check the day and the month.' }
  const t = parseIsoTime(takenAt)?.ms
  if (t === undefined) return { field: 'takenAt', message: 'Give the date and time the test was taken.' }
  return checkInstant(t, now)
}

/** checkTakenAt's rules for the instant itself (epoch ms), once the text is read. */
function checkInstant(t: number, now: Date): EntryIssue | null {
  if (t > now.getTime() + FUTURE_SKEW_MS) return { field: 'takenAt', message: 'A test cannot be taken in the future. Check the date and time.' }
  if (t < now.getTime() - OLDEST_READING_YEARS * 365.25 * 86_400_000) return { field: 'takenAt', message: 'That date is too far in the past.' }
  return null
}

/** Salinity as typed -> practical salinity, or a message for the salinity field. */
function salinityFrom(entry: ReadingEntry): { value: number } | { message: string } {
  const value = entry.salinity as number
  if (entry.salinityMode === 'practical') return { value }
  if (entry.salinityMode === 'sg') {
    const basis = SG_BASES[entry.sgBasis ?? '25/25C']
    if (!basis) return { message: 'Choose the reference temperatures of the hydrometer or refractometer.' }
    const [minSg, maxSg] = SPECIFIC_GRAVITY_RANGE
    if (!(value >= minSg && value <= maxSg)) return { message: `Specific gravity must be between ${minSg.toFixed(3)} and ${maxSg.toFixed(3)}.` }
    try {
      return { value: salinityFromSpecificGravity(value, basis.sampleC, basis.referenceC) }
    }
    catch {
      return { message: 'That specific gravity is outside what sea water can read on this basis.' }
    }
  }
  return salinityFromConductivityEntry(value, entry.conductivityTemperatureC ?? 25)
}

/**
 * Conductivity (mS/cm at the sample temperature) -> practical salinity. PSS-78 is defined for
 * salinity 2 to 42 and sample temperatures -2 to 35 C (Fofonoff & Millard 1983, UNESCO TP44):
 * outside them the value is refused with the range at that temperature, never extrapolated.
 */
function salinityFromConductivityEntry(value: number, sampleC: number): { value: number } | { message: string } {
  const [minC, maxC] = PSS78_TEMPERATURE_RANGE_C
  if (!(sampleC >= minC && sampleC <= maxC)) return { message: `Conductivity converts for sample temperatures from ${minC} to ${maxC} °C.` }
  const [low, high] = conductivityRangeMsCm(sampleC)
  if (!(value >= low && value <= high)) {
    // Rounded inward to 0.1 mS/cm, so every value the message allows is taken.
    const shownLow = Math.ceil(low * 10) / 10
    const shownHigh = Math.floor(high * 10) / 10
    const [minS, maxS] = PSS78_SALINITY_RANGE
    return { message: `Conductivity at ${Math.round(sampleC * 100) / 100} °C must be between ${shownLow} and ${shownHigh} mS/cm (practical salinity ${minS} to ${maxS}).` }
  }
  return { value: salinityFromConductivity(value, sampleC) }
}

function flagFor(field: MeasuredField, value: number): EntryFlag | null {
  const [low, high] = ALARM_RANGES[field]
  const label = FIELD_LABELS[field]
  if (value > high) {
    const severity = field === 'ammoniaN' || field === 'nitriteN' || field === 'pH' || field === 'temperatureC' ? 'danger' : 'caution'
    return { field: INPUT_FIELD[field], severity, message: `${label} is very high. Re-test to confirm, and tell your aquarist if it reads the same.` }
  }
  if (value < low) {
    const severity = field === 'pH' || field === 'temperatureC' || field === 'salinity' ? 'danger' : 'caution'
    return { field: INPUT_FIELD[field], severity, message: `${label} is very low. Re-test to confirm, and tell your aquarist if it reads the same.` }
  }
  return null
}

/** The alarm flags of stored canonical values (e.g. for the history table). */
export function flagsForValues(values: CanonicalValues): EntryFlag[] {
  const flags: EntryFlag[] = []
  for (const field of MEASURED_FIELDS) {
    const value = values[field]
    if (value === null) continue
    const flag = flagFor(field, value)
    if (flag) flags.push(flag)
  }
  return flags
}

/**
 * Converts one entry to canonical values, or lists a message per field for values that
 * cannot be real. Alarming but possible values come back as `flags`.
 */
export function toCanonicalReading(entry: ReadingEntry, now: Date = new Date()): EntryResult {
  const converted = convertEntry(entry, now)
  if (!converted.ok) return converted
  const { takenAt, values, notes } = converted
  return { ok: true, reading: { takenAt, values, notes, entered: enteredRecord(entry), flags: flagsForValues(values) } }
}

/** An entry's canonical time, values and notes, or a message per field (what toCanonicalReading decides, without its flags and entered record). */
export type ConvertedEntry = { ok: true, takenAt: string, values: CanonicalValues, notes: string | null } | { ok: false, issues: EntryIssue[] }

/**
 * toCanonicalReading's rules, for a caller that stores the values and keeps what was typed
 * its own way (the CSV import, 100,000 rows: it builds neither flags nor an entered record).
 *
 * `takenMs`, when the caller has read the time already (the import, once per row): the
 * instant entry.takenAt names, which must then be its stored text ("2026-03-14T08:30:00.000Z",
 * as toISOString writes it, so a real day); the text is not read again.
 */
export function convertEntry(entry: ReadingEntry, now: Date = new Date(), takenMs?: number): ConvertedEntry {
  const issues: EntryIssue[] = []
  const timeIssue = takenMs === undefined ? checkTakenAt(entry.takenAt, now) : checkInstant(takenMs, now)
  if (timeIssue) issues.push(timeIssue)

  const values: CanonicalValues = {
    ammoniaN: present(entry.ammonia) && entry.ammonia >= 0 ? nitrogenFromKit(entry.ammonia, entry.basis.ammonia) : null,
    nitriteN: present(entry.nitrite) && entry.nitrite >= 0 ? nitrogenFromKit(entry.nitrite, entry.basis.nitrite) : null,
    nitrateN: present(entry.nitrate) && entry.nitrate >= 0 ? nitrogenFromKit(entry.nitrate, entry.basis.nitrate) : null,
    pH: present(entry.pH) ? entry.pH : null,
    temperatureC: null,
    salinity: null,
    alkalinityDkh: present(entry.alkalinityDkh) ? entry.alkalinityDkh : null,
    calciumMgL: present(entry.calciumMgL) ? entry.calciumMgL : null,
    magnesiumMgL: present(entry.magnesiumMgL) ? entry.magnesiumMgL : null,
    phosphateMgL: present(entry.phosphateMgL) ? entry.phosphateMgL : null,
  }
  for (const field of NITROGEN_INPUT_FIELDS) {
    const typed = entry[field]
    if (present(typed) && typed < 0) issues.push({ field, message: `${FIELD_LABELS[`${field}N`]} cannot be below zero.` })
  }
  if (present(entry.temperature)) {
    if (entry.temperatureUnit === 'F' && entry.temperature < -459.67) issues.push({ field: 'temperature', message: 'Temperature is below absolute zero.' })
    else values.temperatureC = temperatureToC(entry.temperature, entry.temperatureUnit)
  }
  if (present(entry.salinity)) {
    const result = salinityFrom(entry)
    if ('message' in result) issues.push({ field: 'salinity', message: result.message })
    else values.salinity = result.value
  }

  for (const field of MEASURED_FIELDS) {
    const value = values[field]
    if (value === null) continue
    const inputField = INPUT_FIELD[field]
    if (issues.length && issues.some(i => i.field === inputField)) continue
    const [min, max] = PHYSICAL_BOUNDS[field]
    if (!Number.isFinite(value) || value < min || value > max) issues.push({ field: inputField, message: boundsMessage(field, entry) })
  }
  const notes = entry.notes?.trim() ? entry.notes.trim() : null
  if (notes && notes.length > ENTRY_NOTES_MAX) issues.push({ field: 'notes', message: `Notes are at most ${ENTRY_NOTES_MAX} characters.` })
  if (MEASURED_FIELDS.every(f => values[f] === null) && !notes && issues.length === 0) {
    issues.push({ field: 'ammonia', message: 'Enter at least one test result.' })
  }
  if (issues.length) return { ok: false, issues }
  // Every value is within its bounds here: flagsForValues (toCanonicalReading) flags each.
  return { ok: true, takenAt: takenMs !== undefined || STORED_TIME.test(entry.takenAt) ? entry.takenAt : toIsoInstant(entry.takenAt)!, values, notes }
}

/** The refusal for a value outside physical bounds, in the units the user typed. */
function boundsMessage(field: MeasuredField, entry: ReadingEntry): string {
  const [min, max] = PHYSICAL_BOUNDS[field]
  const label = FIELD_LABELS[field]
  const round = (x: number) => String(Math.round(x * 100) / 100)
  switch (field) {
    case 'ammoniaN': return `${label} must be between 0 and ${round(nitrogenToKit(max, entry.basis.ammonia))} mg/L as ${entry.basis.ammonia}.`
    case 'nitriteN': return `${label} must be between 0 and ${round(nitrogenToKit(max, entry.basis.nitrite))} mg/L as ${entry.basis.nitrite}.`
    case 'nitrateN': return `${label} must be between 0 and ${round(nitrogenToKit(max, entry.basis.nitrate))} mg/L as ${entry.basis.nitrate}.`
    case 'temperatureC': return `${label} must be between ${round(temperatureFromC(min, entry.temperatureUnit))} and ${round(temperatureFromC(max, entry.temperatureUnit))} °${entry.temperatureUnit}.`
    case 'salinity': return `${label} must be between ${min} and ${max} (practical salinity).`
    case 'pH': return 'pH must be between 0 and 14.'
    default: return `${label} must be between ${min} and ${max}.`
  }
}

/** What was typed, in the shape the demo seed and CSV import also use. */
export function enteredRecord(entry: ReadingEntry): Record<string, unknown> {
  const out: Record<string, unknown> = {}
  if (present(entry.ammonia)) out.ammonia = { value: entry.ammonia, basis: entry.basis.ammonia }
  if (present(entry.nitrite)) out.nitrite = { value: entry.nitrite, basis: entry.basis.nitrite }
  if (present(entry.nitrate)) out.nitrate = { value: entry.nitrate, basis: entry.basis.nitrate }
  if (present(entry.pH)) out.pH = entry.pH
  if (present(entry.temperature)) out.temperature = { value: entry.temperature, unit: entry.temperatureUnit }
  if (present(entry.salinity)) {
    out.salinity = entry.salinityMode === 'sg'
      ? { value: entry.salinity, as: 'sg', basis: entry.sgBasis ?? '25/25C' }
      : entry.salinityMode === 'conductivity'
        ? { value: entry.salinity, as: 'conductivity', temperatureC: entry.conductivityTemperatureC ?? 25 }
        : { value: entry.salinity, as: 'practical' }
  }
  for (const key of REEF_INPUT_FIELDS) {
    if (present(entry[key])) out[key] = entry[key]
  }
  return out
}

/** A number as JSON.stringify writes it. */
const jsonNumber = (value: number): string => (Number.isFinite(value) ? numberText(value) : 'null')

/** The words an entered record holds, as JSON strings: written once, not once per row. */
const QUOTED = new Map([...AMMONIA_BASES, ...NITRITE_BASES, ...NITRATE_BASES, ...TEMPERATURE_UNITS, ...SG_BASIS_KEYS, 'csv'].map(word => [word, JSON.stringify(word)]))
const jsonString = (text: string): string => QUOTED.get(text) ?? JSON.stringify(text)

/**
 * JSON.stringify({ ...enteredRecord(entry), source }), byte for byte, written as text: a CSV
 * import stores one for each of up to 100,000 rows, and building the record's objects only to
 * serialise them cost more than writing the text.
 */
export function enteredJson(entry: ReadingEntry, source: string): string {
  let out = '{'
  let comma = ''
  if (present(entry.ammonia)) {
    out += `"ammonia":{"value":${jsonNumber(entry.ammonia)},"basis":${jsonString(entry.basis.ammonia)}}`
    comma = ','
  }
  if (present(entry.nitrite)) {
    out += `${comma}"nitrite":{"value":${jsonNumber(entry.nitrite)},"basis":${jsonString(entry.basis.nitrite)}}`
    comma = ','
  }
  if (present(entry.nitrate)) {
    out += `${comma}"nitrate":{"value":${jsonNumber(entry.nitrate)},"basis":${jsonString(entry.basis.nitrate)}}`
    comma = ','
  }
  if (present(entry.pH)) {
    out += `${comma}"pH":${jsonNumber(entry.pH)}`
    comma = ','
  }
  if (present(entry.temperature)) {
    out += `${comma}"temperature":{"value":${jsonNumber(entry.temperature)},"unit":${jsonString(entry.temperatureUnit)}}`
    comma = ','
  }
  if (present(entry.salinity)) {
    const value = jsonNumber(entry.salinity)
    out += entry.salinityMode === 'sg'
      ? `${comma}"salinity":{"value":${value},"as":"sg","basis":${jsonString(entry.sgBasis ?? '25/25C')}}`
      : entry.salinityMode === 'conductivity'
        ? `${comma}"salinity":{"value":${value},"as":"conductivity","temperatureC":${jsonNumber(entry.conductivityTemperatureC ?? 25)}}`
        : `${comma}"salinity":{"value":${value},"as":"practical"}`
    comma = ','
  }
  if (present(entry.alkalinityDkh)) {
    out += `${comma}"alkalinityDkh":${jsonNumber(entry.alkalinityDkh)}`
    comma = ','
  }
  if (present(entry.calciumMgL)) {
    out += `${comma}"calciumMgL":${jsonNumber(entry.calciumMgL)}`
    comma = ','
  }
  if (present(entry.magnesiumMgL)) {
    out += `${comma}"magnesiumMgL":${jsonNumber(entry.magnesiumMgL)}`
    comma = ','
  }
  if (present(entry.phosphateMgL)) out += `${comma}"phosphateMgL":${jsonNumber(entry.phosphateMgL)}`
  // The source comes last, after a comma when a value came before it.
  return `${out}${out.length > 1 ? ',' : ''}"source":${jsonString(source)}}`
}

interface StoredReading extends CanonicalValues {
  takenAt: string
  notes: string | null
  entered: Record<string, unknown>
}

const obj = (x: unknown): Record<string, unknown> | undefined => (x && typeof x === 'object' ? x as Record<string, unknown> : undefined)
const num = (x: unknown): number | undefined => (typeof x === 'number' && Number.isFinite(x) ? x : undefined)

/**
 * Rebuilds the entry a stored reading came from, so an edit starts from what was typed
 * (falling back to the canonical value in the tank's basis when nothing was kept).
 */
export function entryFromStored(row: StoredReading, kit: KitBasisChoice, temperatureUnit: TemperatureUnit): ReadingEntry {
  const e = row.entered ?? {}
  const nitrogen = <B extends AmmoniaBasis | NitriteBasis | NitrateBasis>(key: NitrogenInputField, canonical: number | null, fallback: B): [number | null, B] => {
    const typed = obj(e[key])
    const value = num(typed?.value)
    if (value !== undefined && typeof typed?.basis === 'string') return [value, typed.basis as B]
    return [canonical === null ? null : nitrogenToKit(canonical, fallback), fallback]
  }
  const [ammonia, ammoniaBasis] = nitrogen('ammonia', row.ammoniaN, kit.ammonia)
  const [nitrite, nitriteBasis] = nitrogen('nitrite', row.nitriteN, kit.nitrite)
  const [nitrate, nitrateBasis] = nitrogen('nitrate', row.nitrateN, kit.nitrate)
  const temp = obj(e.temperature)
  const typedTemp = num(temp?.value)
  const tempUnit = temp?.unit === 'F' || temp?.unit === 'C' ? temp.unit : temperatureUnit
  const sal = obj(e.salinity)
  const typedSal = num(sal?.value)
  const salMode: SalinityMode = sal?.as === 'sg' || sal?.as === 'conductivity' ? sal.as : 'practical'
  return {
    takenAt: row.takenAt,
    ammonia,
    nitrite,
    nitrate,
    basis: { ammonia: ammoniaBasis, nitrite: nitriteBasis, nitrate: nitrateBasis },
    pH: row.pH,
    temperature: typedTemp !== undefined ? typedTemp : (row.temperatureC === null ? null : temperatureFromC(row.temperatureC, tempUnit)),
    temperatureUnit: tempUnit,
    salinity: typedSal !== undefined ? typedSal : row.salinity,
    salinityMode: typedSal !== undefined ? salMode : 'practical',
    sgBasis: typeof sal?.basis === 'string' && sal.basis in SG_BASES ? sal.basis as SgBasisKey : undefined,
    conductivityTemperatureC: num(sal?.temperatureC) ?? null,
    alkalinityDkh: row.alkalinityDkh,
    calciumMgL: row.calciumMgL,
    magnesiumMgL: row.magnesiumMgL,
    phosphateMgL: row.phosphateMgL,
    notes: row.notes,
  }
}

/**
 * Checks canonical values (mg/L as N, degrees C, practical salinity), as a correction
 * carries them, with the very rules of the form: the same bounds, the same note length,
 * at least one result or a note. Issues name the canonical fields ("ammoniaN").
 */
export function checkCanonicalReading(takenAt: string, values: CanonicalValues, notes: string | null, now: Date = new Date()): EntryIssue[] {
  const entry: ReadingEntry = {
    takenAt,
    ammonia: values.ammoniaN,
    nitrite: values.nitriteN,
    nitrate: values.nitrateN,
    basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' },
    pH: values.pH,
    temperature: values.temperatureC,
    temperatureUnit: 'C',
    salinity: values.salinity,
    salinityMode: 'practical',
    alkalinityDkh: values.alkalinityDkh,
    calciumMgL: values.calciumMgL,
    magnesiumMgL: values.magnesiumMgL,
    phosphateMgL: values.phosphateMgL,
    notes,
  }
  const result = toCanonicalReading(entry, now)
  if (result.ok) return []
  const canonical = new Map<string, string>(MEASURED_FIELDS.map(field => [INPUT_FIELD[field], field]))
  return result.issues.map(issue => ({ ...issue, field: canonical.get(issue.field) ?? issue.field }))
}
