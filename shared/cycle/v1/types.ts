/**
 * Public shapes of the cycle rule engine: what the server and the browser pass in
 * and what a verdict looks like. All nitrogen concentrations are mg/L as nitrogen.
 */

/** Kinds of livestock the engine gives a go/no-go for, least to most demanding. */
export type LivestockGroup = 'fish' | 'invertebrates' | 'soft-coral' | 'lps-coral' | 'sps-coral'

/** Every livestock group, in the order the readiness record lists them. */
export const LIVESTOCK_GROUPS: readonly LivestockGroup[] = Object.freeze([
  'fish',
  'invertebrates',
  'soft-coral',
  'lps-coral',
  'sps-coral',
])

/** How the tank is being cycled: fishless with dosed ammonia, or with a few hardy fish. */
export type CycleMethod = 'fishless' | 'fish-in'

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
}

/** Kinds of logged event that matter to the cycle. */
export type CycleEventKind = 'ammonia-dose' | 'bacteria-dose' | 'water-change' | 'livestock-added' | 'note'

/** Something done to the tank. */
export interface CycleEvent {
  id: string
  /** ISO 8601 time of the event. */
  at: string
  kind: CycleEventKind
  /**
   * ammonia-dose: total ammonia added, mg/L as N. water-change: litres replaced.
   * Other kinds: free use; the engine ignores it.
   */
  amount?: number
  /** livestock-added: which group went in. */
  group?: LivestockGroup
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

/** Where the cycle stands. */
export type CyclePhase = 'not-started' | 'ammonia' | 'nitrite' | 'settling' | 'complete'

/** How much a finding matters. */
export type Severity = 'info' | 'caution' | 'danger'

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
}
