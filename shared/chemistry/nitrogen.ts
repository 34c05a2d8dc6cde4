/**
 * "As ion" <-> "as nitrogen" conversions for test-kit readings.
 *
 * Molar masses are built from the IUPAC standard atomic weights (Pure Appl. Chem.
 * 68: 2339, 1996) rather than rounded factors, so every basis converts exactly back.
 */

import { assertFinite } from '../units'

export const ATOMIC_WEIGHT_H = 1.00794
export const ATOMIC_WEIGHT_N = 14.00674
export const ATOMIC_WEIGHT_O = 15.9994

/** Nitrogen species a kit can report "as ion". */
export type NitrogenSpecies = 'NH3' | 'NH4' | 'NO2' | 'NO3'

/** g/mol; an electron's mass is far below the atomic-weight uncertainty, so ions use neutral sums. */
export const MOLAR_MASS: Readonly<Record<NitrogenSpecies, number>> = Object.freeze({
  NH3: ATOMIC_WEIGHT_N + 3 * ATOMIC_WEIGHT_H,
  NH4: ATOMIC_WEIGHT_N + 4 * ATOMIC_WEIGHT_H,
  NO2: ATOMIC_WEIGHT_N + 2 * ATOMIC_WEIGHT_O,
  NO3: ATOMIC_WEIGHT_N + 3 * ATOMIC_WEIGHT_O,
})

export const MOLAR_MASS_NH3 = MOLAR_MASS.NH3
export const MOLAR_MASS_NH4 = MOLAR_MASS.NH4
export const MOLAR_MASS_NO2 = MOLAR_MASS.NO2
export const MOLAR_MASS_NO3 = MOLAR_MASS.NO3

/** Mass of nitrogen per unit mass of the species (e.g. NO3- -> NO3-N, about 0.2259). */
export function nitrogenFraction(species: NitrogenSpecies): number {
  return ATOMIC_WEIGHT_N / MOLAR_MASS[species]
}

/** Converts a concentration "as ion" (mg/L of the species) to mg/L as nitrogen. */
export function toNitrogen(value: number, species: NitrogenSpecies): number {
  assertFinite('value', value, { min: 0 })
  return value * nitrogenFraction(species)
}

/** Converts mg/L as nitrogen to mg/L "as ion" of the given species. */
export function fromNitrogen(valueN: number, species: NitrogenSpecies): number {
  assertFinite('valueN', valueN, { min: 0 })
  return valueN / nitrogenFraction(species)
}
