/**
 * Sea-water salinity, conductivity, density and specific gravity.
 *
 * Algorithms: PSS-78 and the one-atmosphere EOS-80 as printed in Fofonoff & Millard
 * (1983), UNESCO Technical Papers in Marine Science 44 (density: Millero & Poisson
 * 1981, Deep-Sea Res. 28A: 625-629). Both are defined on the IPTS-68 temperature
 * scale; Tidewright takes ITS-90 degrees Celsius, as thermometers read today, and
 * converts inside (t68 = 1.00024 t90).
 */

import { assertFinite, assertInRange } from '../units'

/** PSS-78 validity (Fofonoff & Millard 1983). */
export const PSS78_SALINITY_RANGE = [2, 42] as const
export const PSS78_TEMPERATURE_RANGE_C = [-2, 35] as const
export const PSS78_PRESSURE_RANGE_DBAR = [0, 10000] as const
/** EOS-80 one-atmosphere validity (Millero & Poisson 1981). */
export const EOS80_SALINITY_RANGE = [0, 42] as const
export const EOS80_TEMPERATURE_RANGE_C = [-2, 40] as const
/** Specific-gravity readings accepted by `salinityFromSpecificGravity`. */
export const SPECIFIC_GRAVITY_RANGE = [1.0, 1.04] as const
/** Conductivity of S 35 sea water at 15 C (IPTS-68), p 0, mS/cm: the PSS-78 ratio's denominator. */
export const CONDUCTIVITY_S35_T15_MS_CM = 42.914

/** IPTS-68 temperature from ITS-90 (Saunders 1990 linear fit, used by TP44 users since). */
export function t68FromT90(t90: number): number {
  return 1.00024 * t90
}

/** ITS-90 temperature from IPTS-68, for feeding published IPTS-68 check values. */
export function t90FromT68(t68: number): number {
  return t68 / 1.00024
}

const A = [0.008, -0.1692, 25.3851, 14.0941, -7.0261, 2.7081] as const
const B = [0.0005, -0.0056, -0.0066, -0.0375, 0.0636, -0.0144] as const
const K = 0.0162
const C = [0.6766097, 2.00564e-2, 1.104259e-4, -6.9698e-7, 1.0031e-9] as const
const D = [3.426e-2, 4.464e-4, 4.215e-1, -3.107e-3] as const
const E = [2.07e-5, -6.37e-10, 3.989e-15] as const

/** Sum of coefficients[i] * x^(i/2), the half-power series PSS-78 uses in sqrt(Rt). */
function halfPowerSeries(coefficients: readonly number[], rt: number): number {
  const root = Math.sqrt(rt)
  let sum = 0
  let power = 1
  for (const c of coefficients) {
    sum += c * power
    power *= root
  }
  return sum
}

function polynomial(coefficients: readonly number[], x: number): number {
  let sum = 0
  for (let i = coefficients.length - 1; i >= 0; i--) sum = sum * x + (coefficients[i] ?? 0)
  return sum
}

/** Unchecked PSS-78, t on IPTS-68; callers validate. */
function pss78(ratio: number, t68: number, pressureDbar: number): number {
  const p = pressureDbar
  const rt = polynomial(C, t68)
  const rp = 1 + (p * (E[0] + E[1] * p + E[2] * p * p))
    / (1 + D[0] * t68 + D[1] * t68 * t68 + (D[2] + D[3] * t68) * ratio)
  const ratioT = ratio / (rp * rt)
  const dt = t68 - 15
  return halfPowerSeries(A, ratioT) + (dt / (1 + K * dt)) * halfPowerSeries(B, ratioT)
}

function checkPss78Conditions(temperatureC: number, pressureDbar: number): void {
  assertInRange('temperatureC', temperatureC, PSS78_TEMPERATURE_RANGE_C[0], PSS78_TEMPERATURE_RANGE_C[1])
  assertInRange('pressureDbar', pressureDbar, PSS78_PRESSURE_RANGE_DBAR[0], PSS78_PRESSURE_RANGE_DBAR[1])
}

/**
 * Practical salinity from the conductivity ratio R = C(S, t, p) / C(35, 15, 0) (PSS-78).
 * Throws when the result falls outside the scale's 2-42 range rather than extrapolating.
 */
export function salinityFromConductivityRatio(R: number, temperatureC: number, pressureDbar = 0): number {
  assertFinite('R', R, { min: 0 })
  checkPss78Conditions(temperatureC, pressureDbar)
  const salinity = pss78(R, t68FromT90(temperatureC), pressureDbar)
  // A hair of slack so a ratio computed from S 2 or S 42 by the inverse is not rejected for float noise.
  const slack = 1e-9
  if (!(salinity >= PSS78_SALINITY_RANGE[0] - slack && salinity <= PSS78_SALINITY_RANGE[1] + slack)) {
    throw new RangeError(`R ${R} at ${temperatureC} C gives salinity ${salinity.toFixed(3)}, outside the PSS-78 range 2 to 42`)
  }
  return salinity
}

/** Conductivity ratio for a practical salinity (inverse of PSS-78, solved by bisection). */
export function conductivityRatioFromSalinity(salinity: number, temperatureC: number, pressureDbar = 0): number {
  assertInRange('salinity', salinity, PSS78_SALINITY_RANGE[0], PSS78_SALINITY_RANGE[1])
  checkPss78Conditions(temperatureC, pressureDbar)
  const t68 = t68FromT90(temperatureC)
  // S rises monotonically with R over the valid domain, and R for S 2-42 lies well inside (0, 3).
  return bisect(r => pss78(r, t68, pressureDbar) - salinity, 0, 3)
}

/** Practical salinity from conductivity in mS/cm at the sample temperature (one atmosphere). */
export function salinityFromConductivity(mScm: number, temperatureC: number): number {
  assertFinite('mScm', mScm, { min: 0 })
  return salinityFromConductivityRatio(mScm / CONDUCTIVITY_S35_T15_MS_CM, temperatureC, 0)
}

/** Conductivity in mS/cm of sea water of the given practical salinity and temperature (one atmosphere). */
export function conductivityFromSalinity(salinity: number, temperatureC: number): number {
  return conductivityRatioFromSalinity(salinity, temperatureC, 0) * CONDUCTIVITY_S35_T15_MS_CM
}

let lastRange: { temperatureC: number, range: readonly [number, number] } | null = null

/**
 * The conductivities, mS/cm at one atmosphere, that `salinityFromConductivity` converts at this
 * sample temperature: those of sea water at the ends of PSS78_SALINITY_RANGE (Fofonoff & Millard
 * 1983). Outside them it throws. Throws for a temperature outside PSS78_TEMPERATURE_RANGE_C.
 */
export function conductivityRangeMsCm(temperatureC: number): readonly [number, number] {
  // An import reads every row at one sample temperature: two bisections once, not per row.
  if (lastRange?.temperatureC !== temperatureC) {
    const range = [conductivityFromSalinity(PSS78_SALINITY_RANGE[0], temperatureC), conductivityFromSalinity(PSS78_SALINITY_RANGE[1], temperatureC)] as const
    lastRange = { temperatureC, range }
  }
  return lastRange.range
}

const RHO_W = [999.842594, 6.793952e-2, -9.09529e-3, 1.001685e-4, -1.120083e-6, 6.536332e-9] as const
const RHO_B = [8.24493e-1, -4.0899e-3, 7.6438e-5, -8.2467e-7, 5.3875e-9] as const
const RHO_C = [-5.72466e-3, 1.0227e-4, -1.6546e-6] as const
const RHO_D0 = 4.8314e-4

/** Unchecked EOS-80 one-atmosphere density, t on IPTS-68. */
function eos80(salinity: number, t68: number): number {
  return polynomial(RHO_W, t68)
    + polynomial(RHO_B, t68) * salinity
    + polynomial(RHO_C, t68) * salinity ** 1.5
    + RHO_D0 * salinity * salinity
}

function checkEos80Temperature(name: string, temperatureC: number): void {
  assertInRange(name, temperatureC, EOS80_TEMPERATURE_RANGE_C[0], EOS80_TEMPERATURE_RANGE_C[1])
}

/** Density of pure (standard mean ocean) water, kg/m3, from the EOS-80 freshwater term. */
export function pureWaterDensity(temperatureC: number): number {
  checkEos80Temperature('temperatureC', temperatureC)
  return polynomial(RHO_W, t68FromT90(temperatureC))
}

/** Sea-water density at one atmosphere, kg/m3 (EOS-80, Millero & Poisson 1981). */
export function seawaterDensity(salinity: number, temperatureC: number): number {
  assertInRange('salinity', salinity, EOS80_SALINITY_RANGE[0], EOS80_SALINITY_RANGE[1])
  checkEos80Temperature('temperatureC', temperatureC)
  return eos80(salinity, t68FromT90(temperatureC))
}

/**
 * Specific gravity as hydrometers and refractometers report it: density of the
 * sample at `sampleC` over pure water at `referenceC`. The two temperatures are
 * part of the reading; the same number means different salinities on different bases.
 */
export function specificGravity(salinity: number, sampleC: number, referenceC: number): number {
  assertInRange('salinity', salinity, EOS80_SALINITY_RANGE[0], EOS80_SALINITY_RANGE[1])
  checkEos80Temperature('sampleC', sampleC)
  checkEos80Temperature('referenceC', referenceC)
  return eos80(salinity, t68FromT90(sampleC)) / polynomial(RHO_W, t68FromT90(referenceC))
}

/**
 * Practical salinity from a specific-gravity reading on the stated basis. Density
 * rises monotonically with salinity, so bisection always converges; a reading that
 * implies salinity outside EOS-80's 0-42 range throws instead of extrapolating.
 */
export function salinityFromSpecificGravity(sg: number, sampleC: number, referenceC: number): number {
  assertInRange('sg', sg, SPECIFIC_GRAVITY_RANGE[0], SPECIFIC_GRAVITY_RANGE[1])
  const low = specificGravity(EOS80_SALINITY_RANGE[0], sampleC, referenceC)
  const high = specificGravity(EOS80_SALINITY_RANGE[1], sampleC, referenceC)
  if (sg < low || sg > high) {
    throw new RangeError(
      `sg ${sg} at ${sampleC}/${referenceC} C implies salinity outside 0 to 42; valid sg on this basis is ${low.toFixed(5)} to ${high.toFixed(5)}`,
    )
  }
  return bisect(s => specificGravity(s, sampleC, referenceC) - sg, EOS80_SALINITY_RANGE[0], EOS80_SALINITY_RANGE[1])
}

/** A specific-gravity basis: sample temperature over reference-water temperature, degrees C. */
export interface SpecificGravityBasis {
  sampleC: number
  referenceC: number
}

/** Bases instruments are commonly calibrated to (60 F = 15.5556 C, 77 F = 25 C). */
export const SG_BASES = {
  '25/25C': { sampleC: 25, referenceC: 25 },
  '20/20C': { sampleC: 20, referenceC: 20 },
  '60/60F': { sampleC: (60 - 32) * 5 / 9, referenceC: (60 - 32) * 5 / 9 },
  '77/60F': { sampleC: 25, referenceC: (60 - 32) * 5 / 9 },
} as const satisfies Record<string, SpecificGravityBasis>

/** Root of an increasing function on [low, high]; 100 halvings reach float resolution. */
function bisect(f: (x: number) => number, low: number, high: number): number {
  let lo = low
  let hi = high
  for (let i = 0; i < 100 && hi - lo > 0; i++) {
    const mid = (lo + hi) / 2
    if (mid === lo || mid === hi) break
    if (f(mid) < 0) lo = mid
    else hi = mid
  }
  return (lo + hi) / 2
}
