/**
 * Un-ionized ammonia (NH3) share of total ammonia nitrogen.
 *
 * Formulation pinned for Tidewright:
 * - Fresh water: Emerson, Russo, Lund & Thurston (1975), J. Fish. Res. Board Can.
 *   32: 2379-2383, pKa = 0.09018 + 2729.92 / T (T in kelvin), zero ionic strength.
 *   Some reprints print 2727.92; that is a misprint and is not used here.
 * - Sea water (salinity > 0): the ionic-strength term of Khoo, Culberson & Bates
 *   (1977), J. Solution Chem. 6: 281-290, added to the Emerson pKa:
 *   pKa_sw = pKa_fw + (0.1552 - 0.0003142 t) I, I = 19.9273 S / (1000 - 1.005109 S).
 *   This reproduces the Bower & Bidwell (1978) seawater table at S 34 to about 1.5 %.
 * - pH on the NBS (NIST) scale. Hobby pH meters calibrated with NBS buffers and
 *   colour kits read close to that scale, so readings from Tidewright users need no
 *   scale conversion. Total-scale formulations (e.g. Clegg & Whitfield 1995) would
 *   demand a pH the users cannot measure.
 */

import { KELVIN_OFFSET, assertFinite, assertInRange } from '../units'

/** Water conditions that set the NH3 / NH4+ balance. */
export interface AmmoniaConditions {
  /** pH on the NBS scale. */
  pH: number
  /** Temperature, degrees Celsius (ITS-90; the IPTS-68 difference is far below the formula's accuracy). */
  temperatureC: number
  /** Practical salinity; 0 for fresh water. */
  salinity: number
}

/** Range where Emerson et al. (1975) fitted their pKa. */
export const FRESHWATER_TEMPERATURE_RANGE_C = [0, 50] as const
/** Khoo et al. (1977) measured from 5 to 40 C; the seawater term is not extrapolated. */
export const SEAWATER_TEMPERATURE_RANGE_C = [5, 40] as const
/** Salinity range accepted for the ionic-strength correction. */
export const SALINITY_RANGE = [0, 45] as const
/** pH range accepted; the equilibrium formula itself has no narrower limit. */
export const PH_RANGE = [0, 14] as const

/** Formal ionic strength of sea water, mol/kg, from practical salinity (Khoo et al. 1977). */
export function ionicStrengthFromSalinity(salinity: number): number {
  assertInRange('salinity', salinity, SALINITY_RANGE[0], SALINITY_RANGE[1])
  return (19.9273 * salinity) / (1000 - 1.005109 * salinity)
}

/** pKa of the ammonium ion at zero ionic strength (Emerson et al. 1975). */
export function pKaAmmoniumFreshwater(temperatureC: number): number {
  assertInRange('temperatureC', temperatureC, FRESHWATER_TEMPERATURE_RANGE_C[0], FRESHWATER_TEMPERATURE_RANGE_C[1])
  return 0.09018 + 2729.92 / (temperatureC + KELVIN_OFFSET)
}

/** pKa of the ammonium ion (NBS scale) at the given temperature and salinity. */
export function pKaAmmonium(temperatureC: number, salinity: number): number {
  assertInRange('salinity', salinity, SALINITY_RANGE[0], SALINITY_RANGE[1])
  if (salinity === 0) return pKaAmmoniumFreshwater(temperatureC)
  assertInRange('temperatureC', temperatureC, SEAWATER_TEMPERATURE_RANGE_C[0], SEAWATER_TEMPERATURE_RANGE_C[1])
  const ionicStrength = ionicStrengthFromSalinity(salinity)
  return pKaAmmoniumFreshwater(temperatureC) + (0.1552 - 0.0003142 * temperatureC) * ionicStrength
}

/** Fraction (0..1) of total ammonia present as un-ionized NH3. */
export function freeAmmoniaFraction({ pH, temperatureC, salinity }: AmmoniaConditions): number {
  assertInRange('pH', pH, PH_RANGE[0], PH_RANGE[1])
  const pKa = pKaAmmonium(temperatureC, salinity)
  return 1 / (1 + 10 ** (pKa - pH))
}

/** Un-ionized ammonia, mg/L NH3-N, from total ammonia in mg/L as nitrogen. */
export function freeAmmonia(totalAmmoniaN: number, conditions: AmmoniaConditions): number {
  assertFinite('totalAmmoniaN', totalAmmoniaN, { min: 0 })
  return totalAmmoniaN * freeAmmoniaFraction(conditions)
}
