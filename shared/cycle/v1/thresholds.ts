/**
 * Default limits of the cycle engine and the merge with a company's overrides.
 * Each value says where it comes from; trade values are marked common practice.
 */

import { nitrogenFraction } from '../../chemistry/nitrogen'
import type { Thresholds } from './types'

/** Kits and the trade quote ammonia "as NH3"; the engine works as N, so convert once here. */
const NH3_TO_N = nitrogenFraction('NH3')

/** Total ammonia with fish in that calls for a water change: 0.5 ppm as NH3 (common practice, no published source). */
export const AMMONIA_ACTION_PPM_NH3 = 0.5
/** US EPA (1989) EPA 440/5-88-004, saltwater un-ionized ammonia, chronic (CCC), mg/L NH3. */
export const EPA_SALTWATER_CHRONIC_NH3 = 0.035
/** US EPA (1989) EPA 440/5-88-004, saltwater un-ionized ammonia, acute (CMC), mg/L NH3. */
export const EPA_SALTWATER_ACUTE_NH3 = 0.233

/** Tidewright's defaults; companies override single keys. */
export const DEFAULT_THRESHOLDS: Readonly<Thresholds> = Object.freeze({
  // What hobby kits read as zero (common practice, no published source).
  ammoniaZeroN: 0.05,
  nitriteZeroN: 0.05,
  // About 2 ppm as NO3: clearly above a kit's zero, well below what one 1-2 ppm ammonia dose leaves behind.
  nitratePresentN: 0.5,
  // About 0.25 ppm as NH3, the first colour step above zero on common kits (common practice).
  riseN: 0.2,
  ammoniaActionN: AMMONIA_ACTION_PPM_NH3 * NH3_TO_N,
  freeAmmoniaChronicN: EPA_SALTWATER_CHRONIC_NH3 * NH3_TO_N,
  freeAmmoniaAcuteN: EPA_SALTWATER_ACUTE_NH3 * NH3_TO_N,
  // Marine fish tolerate far more nitrite than freshwater fish (Tomasso & Grosell 2005), so this is
  // a caution, not a danger; about 3.3 ppm as NO2 (common practice, no published source).
  nitriteHighWithAnimalsN: 1,
  // Two days of zero tests, at least three of them (common practice, no published source).
  stableSpanHours: 48,
  stableMinTests: 3,
  zeroRunMaxGapHours: 72,
  // "Cleared within about a day" (reference.md section 9), with slack for a late test.
  clearanceWindowHours: 30,
  clearanceMinDoseN: 1 * NH3_TO_N,
  clearanceDoseN: 2 * NH3_TO_N,
  fallFraction: 0.25,
  stallDays: 14,
  nitriteStallN: 0.5,
  // Reef salinity (common practice, no published source).
  salinityMin: 30,
  salinityMax: 37,
  salinityTargetMin: 33,
  salinityTargetMax: 35,
  salinityStableSpread: 1,
  salinityStableDays: 7,
  temperatureMinC: 22,
  temperatureMaxC: 29,
  // Reef chemistry ranges for stony corals (common practice, no published source).
  alkalinityMinDkh: 7,
  alkalinityMaxDkh: 11,
  calciumMinMgL: 380,
  calciumMaxMgL: 460,
  magnesiumMinMgL: 1250,
  magnesiumMaxMgL: 1450,
  testIntervalHours: 36,
  conditionsMaxAgeHours: 48,
  // Stony corals wait about a month after completion (reference.md section 9, common practice).
  softCoralDelayDays: 0,
  lpsCoralDelayDays: 30,
  spsCoralDelayDays: 30,
  livestockWatchDays: 7,
  retestHours: 24,
  dangerRetestHours: 12,
  waterChangeTargetFraction: 0.8,
})

/** Merges company overrides onto the defaults; throws a RangeError for a value that is not a finite number >= 0. */
export function resolveThresholds(overrides: Partial<Thresholds> = {}): Thresholds {
  const merged: Thresholds = { ...DEFAULT_THRESHOLDS }
  for (const key of Object.keys(overrides) as Array<keyof Thresholds>) {
    const value = overrides[key]
    // Stored settings may carry keys from another rule set version; only known limits apply.
    if (value === undefined || !(key in DEFAULT_THRESHOLDS)) continue
    if (!Number.isFinite(value) || value < 0) {
      throw new RangeError(`threshold ${key} must be a finite number >= 0 (got ${value})`)
    }
    merged[key] = value
  }
  return merged
}
