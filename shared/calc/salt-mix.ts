/**
 * Salt for a batch of sea water, and the correction from a measured to a target salinity.
 *
 * Practical salinity is close to grams of dissolved salt per kilogram of sea water;
 * the reference-composition factor 35.16504 / 35 (Millero et al. 2008, Deep-Sea Res.
 * I 55: 50-72) turns it into absolute salinity, g/kg. Synthetic mixes carry some
 * moisture and carbonate buffers, so `saltPurity` lets the user scale for the mix.
 */

import { seawaterDensity, pureWaterDensity } from '../chemistry/seawater'
import { assertInRange, assertPositive } from '../units'

/** g/kg of absolute salinity per unit of practical salinity. */
export const REFERENCE_SALINITY_FACTOR = 35.16504 / 35
/** Mixing temperature assumed when none is given: a typical reef tank, C. */
export const DEFAULT_MIX_TEMPERATURE_C = 25

/** Batch of sea water to mix. */
export interface SaltMixInput {
  /** Final volume of mixed water, L. */
  volumeL: number
  /** Target practical salinity. */
  salinity: number
  /** Temperature the volume is measured at, C. */
  temperatureC?: number
  /** Fraction of the mix's mass that ends up as dissolved salt (1 = ideal sea salt). */
  saltPurity?: number
}

/** Salt and fresh water for the batch. */
export interface SaltMixResult {
  saltKg: number
  freshWaterL: number
  solutionKg: number
}

/** Mass of salt mix and purified water that make `volumeL` of sea water at `salinity`. */
export function saltForVolume({ volumeL, salinity, temperatureC = DEFAULT_MIX_TEMPERATURE_C, saltPurity = 1 }: SaltMixInput): SaltMixResult {
  assertPositive('volumeL', volumeL)
  assertInRange('saltPurity', saltPurity, 0.5, 1)
  const solutionKg = (volumeL * seawaterDensity(salinity, temperatureC)) / 1000
  const dissolvedKg = (solutionKg * salinity * REFERENCE_SALINITY_FACTOR) / 1000
  const freshWaterL = ((solutionKg - dissolvedKg) * 1000) / pureWaterDensity(temperatureC)
  return { saltKg: dissolvedKg / saltPurity, freshWaterL, solutionKg }
}

/** A tank whose salinity is off target. */
export interface SalinityCorrectionInput {
  /** Water in the system, L. */
  volumeL: number
  measured: number
  target: number
  temperatureC?: number
  /** Salinity of the premixed water used to raise salinity by exchange or addition (must exceed target). */
  mixSalinity?: number
  saltPurity?: number
}

/** Ways to reach the target; only the fields for the needed direction are non-zero. */
export interface SalinityCorrectionResult {
  direction: 'none' | 'lower' | 'raise'
  /** Lower: purified water to add (level allowing, e.g. after evaporation), L. */
  freshWaterToAddL: number
  /** Lower: tank water to swap for purified water at constant level, L. */
  exchangeWithFreshL: number
  /** Raise: dry salt mix to dissolve into the system, kg. */
  saltToAddKg: number
  /** Raise: premixed water at `mixSalinity` to add, L (0 when no mix salinity given). */
  mixToAddL: number
  /** Raise: tank water to swap for premixed water at constant level, L (0 when no mix salinity given). */
  exchangeWithMixL: number
}

function saltGramsPerLitre(salinity: number, temperatureC: number): number {
  return seawaterDensity(salinity, temperatureC) * salinity * REFERENCE_SALINITY_FACTOR / 1000
}

/** How much fresh water, salt or premix takes the system from `measured` to `target` salinity. */
export function salinityCorrection(input: SalinityCorrectionInput): SalinityCorrectionResult {
  const { volumeL, measured, target, mixSalinity } = input
  const temperatureC = input.temperatureC ?? DEFAULT_MIX_TEMPERATURE_C
  const saltPurity = input.saltPurity ?? 1
  assertPositive('volumeL', volumeL)
  assertInRange('saltPurity', saltPurity, 0.5, 1)
  const result: SalinityCorrectionResult = {
    direction: 'none', freshWaterToAddL: 0, exchangeWithFreshL: 0, saltToAddKg: 0, mixToAddL: 0, exchangeWithMixL: 0,
  }
  const tankKg = (volumeL * seawaterDensity(measured, temperatureC)) / 1000
  assertInRange('target', target, 0, 42)
  const sA = (s: number) => s * REFERENCE_SALINITY_FACTOR
  const cMeasured = saltGramsPerLitre(measured, temperatureC)
  const cTarget = saltGramsPerLitre(target, temperatureC)

  if (measured > target) {
    if (target === 0) throw new RangeError('target must be > 0 when lowering salinity by dilution')
    // Salt mass is conserved when fresh water is added: m S_m = (m + m_f) S_t.
    const freshKg = tankKg * (measured / target - 1)
    result.direction = 'lower'
    result.freshWaterToAddL = (freshKg * 1000) / pureWaterDensity(temperatureC)
    result.exchangeWithFreshL = volumeL * (1 - cTarget / cMeasured)
    return result
  }
  if (measured === target) return result

  result.direction = 'raise'
  // Dissolved salt raises the solution mass too: salt + m S_m = (m + salt) S_t (absolute, g/kg).
  const dissolvedKg = (tankKg * (sA(target) - sA(measured))) / (1000 - sA(target))
  result.saltToAddKg = dissolvedKg / saltPurity
  if (mixSalinity !== undefined) {
    assertInRange('mixSalinity', mixSalinity, 0, 42)
    if (mixSalinity <= target) throw new RangeError(`mixSalinity must be above target (${target}) to raise salinity; got ${mixSalinity}`)
    const mixKg = (tankKg * (target - measured)) / (mixSalinity - target)
    result.mixToAddL = (mixKg * 1000) / seawaterDensity(mixSalinity, temperatureC)
    result.exchangeWithMixL = (volumeL * (cTarget - cMeasured)) / (saltGramsPerLitre(mixSalinity, temperatureC) - cMeasured)
  }
  return result
}
