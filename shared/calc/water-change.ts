/**
 * Water-change dilution. Replacing a fraction f of the tank with new water of
 * concentration r turns c into c(1 - f) + r f (complete mixing, same volume back).
 */

import { assertFinite, assertInRange } from '../units'

/** One water change that should bring `current` down to `target`. */
export interface WaterChangeInput {
  /** Measured concentration in the tank (any unit, e.g. mg/L NH3-N). */
  current: number
  /** Concentration wanted after the change, same unit. */
  target: number
  /** Concentration in the new water, same unit; 0 for purified make-up water. */
  replacement?: number
}

/** Repeated changes of a fixed size. */
export interface ChangesNeededInput extends WaterChangeInput {
  /** Size of each change, percent of tank volume, in (0, 100]. */
  percentPerChange: number
}

function checkConcentrations(current: number, target: number, replacement: number): void {
  assertFinite('current', current, { min: 0 })
  assertFinite('target', target, { min: 0 })
  assertFinite('replacement', replacement, { min: 0 })
}

function assertReachable(target: number, replacement: number): void {
  // Dilution approaches the new water's concentration but never passes it.
  if (target <= replacement) {
    throw new RangeError(`target must be above replacement (${replacement}); got target ${target}: no water change can reach it`)
  }
}

/** Percent (0-100) of the tank volume to replace in one change so `current` falls to `target`. */
export function waterChangePercentToReach({ current, target, replacement = 0 }: WaterChangeInput): number {
  checkConcentrations(current, target, replacement)
  if (current <= target) return 0
  assertReachable(target, replacement)
  return (100 * (current - target)) / (current - replacement)
}

/** Number of changes of `percentPerChange` each needed to bring `current` to or below `target`. */
export function changesNeeded({ current, target, replacement = 0, percentPerChange }: ChangesNeededInput): number {
  checkConcentrations(current, target, replacement)
  if (!(percentPerChange > 0 && percentPerChange <= 100)) {
    throw new RangeError(`percentPerChange must be a finite number > 0 and <= 100 (got ${percentPerChange})`)
  }
  if (current <= target) return 0
  assertReachable(target, replacement)
  if (percentPerChange === 100) return 1
  const keep = 1 - percentPerChange / 100
  const exact = Math.log((target - replacement) / (current - replacement)) / Math.log(keep)
  // Rounding error can push an exact whole number (e.g. 2) to 2.0000000001; do not add a change for it.
  return Math.max(1, Math.ceil(exact - 1e-9))
}

/** Concentration after `count` changes of `percentPerChange` each. */
export function concentrationAfterChanges(current: number, replacement: number, percentPerChange: number, count: number): number {
  checkConcentrations(current, 0, replacement)
  assertInRange('percentPerChange', percentPerChange, 0, 100)
  if (!Number.isInteger(count) || count < 0) throw new RangeError(`count must be a whole number >= 0 (got ${count})`)
  const keep = (1 - percentPerChange / 100) ** count
  return replacement + (current - replacement) * keep
}
