import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  LITRES_PER_US_GALLON,
  assertFinite,
  celsiusToFahrenheit,
  cmToInches,
  convertLength,
  convertMass,
  convertTemperature,
  convertVolume,
  fahrenheitToCelsius,
  inchesToCm,
  kgToPounds,
  knPerM2ToPsf,
  litresToUsGallons,
  mgPerLToPpm,
  poundsToKg,
  ppmToMgPerL,
  psfToKnPerM2,
  usGallonsToLitres,
  type LengthUnit,
  type MassUnit,
  type TemperatureUnit,
  type VolumeUnit,
} from '../../../shared/units'

const FC = { seed: 1959, numRuns: 300 }

describe('exact defining factors (international yard and pound, 1959)', () => {
  // Exact definitions: tolerance is float round-off only (1e-12 relative).
  it('inch = 2.54 cm exactly', () => {
    expect(inchesToCm(1)).toBe(2.54)
    expect(convertLength(1, 'ft', 'mm')).toBeCloseTo(304.8, 12)
  })

  it('pound = 0.45359237 kg exactly', () => {
    expect(poundsToKg(1)).toBe(0.45359237)
    expect(convertMass(16, 'oz', 'lb')).toBeCloseTo(1, 14)
  })

  it('US gallon = 231 in^3 = 3.785411784 L exactly', () => {
    expect(usGallonsToLitres(1)).toBe(3.785411784)
    expect(convertVolume(231, 'in3', 'L')).toBeCloseTo(LITRES_PER_US_GALLON, 12)
  })

  it('UK gallon = 4.54609 L exactly, and is not a US gallon', () => {
    expect(convertVolume(1, 'ukgal', 'L')).toBe(4.54609)
    expect(convertVolume(1, 'ukgal', 'usgal')).toBeCloseTo(1.20095, 5) // computed from the two definitions
  })

  it('temperature fixed points: 32 F = 0 C, 212 F = 100 C, -40 F = -40 C, 0 C = 273.15 K', () => {
    expect(fahrenheitToCelsius(32)).toBeCloseTo(0, 12)
    expect(fahrenheitToCelsius(212)).toBeCloseTo(100, 12)
    expect(fahrenheitToCelsius(-40)).toBeCloseTo(-40, 12)
    expect(convertTemperature(0, 'C', 'K')).toBe(273.15)
    expect(celsiusToFahrenheit(25)).toBeCloseTo(77, 12)
  })

  it('1 psf = 0.0479 kN/m2 (reference.md §7)', () => {
    // tolerance 0.00005: the reference prints four decimals
    expect(Math.abs(psfToKnPerM2(1) - 0.0479)).toBeLessThan(0.00005)
  })

  it('ppm equals mg/L only at density 1; sea water differs by its density', () => {
    expect(ppmToMgPerL(1)).toBe(1)
    expect(ppmToMgPerL(1, 1.0233)).toBeCloseTo(1.0233, 12)
    expect(mgPerLToPpm(1.0233, 1.0233)).toBeCloseTo(1, 12)
  })
})

describe('properties', () => {
  const value = fc.double({ min: -1e6, max: 1e6, noNaN: true })
  const close = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b))

  it('length, volume and mass round trips', () => {
    const lengths: LengthUnit[] = ['mm', 'cm', 'm', 'in', 'ft']
    const volumes: VolumeUnit[] = ['L', 'mL', 'm3', 'cm3', 'usgal', 'ukgal', 'in3', 'ft3']
    const masses: MassUnit[] = ['g', 'kg', 'lb', 'oz']
    fc.assert(fc.property(value, fc.constantFrom(...lengths), fc.constantFrom(...lengths), (v, a, b) => close(convertLength(convertLength(v, a, b), b, a), v)), FC)
    fc.assert(fc.property(value, fc.constantFrom(...volumes), fc.constantFrom(...volumes), (v, a, b) => close(convertVolume(convertVolume(v, a, b), b, a), v)), FC)
    fc.assert(fc.property(value, fc.constantFrom(...masses), fc.constantFrom(...masses), (v, a, b) => close(convertMass(convertMass(v, a, b), b, a), v)), FC)
  })

  it('named helpers invert each other', () => {
    fc.assert(fc.property(fc.double({ min: 0, max: 1e5, noNaN: true }), v =>
      close(litresToUsGallons(usGallonsToLitres(v)), v) && close(kgToPounds(poundsToKg(v)), v)
      && close(cmToInches(inchesToCm(v)), v) && close(knPerM2ToPsf(psfToKnPerM2(v)), v)), FC)
  })

  it('temperature round trips above absolute zero', () => {
    const units: TemperatureUnit[] = ['C', 'F', 'K']
    fc.assert(fc.property(fc.double({ min: 0, max: 1000, noNaN: true }), fc.constantFrom(...units), fc.constantFrom(...units), (k, a, b) => {
      const v = convertTemperature(k, 'K', a)
      return close(convertTemperature(convertTemperature(v, a, b), b, a), v)
    }), FC)
  })

  it('rejects non-finite values and temperatures below absolute zero', () => {
    expect(() => convertLength(Number.NaN, 'cm', 'in')).toThrow(RangeError)
    expect(() => convertVolume(Number.POSITIVE_INFINITY, 'L', 'usgal')).toThrow(/value/)
    expect(() => convertTemperature(-500, 'F', 'C')).toThrow(/absolute zero/)
    expect(() => convertTemperature(-1, 'K', 'C')).toThrow(/absolute zero/)
    expect(() => ppmToMgPerL(-1)).toThrow(/ppm/)
    expect(() => assertFinite('x', 5, { min: 0, max: 4 })).toThrow('x must be a finite number >= 0 and <= 4 (got 5)')
  })
})
