/**
 * The engine's thresholds as the company settings form shows them: each in the reader's
 * units (temperatures in °F for US units; every other limit has one unit in both systems),
 * with its default, range and source from THRESHOLD_SPECS. Typed text goes back to the
 * canonical value the engine uses; a value equal to the default is stored as no override,
 * so the company follows Tidewright's default if it changes.
 */
import { THRESHOLD_SPECS, type ThresholdGroup, type ThresholdSpec } from '../cycle/thresholds'
import type { ThresholdKey, ThresholdOverrides } from '../schemas/settings'
import { celsiusToFahrenheit, fahrenheitToCelsius } from '../units'
import type { UnitSystem } from '../vocabulary'

/** One threshold's row in the form, every number in the reader's units. */
export interface ThresholdField {
  key: ThresholdKey
  spec: ThresholdSpec
  unit: string
  default: number
  min: number
  max: number
}

const isTemperature = (spec: ThresholdSpec) => spec.unit === '°C'

/** Decimal places a value in this unit is shown with: enough for the finest default, at most 4. */
function decimals(spec: ThresholdSpec): number {
  if (isTemperature(spec)) return 1
  const places = [spec.default, spec.min, spec.max].map(n => (String(n).split('.')[1] ?? '').length)
  return Math.min(4, Math.max(...places))
}

const round = (value: number, places: number) => Number(value.toFixed(places))

/** A canonical value in the reader's units, rounded for display. */
export function thresholdToDisplay(key: ThresholdKey, canonical: number, units: UnitSystem): number {
  const spec = THRESHOLD_SPECS[key]
  const value = isTemperature(spec) && units === 'us' ? celsiusToFahrenheit(canonical) : canonical
  return round(value, decimals(spec))
}

/** A value in the reader's units back to the engine's canonical unit (temperatures to 0.01 °C). */
export function thresholdFromDisplay(key: ThresholdKey, shown: number, units: UnitSystem): number {
  const spec = THRESHOLD_SPECS[key]
  if (!isTemperature(spec)) return shown
  return units === 'us' ? round(fahrenheitToCelsius(shown), 2) : shown
}

/** The unit label in the reader's units. */
export function thresholdUnit(key: ThresholdKey, units: UnitSystem): string {
  const spec = THRESHOLD_SPECS[key]
  return isTemperature(spec) && units === 'us' ? '°F' : spec.unit
}

/** Every threshold, in THRESHOLD_SPECS order, as the form shows it. */
export function thresholdFields(units: UnitSystem): ThresholdField[] {
  return (Object.keys(THRESHOLD_SPECS) as ThresholdKey[]).map((key) => {
    const spec = THRESHOLD_SPECS[key]
    return {
      key,
      spec,
      unit: thresholdUnit(key, units),
      default: thresholdToDisplay(key, spec.default, units),
      // The range is widened by rounding, never narrowed: the server's canonical check decides.
      min: thresholdToDisplay(key, spec.min, units),
      max: thresholdToDisplay(key, spec.max, units),
    }
  })
}

/** The fields under each heading, headings in the order they first appear. */
export function thresholdGroups(units: UnitSystem): { group: ThresholdGroup, fields: ThresholdField[] }[] {
  const groups = new Map<ThresholdGroup, ThresholdField[]>()
  for (const field of thresholdFields(units)) {
    const list = groups.get(field.spec.group) ?? []
    list.push(field)
    groups.set(field.spec.group, list)
  }
  return [...groups].map(([group, fields]) => ({ group, fields }))
}

/** The text each field starts with: the company's value, or the default, in the reader's units. */
export function thresholdTexts(overrides: ThresholdOverrides, units: UnitSystem): Record<ThresholdKey, string> {
  const out = {} as Record<ThresholdKey, string>
  for (const key of Object.keys(THRESHOLD_SPECS) as ThresholdKey[]) {
    out[key] = String(thresholdToDisplay(key, overrides[key] ?? THRESHOLD_SPECS[key].default, units))
  }
  return out
}

/** A plain decimal, point or comma: no exponents, hex or spaces inside. */
const DECIMAL = /^-?\d+(?:[.,]\d+)?$/

export interface ThresholdEdit {
  overrides: ThresholdOverrides
  /** Messages by threshold key, in the reader's units. */
  errors: Partial<Record<ThresholdKey, string>>
}

/**
 * The overrides to save from the form's texts. A text the reader did not touch keeps the
 * stored value exactly (no drift through °F and back); a value equal to the default (or
 * an emptied field) means "use the default"; anything else must be a number in range.
 */
export function thresholdOverridesFromTexts(
  texts: Partial<Record<ThresholdKey, string>>,
  loaded: ThresholdOverrides,
  units: UnitSystem,
): ThresholdEdit {
  const start = thresholdTexts(loaded, units)
  const overrides: ThresholdOverrides = {}
  const errors: ThresholdEdit['errors'] = {}
  for (const field of thresholdFields(units)) {
    const { key } = field
    const text = (texts[key] ?? start[key]).trim()
    if (text === start[key]) {
      if (loaded[key] !== undefined) overrides[key] = loaded[key]
      continue
    }
    if (text === '') continue
    const shown = Number(text.replace(',', '.'))
    if (!DECIMAL.test(text) || !Number.isFinite(shown)) {
      errors[key] = 'Give a number.'
      continue
    }
    if (shown < field.min || shown > field.max) {
      errors[key] = `Give a value from ${field.min} to ${field.max} ${field.unit}.`
      continue
    }
    if (shown === field.default) continue
    overrides[key] = thresholdFromDisplay(key, shown, units)
  }
  return { overrides, errors }
}

/** Whether two sets of overrides differ in any key (saving them re-evaluates the company's tanks). */
export function overridesDiffer(a: ThresholdOverrides, b: ThresholdOverrides): boolean {
  const keys = new Set([...Object.keys(a), ...Object.keys(b)]) as Set<ThresholdKey>
  return [...keys].some(key => a[key] !== b[key])
}
