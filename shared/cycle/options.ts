/**
 * What changed between versions of rule set 2, as switches, so one engine re-runs any 2.x
 * snapshot exactly: a signed verdict names its version, and `versions.ts` evaluates it with
 * that version's switches. A change to a rule adds a switch here, off in every older version
 * and on in the new one (changes of limits belong in `thresholds.ts` and also bump the version).
 */

/** The behaviours one rule set version has. */
export interface RuleOptions {
  /** The version a verdict made with these options names. */
  readonly version: string
  /**
   * 2.0.1: once the cycle is proven, or with animals in, a water change no longer undoes a test
   * held for a dose or a small spike being worked off: the next zero test inside the window
   * still excuses it, and a diluted dose still opens that window. Before the proof (no animals),
   * dilution stays no evidence. 2.0.0 lost a proven tank to any water change made while a dose
   * or a one-step misread was being confirmed.
   */
  readonly heldThroughWaterChange: boolean
  /**
   * 2.0.1: nitrite at the hard limit, not only above it, is a danger with animals in: common
   * kits top out at 5 ppm as NO2, so a reading at the top step means that much or more.
   */
  readonly nitriteDangerAtLimit: boolean
  /**
   * 2.0.1: the stall window ends at the latest test rather than at now, so a stall does not
   * vanish while nobody tests (the overdue-test rule says that part).
   */
  readonly stallWindowAtLatestTest: boolean
  /**
   * 2.0.1: once proven, a dose given while the latest test waiting to be excused reads ammonia at
   * zero and at most a trace of nitrite carries the waiting tests to the new dose's window: the
   * zero test that clears it shows the trace gone too. Once in the proving days, so nitrite that
   * keeps coming back still loses the proof. 2.0.0 lost a proven tank dosed every evening over
   * one misread trace, because the next test was the new dose's arrival, not a zero.
   */
  readonly traceHeldAcrossDose: boolean
}

/** Rule set 2.0.0 as signed: every later switch off. */
export const RULE_OPTIONS_2_0_0: RuleOptions = Object.freeze({
  version: 'tidewright-cycle-2.0.0',
  heldThroughWaterChange: false,
  nitriteDangerAtLimit: false,
  stallWindowAtLatestTest: false,
  traceHeldAcrossDose: false,
})

/** Rule set 2.0.1: the fixes found by the scenario catalogue (shared/cycle/simulate/scenarios.ts). */
export const RULE_OPTIONS_2_0_1: RuleOptions = Object.freeze({
  version: 'tidewright-cycle-2.0.1',
  heldThroughWaterChange: true,
  nitriteDangerAtLimit: true,
  stallWindowAtLatestTest: true,
  traceHeldAcrossDose: true,
})

/** Every version of rule set 2, oldest first; the last is current. */
export const RULE_OPTIONS_2: readonly RuleOptions[] = Object.freeze([RULE_OPTIONS_2_0_0, RULE_OPTIONS_2_0_1])

/** The options of the current rule set. */
export const CURRENT_RULE_OPTIONS: RuleOptions = RULE_OPTIONS_2_0_1
