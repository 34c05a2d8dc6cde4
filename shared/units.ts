/**
 * Unit conversions with the exact defining factors, and the range guard every
 * shared computation uses so that bad input fails loudly instead of as NaN.
 *
 * Defining factors: inch = 25.4 mm, pound = 0.45359237 kg (international yard and
 * pound agreement, 1959); US gallon = 231 in^3 = 3.785411784 L; UK (imperial)
 * gallon = 4.54609 L (Weights and Measures Act 1985); 0 C = 273.15 K; F = C x 9/5 + 32.
 */

/** Throws a RangeError unless `value` is finite and within the optional bounds (inclusive). */
export function assertFinite(name: string, value: number, bounds: { min?: number, max?: number } = {}): void {
  const { min, max } = bounds
  const inside = Number.isFinite(value) && (min === undefined || value >= min) && (max === undefined || value <= max)
  if (inside) return
  const limits = [min !== undefined ? `>= ${min}` : '', max !== undefined ? `<= ${max}` : ''].filter(Boolean).join(' and ')
  throw new RangeError(`${name} must be a finite number${limits ? ` ${limits}` : ''} (got ${value})`)
}

/** Throws a RangeError unless `min <= value <= max`; the message names the parameter and range. */
export function assertInRange(name: string, value: number, min: number, max: number): void {
  assertFinite(name, value, { min, max })
}

/** Throws a RangeError unless `value` is finite and strictly above zero. */
export function assertPositive(name: string, value: number): void {
  if (!Number.isFinite(value) || value <= 0) {
    throw new RangeError(`${name} must be a finite number > 0 (got ${value})`)
  }
}

export const MM_PER_INCH = 25.4
export const CM_PER_INCH = 2.54
export const INCHES_PER_FOOT = 12
export const KG_PER_POUND = 0.45359237
export const CUBIC_INCHES_PER_US_GALLON = 231
/** 231 in^3 x (2.54 cm)^3 / 1000, exact. */
export const LITRES_PER_US_GALLON = 3.785411784
export const LITRES_PER_UK_GALLON = 4.54609
export const KELVIN_OFFSET = 273.15
/** Standard gravity, m/s^2 (CGPM 1901), used to turn a mass into a weight-force. */
export const STANDARD_GRAVITY = 9.80665

export type LengthUnit = 'mm' | 'cm' | 'm' | 'in' | 'ft'
export type VolumeUnit = 'L' | 'mL' | 'm3' | 'cm3' | 'usgal' | 'ukgal' | 'in3' | 'ft3'
export type MassUnit = 'g' | 'kg' | 'lb' | 'oz'
export type TemperatureUnit = 'C' | 'F' | 'K'

const METRES_PER: Record<LengthUnit, number> = {
  mm: 0.001,
  cm: 0.01,
  m: 1,
  in: MM_PER_INCH / 1000,
  ft: (MM_PER_INCH * INCHES_PER_FOOT) / 1000,
}

const LITRES_PER: Record<VolumeUnit, number> = {
  L: 1,
  mL: 0.001,
  m3: 1000,
  cm3: 0.001,
  usgal: LITRES_PER_US_GALLON,
  ukgal: LITRES_PER_UK_GALLON,
  in3: (MM_PER_INCH / 100) ** 3,
  ft3: (MM_PER_INCH * INCHES_PER_FOOT / 100) ** 3,
}

const KG_PER: Record<MassUnit, number> = {
  g: 0.001,
  kg: 1,
  lb: KG_PER_POUND,
  oz: KG_PER_POUND / 16,
}

/** Converts a length between units. */
export function convertLength(value: number, from: LengthUnit, to: LengthUnit): number {
  assertFinite('value', value)
  return (value * METRES_PER[from]) / METRES_PER[to]
}

/** Converts a volume between units (US and UK gallons are distinct). */
export function convertVolume(value: number, from: VolumeUnit, to: VolumeUnit): number {
  assertFinite('value', value)
  return (value * LITRES_PER[from]) / LITRES_PER[to]
}

/** Converts a mass between units (avoirdupois pound and ounce). */
export function convertMass(value: number, from: MassUnit, to: MassUnit): number {
  assertFinite('value', value)
  return (value * KG_PER[from]) / KG_PER[to]
}

function toKelvin(value: number, from: TemperatureUnit): number {
  if (from === 'K') return value
  if (from === 'C') return value + KELVIN_OFFSET
  return ((value - 32) * 5) / 9 + KELVIN_OFFSET
}

function fromKelvin(kelvin: number, to: TemperatureUnit): number {
  if (to === 'K') return kelvin
  if (to === 'C') return kelvin - KELVIN_OFFSET
  return ((kelvin - KELVIN_OFFSET) * 9) / 5 + 32
}

/** Converts a temperature between C, F and K; below absolute zero throws. */
export function convertTemperature(value: number, from: TemperatureUnit, to: TemperatureUnit): number {
  assertFinite('value', value)
  const kelvin = toKelvin(value, from)
  if (kelvin < 0) throw new RangeError(`temperature must be at or above absolute zero (got ${value} ${from})`)
  return fromKelvin(kelvin, to)
}

/** Degrees Fahrenheit to Celsius. */
export function fahrenheitToCelsius(f: number): number {
  return convertTemperature(f, 'F', 'C')
}

/** Degrees Celsius to Fahrenheit. */
export function celsiusToFahrenheit(c: number): number {
  return convertTemperature(c, 'C', 'F')
}

/** US gallons to litres. */
export function usGallonsToLitres(gallons: number): number {
  return convertVolume(gallons, 'usgal', 'L')
}

/** Litres to US gallons. */
export function litresToUsGallons(litres: number): number {
  return convertVolume(litres, 'L', 'usgal')
}

/** Pounds to kilograms. */
export function poundsToKg(pounds: number): number {
  return convertMass(pounds, 'lb', 'kg')
}

/** Kilograms to pounds. */
export function kgToPounds(kg: number): number {
  return convertMass(kg, 'kg', 'lb')
}

/** Inches to centimetres. */
export function inchesToCm(inches: number): number {
  return convertLength(inches, 'in', 'cm')
}

/** Centimetres to inches. */
export function cmToInches(cm: number): number {
  return convertLength(cm, 'cm', 'in')
}

/**
 * ppm to mg/L. Equal only for dilute fresh water (density ~1 kg/L); sea water is
 * ~2.5 % denser, so pass its density when the difference matters.
 */
export function ppmToMgPerL(ppm: number, densityKgPerL = 1): number {
  assertFinite('ppm', ppm, { min: 0 })
  assertInRange('densityKgPerL', densityKgPerL, 0.9, 1.1)
  return ppm * densityKgPerL
}

/** mg/L to ppm (mass per mass), the inverse of `ppmToMgPerL`. */
export function mgPerLToPpm(mgPerL: number, densityKgPerL = 1): number {
  assertFinite('mgPerL', mgPerL, { min: 0 })
  assertInRange('densityKgPerL', densityKgPerL, 0.9, 1.1)
  return mgPerL / densityKgPerL
}

/** Pounds per square foot to kilonewtons per square metre (psf is a pound-force unit). */
export function psfToKnPerM2(psf: number): number {
  assertFinite('psf', psf)
  const footM = (MM_PER_INCH * INCHES_PER_FOOT) / 1000
  return (psf * KG_PER_POUND * STANDARD_GRAVITY) / (footM * footM) / 1000
}

/** Kilonewtons per square metre to pounds per square foot. */
export function knPerM2ToPsf(knPerM2: number): number {
  assertFinite('knPerM2', knPerM2)
  return knPerM2 / psfToKnPerM2(1)
}
