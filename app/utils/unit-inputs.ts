import { CM_PER_INCH, KG_PER_POUND, LITRES_PER_US_GALLON, MM_PER_INCH } from '#shared/units'
import type { UnitSystem } from '#shared/vocabulary'

/** Labels and conversions for form inputs in the user's units; the API speaks mm, L and kg. */
export const lengthUnit = (u: UnitSystem) => (u === 'us' ? 'in' : 'cm')
export const volumeUnit = (u: UnitSystem) => (u === 'us' ? 'gal' : 'L')
export const massUnit = (u: UnitSystem) => (u === 'us' ? 'lb' : 'kg')

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

/** A mass for reading: "12.3 kg" or "27.1 lb". */
export function formatMass(kg: number, u: UnitSystem): string {
  return `${fromKg(kg, u).toLocaleString(undefined, { maximumFractionDigits: 1 })} ${massUnit(u)}`
}
/** A length for reading, one decimal. */
export function formatLength(mm: number, u: UnitSystem): string {
  const value = u === 'us' ? mm / MM_PER_INCH : mm / 10
  return `${value.toLocaleString(undefined, { maximumFractionDigits: 1 })} ${lengthUnit(u)}`
}
/** Litres for reading with one decimal. */
export function formatLitres(l: number, u: UnitSystem): string {
  return `${fromLitres(l, u).toLocaleString(undefined, { maximumFractionDigits: 1 })} ${volumeUnit(u)}`
}
export { CM_PER_INCH }
