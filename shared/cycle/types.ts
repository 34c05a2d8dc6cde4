/**
 * Public shapes of the cycle rule engine: what the server and the browser pass in
 * and what a verdict looks like. All nitrogen concentrations are mg/L as nitrogen.
 */

import type { CycleEventKind, CycleMethod, CyclePhase, LivestockGroup, Severity } from '../vocabulary'

// The engine's names come from the vocabulary; re-exported so engine callers import one module.
// LIVESTOCK_GROUPS lists the groups in the order the readiness record lists them (fish first).
export { LIVESTOCK_GROUPS } from '../vocabulary'
export type { CycleEventKind, CycleMethod, CyclePhase, LivestockGroup, Severity } from '../vocabulary'

/** The tank profile the engine needs. */
export interface CycleTank {
  volumeLitres: number
  cycleMethod: CycleMethod
  /** ISO 8601 time the cycle was started. */
  startedAt: string
}

/** One test session. Any value may be missing; concentrations are mg/L as N. */
export interface CycleReading {
  id: string
  /** ISO 8601 time the test was taken. */
  takenAt: string
  /** Total ammonia (NH3 + NH4+), mg/L as N. */
  ammoniaN?: number
  /** Nitrite, mg/L as N. */
  nitriteN?: number
  /** Nitrate, mg/L as N. */
  nitrateN?: number
  /** pH, NBS scale (what hobby meters and kits read). */
  pH?: number
  temperatureC?: number
  /** Practical salinity. */
  salinity?: number
  /** Carbonate alkalinity, dKH (degrees of carbonate hardness, the reef trade's unit). */
  alkalinityDkh?: number
  /** Calcium, mg/L. */
  calciumMgL?: number
  /** Magnesium, mg/L. */
  magnesiumMgL?: number
  /** Phosphate, mg/L as PO4 (what hobby kits read). */
  phosphateMgL?: number
  /**
   * ISO 8601 time the test was entered (the server's record time). Orders tests that share a
   * `takenAt`: the one entered last is the latest.
   */
  enteredAt?: string
}

/** Something done to the tank. */
export interface CycleEvent {
  id: string
  /** ISO 8601 time of the event. */
  at: string
  kind: CycleEventKind
  /**
   * ammonia-dose: total ammonia added, mg/L as N (a dose without it proves nothing).
   * water-change: litres replaced. livestock-added: number of animals. Other kinds: ignored.
   */
  amount?: number
  /** livestock-added: which group went in. */
  group?: LivestockGroup
  /** ISO 8601 time the event was entered; orders events that share an `at`. */
  enteredAt?: string
}

/** Everything a verdict is computed from. `now` is an input so the verdict is reproducible. */
export interface CycleInput {
  tank: CycleTank
  readings: CycleReading[]
  events?: CycleEvent[]
  /** Company overrides; missing keys take DEFAULT_THRESHOLDS. */
  thresholds?: Partial<Thresholds>
  /** ISO 8601 time the verdict is for. */
  now: string
}

/** One reason in a verdict. */
export interface Finding {
  ruleId: string
  severity: Severity
  /** Plain words a client can act on. */
  message: string
  /** Ids of the readings the finding rests on, oldest first. */
  readingIds: string[]
}

/** May a livestock group go in now, and if not, why not. */
export interface GroupReadiness {
  allowed: boolean
  /** Earliest time the cycle's timeline allows it (ISO), or null while the cycle is not complete. */
  earliest: string | null
  /** Plain-word reasons it is not allowed now; empty when allowed. */
  blockers: string[]
}

/** Something to do next. */
export interface CycleAction {
  /** e.g. 'water-change', 'retest', 'clearance-test', 'check-stall', 'test-now'. */
  kind: string
  message: string
  /** Percent of the tank volume to replace, for water changes. */
  waterChangePercent?: number
  /** ISO time by which to do it. */
  dueBy?: string
}

/** The engine's answer. */
export interface Verdict {
  phase: CyclePhase
  /** ISO time of the reading that proved the cycle complete, or null. */
  completedOn: string | null
  findings: Finding[]
  readiness: Record<LivestockGroup, GroupReadiness>
  actions: CycleAction[]
  ruleSetVersion: string
}

/**
 * Limits a company may tune. Concentrations mg/L as N, times in hours or days as
 * named, salinity practical, temperature degrees C.
 */
export interface Thresholds {
  /** Total ammonia at or below this reads as zero. */
  ammoniaZeroN: number
  /** Nitrite at or below this reads as zero. */
  nitriteZeroN: number
  /** Once proven, one test with nitrite up to this, ammonia at zero, that the next test shows gone does not undo the completion. */
  nitriteTraceN: number
  /** Nitrate above this counts as present. */
  nitratePresentN: number
  /** Ammonia or nitrite above this counts as a rise: evidence that the tank was fed and processed it. */
  riseN: number
  /** Total ammonia above this with animals in calls for a water change now. */
  ammoniaActionN: number
  /** Un-ionized ammonia (NH3-N) above this is a caution with animals in. */
  freeAmmoniaChronicN: number
  /** Un-ionized ammonia (NH3-N) above this is a danger with animals in. */
  freeAmmoniaAcuteN: number
  /** Nitrite above this with animals in is a caution. */
  nitriteHighWithAnimalsN: number
  /** Zero tests must span at least this long before the cycle can be complete. */
  stableSpanHours: number
  /** ... and there must be at least this many of them. */
  stableMinTests: number
  /** A longer gap between tests restarts the count of zero tests (before completion). */
  zeroRunMaxGapHours: number
  /** A clearance dose must read zero ammonia and nitrite within this long. */
  clearanceWindowHours: number
  /** A logged dose smaller than this does not count as a clearance test. */
  clearanceMinDoseN: number
  /** The dose a clearance test asks for. */
  clearanceDoseN: number
  /** A fall of at least this fraction from the peak counts as falling. */
  fallFraction: number
  /** Ammonia or nitrite high and flat this many days is a stall. */
  stallDays: number
  /** Nitrite above this counts as high for a stall. */
  nitriteStallN: number
  salinityMin: number
  salinityMax: number
  /** Stony corals want salinity inside this band ... */
  salinityTargetMin: number
  salinityTargetMax: number
  /** ... varying by no more than this ... */
  salinityStableSpread: number
  /** ... over this many days. */
  salinityStableDays: number
  temperatureMinC: number
  temperatureMaxC: number
  alkalinityMinDkh: number
  alkalinityMaxDkh: number
  calciumMinMgL: number
  calciumMaxMgL: number
  magnesiumMinMgL: number
  magnesiumMaxMgL: number
  /** While cycling, a test is expected at least this often. */
  testIntervalHours: number
  /** pH, temperature and salinity from an earlier test stand in for this long. */
  conditionsMaxAgeHours: number
  /** Days after completion before each coral group may go in. */
  softCoralDelayDays: number
  lpsCoralDelayDays: number
  spsCoralDelayDays: number
  /** Readings this many days after livestock went in are watched for a rise. */
  livestockWatchDays: number
  /** Ordinary re-test interval, e.g. after adding livestock or a clearance dose. */
  retestHours: number
  /** Re-test interval after a danger. */
  dangerRetestHours: number
  /** A suggested water change aims for this fraction of the limit, not the limit itself. */
  waterChangeTargetFraction: number
  /** Fishless proof: the doses of this many consecutive days must each be seen to arrive and clear. */
  clearanceDays: number
  /** A test after a dose shows it arrived when ammonia reads at least this fraction of the dose. */
  doseArrivalFraction: number
  /** Nitrate must rise by at least this over the cycle (first nitrate test to latest). */
  nitrateRiseN: number
  /** Fish-in proof: zero ammonia and nitrite held at least this many days. */
  fishInStableDays: number
  /** A seeded tank with animals in that never shows ammonia or nitrite proves itself by nitrate rising over this many days. */
  seededNitrateRiseDays: number
  /** Nitrate above which each group waits (a water change first). */
  nitrateMaxFishN: number
  nitrateMaxInvertebratesN: number
  nitrateMaxSoftCoralN: number
  nitrateMaxStonyCoralN: number
  /** Phosphate above which fish and invertebrates wait, mg/L as PO4. */
  phosphateMaxFishMgL: number
  /** Phosphate above which corals wait, mg/L as PO4. */
  phosphateMaxCoralMgL: number
  /** The usual reef pH range: outside it is a caution and livestock waits. */
  pHMin: number
  pHMax: number
  /** With animals in, pH outside this is a danger. */
  pHHardMin: number
  pHHardMax: number
  /** With animals in, nitrite above this is a danger. */
  nitriteDangerWithAnimalsN: number
  /** With animals in, salinity outside this is a danger. */
  salinityHardMin: number
  salinityHardMax: number
  /** With animals in, temperature outside this is a danger. */
  temperatureHardMinC: number
  temperatureHardMaxC: number
  /** Free ammonia averaged over this many days against the chronic criterion. */
  chronicAveragingDays: number
  /** More animals than this in one addition is a large addition. */
  stockingBatchMax: number
  /** Days between additions of fish after a small addition ... */
  stockingIntervalDays: number
  /** ... and after a large one. */
  stockingLargeIntervalDays: number
  /** A cycled tank with no livestock must be fed ammonia at least this often, or the bacteria starve. */
  ghostFeedHours: number
  /** No single water change larger than this percent; repeat with a re-test between. */
  waterChangeMaxPercent: number
  /** Nitrite at or above this while dosing says the dose is too high for the bacteria: lower it. */
  doseLowerNitriteN: number
}
