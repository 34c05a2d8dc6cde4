/**
 * Every limit of the cycle engine, described once: default, unit, source, the range a
 * company may set it to, and what it does. The company settings form renders this list
 * as it is; the engine takes the defaults from it and checks overrides against it.
 */

import { nitrogenFraction } from '../chemistry/nitrogen'
import { atLimitPrecision } from './history'
import type { Thresholds } from './types'

/** Kits and the trade quote ammonia "as NH3"; the engine works as N, so convert once here. */
const NH3_TO_N = nitrogenFraction('NH3')
const NO2_TO_N = nitrogenFraction('NO2')
const NO3_TO_N = nitrogenFraction('NO3')

/** Total ammonia with fish in that calls for a water change: 0.5 ppm as NH3 (common practice, no published source). */
export const AMMONIA_ACTION_PPM_NH3 = 0.5
/** US EPA (1989) EPA 440/5-88-004, saltwater un-ionized ammonia, chronic (CCC), mg/L NH3. */
export const EPA_SALTWATER_CHRONIC_NH3 = 0.035
/** US EPA (1989) EPA 440/5-88-004, saltwater un-ionized ammonia, acute (CMC), mg/L NH3. */
export const EPA_SALTWATER_ACUTE_NH3 = 0.233

/** Source string for trade practice with no primary publication. */
export const COMMON_PRACTICE = 'common practice, no published source'
const EPA_1989 = 'US EPA (1989), Ambient Water Quality Criteria for Ammonia (Saltwater) - 1989, EPA 440/5-88-004'
/** Nitrification turns each mg/L of ammonia-N into 1 mg/L of nitrate-N. */
export const NITRIFICATION_STOICHIOMETRY = 'nitrification stoichiometry, 1 mg/L ammonia-N to 1 mg/L nitrate-N (standard wastewater engineering texts such as Metcalf & Eddy, from memory)'
const STOCKING_GATES = 'stocking gates before livestock (common practice, no published source)'

/** What a threshold is measured in, as the settings form labels it. */
export type ThresholdUnit
  = | 'mg/L as N'
    | 'mg/L as PO4'
    | 'mg/L'
    | 'hours'
    | 'days'
    | '°C'
    | 'practical salinity'
    | 'pH'
    | 'dKH'
    | 'tests'
    | 'animals'
    | 'fraction'
    | 'percent'

/** Headings the settings form groups the limits under. */
export type ThresholdGroup = 'zero and rise' | 'proof of the cycle' | 'safety with animals' | 'water' | 'reef chemistry' | 'stocking' | 'testing and timing'

/** One tunable limit. */
export interface ThresholdSpec {
  readonly default: number
  readonly unit: ThresholdUnit
  /** A published citation, `common practice, no published source`, or a value marked `from memory`. */
  readonly source: string
  /** Lowest and highest value a company may set. */
  readonly min: number
  readonly max: number
  /** Plain words: what the limit does. */
  readonly description: string
  readonly group: ThresholdGroup
}

const spec = (group: ThresholdGroup, unit: ThresholdUnit, value: number, min: number, max: number, source: string, description: string): ThresholdSpec =>
  Object.freeze({ default: value, unit, source, min, max, description, group })

/** Every threshold of rule set 2, keyed like `Thresholds`. */
export const THRESHOLD_SPECS: Readonly<Record<keyof Thresholds, ThresholdSpec>> = Object.freeze({
  // Zero and rise: what hobby kits read as zero; about 0.25 ppm as NH3 is the first colour step above it.
  ammoniaZeroN: spec('zero and rise', 'mg/L as N', 0.05, 0, 0.5, COMMON_PRACTICE, 'Total ammonia at or below this reads as zero.'),
  nitriteZeroN: spec('zero and rise', 'mg/L as N', 0.05, 0, 0.5, COMMON_PRACTICE, 'Nitrite at or below this reads as zero.'),
  nitriteTraceN: spec('zero and rise', 'mg/L as N', 0.25 * NO2_TO_N, 0, 0.5, COMMON_PRACTICE,
    'Once the cycle is proven, one test with nitrite up to this (about 0.25 ppm as NO2, the first colour step of common kits), ammonia at zero, that the next test shows gone does not undo it; a second within the proving days does. Before the proof any nitrite restarts the count.'),
  nitratePresentN: spec('zero and rise', 'mg/L as N', 0.5, 0, 20, COMMON_PRACTICE, 'Nitrate above this counts as present (about 2 ppm as NO3).'),
  riseN: spec('zero and rise', 'mg/L as N', 0.2, 0.05, 5, COMMON_PRACTICE, 'Ammonia or nitrite above this counts as a rise: the bacteria had something to work on.'),
  nitrateRiseN: spec('zero and rise', 'mg/L as N', 1, 0.1, 20, 'each mg/L of ammonia-N nitrified becomes 1 mg/L nitrate-N (stoichiometry); the step size is common practice, no published source',
    'Nitrate must rise by at least this over the cycle (about 4.4 ppm as NO3, under one 5 ppm kit step): nitrate merely present proves nothing.'),
  fallFraction: spec('zero and rise', 'fraction', 0.25, 0.05, 0.9, COMMON_PRACTICE, 'A fall of at least this share from the peak counts as falling.'),

  // Proof: "cleared within about a day", several days running (reference.md section 9).
  stableSpanHours: spec('proof of the cycle', 'hours', 48, 12, 720, COMMON_PRACTICE, 'Zero ammonia and nitrite tests must span at least this long before a fishless cycle is complete.'),
  stableMinTests: spec('proof of the cycle', 'tests', 3, 2, 30, COMMON_PRACTICE, 'At least this many zero tests make up that span.'),
  zeroRunMaxGapHours: spec('proof of the cycle', 'hours', 72, 12, 240, COMMON_PRACTICE, 'A longer gap between tests restarts the count of zero tests: what happened in between is unknown.'),
  clearanceWindowHours: spec('proof of the cycle', 'hours', 30, 6, 72, COMMON_PRACTICE, 'A dose must read zero ammonia and nitrite within this long to count as cleared (about a day, with slack for a late test).'),
  clearanceMinDoseN: spec('proof of the cycle', 'mg/L as N', 1 * NH3_TO_N, 0.1, 5, COMMON_PRACTICE, 'A logged dose smaller than this (about 1 ppm as NH3) does not count toward proof.'),
  clearanceDoseN: spec('proof of the cycle', 'mg/L as N', 2 * NH3_TO_N, 0.2, 5, COMMON_PRACTICE, 'The dose the engine asks for when proving the cycle (about 2 ppm as NH3).'),
  clearanceDays: spec('proof of the cycle', 'days', 3, 1, 14, COMMON_PRACTICE, 'A fishless cycle is proven by the doses of this many consecutive days, each seen to arrive and cleared.'),
  doseArrivalFraction: spec('proof of the cycle', 'fraction', 0.25, 0, 1, COMMON_PRACTICE, 'A test after a dose shows it arrived when ammonia reads at least this share of the dose.'),
  fishInStableDays: spec('proof of the cycle', 'days', 7, 2, 60, COMMON_PRACTICE, 'A fish-in cycle needs zero ammonia and nitrite held this many days, with regular tests.'),
  seededNitrateRiseDays: spec('proof of the cycle', 'days', 14, 3, 90, COMMON_PRACTICE, 'A seeded tank with animals in that never shows ammonia or nitrite proves itself by nitrate rising over this many days.'),
  stallDays: spec('proof of the cycle', 'days', 14, 3, 60, COMMON_PRACTICE, 'Ammonia or nitrite high with no downward trend, and no nitrate made, over this many days is a stall.'),
  nitriteStallN: spec('proof of the cycle', 'mg/L as N', 0.5, 0.05, 10, COMMON_PRACTICE, 'Nitrite above this counts as high when judging a stall.'),
  doseLowerNitriteN: spec('proof of the cycle', 'mg/L as N', 5 * NO2_TO_N, 0.2, 10, COMMON_PRACTICE, 'Nitrite at or above this (the top step of common kits, 5 ppm as NO2) while dosing: lower the dose.'),
  ghostFeedHours: spec('proof of the cycle', 'hours', 48, 12, 168, COMMON_PRACTICE, 'A cycled tank without livestock must be fed ammonia at least this often, or the bacteria starve.'),

  // Safety with animals in.
  ammoniaActionN: spec('safety with animals', 'mg/L as N', AMMONIA_ACTION_PPM_NH3 * NH3_TO_N, 0.05, 5, COMMON_PRACTICE, 'With animals in, total ammonia above this (0.5 ppm as NH3) calls for a water change now.'),
  freeAmmoniaChronicN: spec('safety with animals', 'mg/L as N', EPA_SALTWATER_CHRONIC_NH3 * NH3_TO_N, 0.001, 0.2, `${EPA_1989}, chronic criterion (CCC) 0.035 mg/L NH3`, 'With animals in, un-ionized ammonia above this is a caution on one test, and a danger held over the averaging period.'),
  freeAmmoniaAcuteN: spec('safety with animals', 'mg/L as N', EPA_SALTWATER_ACUTE_NH3 * NH3_TO_N, 0.01, 1, `${EPA_1989}, acute criterion (CMC) 0.233 mg/L NH3`, 'With animals in, un-ionized ammonia above this is a danger.'),
  chronicAveragingDays: spec('safety with animals', 'days', 4, 1, 30, `${EPA_1989}: the CCC is a 4-day average`, 'Free ammonia averaged over this many days is judged against the chronic criterion.'),
  nitriteHighWithAnimalsN: spec('safety with animals', 'mg/L as N', 1, 0.1, 10, 'Tomasso & Grosell (2005), Environ. Sci. Technol. 39: 98-102 (marine fish tolerate more nitrite); the level is common practice, no published source',
    'With animals in, nitrite above this (about 3.3 ppm as NO2) is a caution.'),
  nitriteDangerWithAnimalsN: spec('safety with animals', 'mg/L as N', 5 * NO2_TO_N, 0.2, 20, COMMON_PRACTICE, 'With animals in, nitrite above this (5 ppm as NO2) is a danger.'),
  salinityHardMin: spec('safety with animals', 'practical salinity', 30, 0, 42, COMMON_PRACTICE, 'With animals in, salinity below this is a danger.'),
  salinityHardMax: spec('safety with animals', 'practical salinity', 37, 0, 42, COMMON_PRACTICE, 'With animals in, salinity above this is a danger.'),
  temperatureHardMinC: spec('safety with animals', '°C', 22, 0, 40, COMMON_PRACTICE, 'With animals in, temperature below this is a danger.'),
  temperatureHardMaxC: spec('safety with animals', '°C', 29, 0, 40, COMMON_PRACTICE, 'With animals in, temperature above this is a danger.'),
  pHHardMin: spec('safety with animals', 'pH', 7.8, 6, 10, COMMON_PRACTICE, 'With animals in, pH below this is a danger.'),
  pHHardMax: spec('safety with animals', 'pH', 8.6, 6, 10, COMMON_PRACTICE, 'With animals in, pH above this is a danger.'),
  waterChangeMaxPercent: spec('safety with animals', 'percent', 50, 10, 100, COMMON_PRACTICE, 'No single water change larger than this; repeat with a re-test between until under the limit.'),
  waterChangeTargetFraction: spec('safety with animals', 'fraction', 0.8, 0.1, 1, COMMON_PRACTICE, 'A suggested water change aims for this share of the limit, so one test\'s error does not leave the tank straddling it.'),

  // Water.
  salinityMin: spec('water', 'practical salinity', 30, 0, 42, COMMON_PRACTICE, 'Salinity below this is a caution.'),
  salinityMax: spec('water', 'practical salinity', 37, 0, 42, COMMON_PRACTICE, 'Salinity above this is a caution.'),
  salinityTargetMin: spec('water', 'practical salinity', 33, 20, 42, COMMON_PRACTICE, 'Stony corals want salinity at or above this ...'),
  salinityTargetMax: spec('water', 'practical salinity', 36, 20, 42, 'natural seawater is about S 35 (UNESCO TP44); the band is common practice, no published source', '... and at or below this.'),
  salinityStableSpread: spec('water', 'practical salinity', 1, 0.1, 5, COMMON_PRACTICE, 'Stony corals want salinity varying by no more than this ...'),
  salinityStableDays: spec('water', 'days', 7, 1, 60, COMMON_PRACTICE, '... over this many days.'),
  temperatureMinC: spec('water', '°C', 22, 0, 40, COMMON_PRACTICE, 'Temperature below this is a caution.'),
  temperatureMaxC: spec('water', '°C', 29, 0, 40, COMMON_PRACTICE, 'Temperature above this is a caution.'),
  pHMin: spec('water', 'pH', 7.8, 6, 10, STOCKING_GATES, 'pH below this is outside the usual reef range: a caution, and livestock waits.'),
  pHMax: spec('water', 'pH', 8.5, 6, 10, STOCKING_GATES, 'pH above this is outside the usual reef range: a caution, and livestock waits.'),

  // Reef chemistry for stony corals.
  alkalinityMinDkh: spec('reef chemistry', 'dKH', 7, 0, 30, STOCKING_GATES, 'Stony corals wait for alkalinity at or above this.'),
  alkalinityMaxDkh: spec('reef chemistry', 'dKH', 11, 0, 30, STOCKING_GATES, 'Stony corals wait for alkalinity at or below this.'),
  calciumMinMgL: spec('reef chemistry', 'mg/L', 380, 0, 1000, STOCKING_GATES, 'Stony corals wait for calcium at or above this.'),
  calciumMaxMgL: spec('reef chemistry', 'mg/L', 450, 0, 1000, STOCKING_GATES, 'Stony corals wait for calcium at or below this.'),
  magnesiumMinMgL: spec('reef chemistry', 'mg/L', 1250, 0, 2500, STOCKING_GATES, 'Stony corals wait for magnesium at or above this.'),
  magnesiumMaxMgL: spec('reef chemistry', 'mg/L', 1400, 0, 2500, STOCKING_GATES, 'Stony corals wait for magnesium at or below this.'),

  // Stocking.
  nitrateMaxFishN: spec('stocking', 'mg/L as N', 40 * NO3_TO_N, 0.5, 50, STOCKING_GATES, 'Fish wait while nitrate is above this (40 ppm as NO3).'),
  nitrateMaxInvertebratesN: spec('stocking', 'mg/L as N', 20 * NO3_TO_N, 0.5, 50, STOCKING_GATES, 'Invertebrates wait while nitrate is above this (20 ppm as NO3).'),
  nitrateMaxSoftCoralN: spec('stocking', 'mg/L as N', 20 * NO3_TO_N, 0.5, 50, STOCKING_GATES, 'Soft corals wait while nitrate is above this (20 ppm as NO3).'),
  nitrateMaxStonyCoralN: spec('stocking', 'mg/L as N', 10 * NO3_TO_N, 0.5, 50, STOCKING_GATES, 'LPS and SPS corals wait while nitrate is above this (10 ppm as NO3).'),
  phosphateMaxFishMgL: spec('stocking', 'mg/L as PO4', 1, 0.01, 10, COMMON_PRACTICE, 'Fish and invertebrates wait while phosphate is above this.'),
  phosphateMaxCoralMgL: spec('stocking', 'mg/L as PO4', 0.1, 0.01, 10, STOCKING_GATES, 'Corals wait while phosphate is above this.'),
  softCoralDelayDays: spec('stocking', 'days', 0, 0, 365, COMMON_PRACTICE, 'Days after completion before soft corals may go in.'),
  lpsCoralDelayDays: spec('stocking', 'days', 30, 0, 365, 'stony corals wait at least about a month (common practice, no published source)', 'Days after completion before LPS corals may go in.'),
  spsCoralDelayDays: spec('stocking', 'days', 90, 0, 365, 'SPS only after several months of stable chemistry, later than LPS (common practice, no published source)', 'Days after completion before SPS corals may go in.'),
  stockingBatchMax: spec('stocking', 'animals', 3, 1, 50, COMMON_PRACTICE, 'More animals than this in one addition is a large addition.'),
  stockingIntervalDays: spec('stocking', 'days', 7, 0, 60, COMMON_PRACTICE, 'Days between additions of fish after a small addition.'),
  stockingLargeIntervalDays: spec('stocking', 'days', 14, 0, 90, COMMON_PRACTICE, 'Days before more fish after a large addition.'),
  livestockWatchDays: spec('stocking', 'days', 7, 1, 60, COMMON_PRACTICE, 'Tests this many days after livestock went in are watched for an ammonia rise.'),

  // Testing and timing.
  testIntervalHours: spec('testing and timing', 'hours', 36, 6, 168, COMMON_PRACTICE, 'While cycling, a test is expected at least this often.'),
  conditionsMaxAgeHours: spec('testing and timing', 'hours', 48, 1, 168, COMMON_PRACTICE, 'pH, temperature and salinity from an earlier test stand in for this long when working out free ammonia.'),
  retestHours: spec('testing and timing', 'hours', 24, 1, 168, COMMON_PRACTICE, 'Ordinary re-test interval, e.g. after adding livestock or a dose.'),
  dangerRetestHours: spec('testing and timing', 'hours', 12, 1, 72, COMMON_PRACTICE, 'Re-test interval after a danger.'),
})

/** Tidewright's defaults, from THRESHOLD_SPECS; companies override single keys. */
export const DEFAULT_THRESHOLDS: Readonly<Thresholds> = Object.freeze(
  Object.fromEntries(Object.entries(THRESHOLD_SPECS).map(([key, s]) => [key, atLimitPrecision(s.default)])) as unknown as Thresholds,
)

/**
 * Merges company overrides onto the defaults; throws a RangeError naming the key for a value
 * that is not a finite number inside the spec's range.
 */
export function resolveThresholds(overrides: Partial<Thresholds> = {}): Thresholds {
  const merged: Thresholds = { ...DEFAULT_THRESHOLDS }
  for (const key of Object.keys(overrides) as Array<keyof Thresholds>) {
    const value = overrides[key]
    // Stored settings may carry keys from another rule set version; only known limits apply.
    if (value === undefined || !Object.hasOwn(THRESHOLD_SPECS, key)) continue
    const { min, max } = THRESHOLD_SPECS[key]
    if (typeof value !== 'number' || !Number.isFinite(value) || value < min || value > max) {
      throw new RangeError(`threshold ${key} must be a number from ${min} to ${max} (got ${value})`)
    }
    merged[key] = atLimitPrecision(value)
  }
  return merged
}
