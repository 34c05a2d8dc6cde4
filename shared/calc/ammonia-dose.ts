/**
 * Ammonia dosing for a fishless cycle: how much stock solution (or solid ammonium
 * chloride) brings the tank to a target total ammonia.
 */

import { ATOMIC_WEIGHT_H, ATOMIC_WEIGHT_N, fromNitrogen, toNitrogen } from '../chemistry/nitrogen'
import { assertFinite, assertInRange, assertPositive } from '../units'
import type { AmmoniaBasis } from '../vocabulary'

/** IUPAC 1996 standard atomic weight of chlorine (Pure Appl. Chem. 68: 2339). */
export const ATOMIC_WEIGHT_CL = 35.4527
export const MOLAR_MASS_NH4CL = ATOMIC_WEIGHT_N + 4 * ATOMIC_WEIGHT_H + ATOMIC_WEIGHT_CL

/** Total ammonia for a fishless cycle, mg/L: about 1-2 ppm (common practice, no published source). */
export const FISHLESS_TARGET_TOTAL_AMMONIA_RANGE = [1, 2] as const

/** Converts an ammonia concentration on any basis to mg/L as N. */
export function ammoniaToN(value: number, basis: AmmoniaBasis): number {
  return basis === 'N' ? assertedNonNegative('value', value) : toNitrogen(value, basis)
}

/** Converts mg/L as N to the given basis. */
export function ammoniaFromN(valueN: number, basis: AmmoniaBasis): number {
  return basis === 'N' ? assertedNonNegative('valueN', valueN) : fromNitrogen(valueN, basis)
}

function assertedNonNegative(name: string, value: number): number {
  assertFinite(name, value, { min: 0 })
  return value
}

/**
 * Stock strength in mg/L from a mass percentage (w/w) and the solution's density,
 * as bottles state it (e.g. "10 % ammonia").
 */
export function stockMgPerLFromPercent(percentWw: number, densityKgPerL = 1): number {
  assertInRange('percentWw', percentWw, 0, 100)
  assertInRange('densityKgPerL', densityKgPerL, 0.8, 1.5)
  return percentWw * 10 * densityKgPerL * 1000
}

/** A dose to plan. All concentrations share one basis each, stated alongside. */
export interface AmmoniaDoseInput {
  /** Water in the system, L. */
  tankVolumeL: number
  /** Total ammonia wanted after the dose. */
  target: number
  /** Total ammonia now (same basis as target). */
  current?: number
  /** Basis of `target` and `current`. */
  basis: AmmoniaBasis
  /** Stock strength, mg/L on `stockBasis`. */
  stockMgPerL: number
  stockBasis: AmmoniaBasis
}

/** Volume of stock to add. */
export interface AmmoniaDoseResult {
  doseMl: number
  /** Target and current as mg/L N, for the record. */
  targetN: number
  currentN: number
}

/** Millilitres of stock that raise the tank from `current` to `target` total ammonia. */
export function ammoniaStockDose(input: AmmoniaDoseInput): AmmoniaDoseResult {
  assertPositive('tankVolumeL', input.tankVolumeL)
  assertPositive('stockMgPerL', input.stockMgPerL)
  const targetN = ammoniaToN(input.target, input.basis)
  const currentN = ammoniaToN(input.current ?? 0, input.basis)
  const stockN = ammoniaToN(input.stockMgPerL, input.stockBasis)
  if (currentN >= targetN) return { doseMl: 0, targetN, currentN }
  if (stockN <= targetN) throw new RangeError(`stockMgPerL (${stockN} mg/L N) must be stronger than the target (${targetN} mg/L N)`)
  // The dose adds volume as well as ammonia: (c V + s v) / (V + v) = t.
  const doseL = (input.tankVolumeL * (targetN - currentN)) / (stockN - targetN)
  return { doseMl: doseL * 1000, targetN, currentN }
}

/** Grams of solid ammonium chloride that raise the tank by the stated total ammonia. */
export function ammoniumChlorideGrams(tankVolumeL: number, target: number, basis: AmmoniaBasis, current = 0): number {
  assertPositive('tankVolumeL', tankVolumeL)
  const deltaN = ammoniaToN(target, basis) - ammoniaToN(current, basis)
  if (deltaN <= 0) return 0
  return (deltaN * tankVolumeL * MOLAR_MASS_NH4CL) / ATOMIC_WEIGHT_N / 1000
}

/** Where the ammonia comes from: dry ammonium chloride, or a solution of it of a stated strength. */
export type AmmoniaSource = { kind: 'dry' } | { kind: 'stock', gramsPerLitre: number }

/** Ammonia as N in a solution of `gramsPerLitre` of ammonium chloride, mg/L. */
export function ammoniumChlorideStockN(gramsPerLitre: number): number {
  assertPositive('gramsPerLitre', gramsPerLitre)
  return (gramsPerLitre * 1000 * ATOMIC_WEIGHT_N) / MOLAR_MASS_NH4CL
}

/** What to add: grams of the dry salt, or millilitres of the stock solution. */
export type PlannedDose = { kind: 'dry', grams: number } | { kind: 'stock', millilitres: number }

/**
 * The ammonium chloride that takes `litres` of water from `current` to `target` total
 * ammonia (both on `basis`), from the chosen source.
 */
export function plannedAmmoniaDose(litres: number, target: number, current: number, basis: AmmoniaBasis, source: AmmoniaSource): PlannedDose {
  if (source.kind === 'dry') return { kind: 'dry', grams: ammoniumChlorideGrams(litres, target, basis, current) }
  const dose = ammoniaStockDose({ tankVolumeL: litres, target, current, basis, stockMgPerL: ammoniumChlorideStockN(source.gramsPerLitre), stockBasis: 'N' })
  return { kind: 'stock', millilitres: dose.doseMl }
}
