import { celsiusToFahrenheit, CM_PER_INCH, fahrenheitToCelsius, KG_PER_POUND, LITRES_PER_US_GALLON, MM_PER_INCH } from '#shared/units'
import type { UnitSystem } from '#shared/vocabulary'

/** Labels and conversions for form inputs in the user's units; the API speaks mm, L and kg. */
export const lengthUnit = (u: UnitSystem) => (u === 'us' ? 'in' : 'cm')
export const volumeUnit = (u: UnitSystem) => (u === 'us' ? 'gal' : 'L')
export const massUnit = (u: UnitSystem) => (u === 'us' ? 'lb' : 'kg')
export const temperatureUnit = (u: UnitSystem) => (u === 'us' ? '°F' : '°C')
/** Glass and acrylic panels are sold by the inch in the US and by the millimetre elsewhere. */
export const thicknessUnit = (u: UnitSystem) => (u === 'us' ? 'in' : 'mm')

/** A typed length (in or cm) to millimetres. */
export const toMm = (value: number, u: UnitSystem) => (u === 'us' ? value * MM_PER_INCH : value * 10)
/** Millimetres to the user's length unit, rounded for a form field. */
export const fromMm = (mm: number, u: UnitSystem) => Math.round((u === 'us' ? mm / MM_PER_INCH : mm / 10) * 100) / 100
/** A typed volume (gal or L) to litres. */
export const toLitres = (value: number, u: UnitSystem) => (u === 'us' ? value * LITRES_PER_US_GALLON : value)
export const fromLitres = (l: number, u: UnitSystem) => Math.round((u === 'us' ? l / LITRES_PER_US_GALLON : l) * 10) / 10
/** A typed mass (lb or kg) to kilograms. */
export const toKg = (value: number, u: UnitSystem) => (u === 'us' ? value * KG_PER_POUND : value)
export const fromKg = (kg: number, u: UnitSystem) => Math.round((u === 'us' ? kg / KG_PER_POUND : kg) * 10) / 10

/** A typed temperature (°F or °C) to °C. */
export const toCelsius = (value: number, u: UnitSystem) => (u === 'us' ? fahrenheitToCelsius(value) : value)
/** °C to the user's temperature unit, one decimal for a form field. */
export const fromCelsius = (c: number, u: UnitSystem) => Math.round((u === 'us' ? celsiusToFahrenheit(c) : c) * 10) / 10
/** A typed panel thickness (in or mm) to millimetres. */
export const thicknessToMm = (value: number, u: UnitSystem) => (u === 'us' ? value * MM_PER_INCH : value)
/** A panel thickness in mm in the user's unit: inches to three decimals (3/8 in is 0.375), whole-ish mm. */
export const thicknessFromMm = (mm: number, u: UnitSystem) => (u === 'us' ? Math.round(mm / MM_PER_INCH * 1000) / 1000 : Math.round(mm * 10) / 10)

/** A mass for reading: "12.3 kg" or "27.1 lb". */
export function formatMass(kg: number, u: UnitSystem): string {
  return `${fromKg(kg, u).toLocaleString('en-US', { maximumFractionDigits: 1 })} ${massUnit(u)}`
}
/** A length for reading, one decimal. */
export function formatLength(mm: number, u: UnitSystem): string {
  const value = u === 'us' ? mm / MM_PER_INCH : mm / 10
  return `${value.toLocaleString('en-US', { maximumFractionDigits: 1 })} ${lengthUnit(u)}`
}
/** Litres for reading with one decimal. */
export function formatLitres(l: number, u: UnitSystem): string {
  return `${fromLitres(l, u).toLocaleString('en-US', { maximumFractionDigits: 1 })} ${volumeUnit(u)}`
}
export { CM_PER_INCH }
