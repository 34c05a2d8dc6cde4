/**
 * One forward pass over the history that follows the cycle's course: runs of zero
 * tests, rises, ammonia doses and what became of each, and the moment the cycle was
 * proven. Linear in the number of readings and events: each dose is folded into the
 * proven chain once it is settled, and only the doses of the last window again at each test.
 *
 * Completion at a zero test R is decided from what was known at R only. Always: R and
 * the consecutive tests before it read zero ammonia and nitrite, at least
 * `stableMinTests` of them, no gap longer than `zeroRunMaxGapHours`, and nitrate
 * present on the latest nitrate test. Then:
 * - fishless, no livestock yet: the run's zero tests after the first ammonia dose span
 *   `stableSpanHours`; a rise was seen; nitrate rose by `nitrateRiseN` over the cycle;
 *   and the doses of `clearanceDays` consecutive days were each proven: amount known
 *   (at least `clearanceMinDoseN`), a later test showing the ammonia arrived (at least
 *   `doseArrivalFraction` of the dose), then zero ammonia and nitrite within
 *   `clearanceWindowHours`, with no water change in between;
 * - with animals in (fish-in, or livestock added): the run's zero tests since the animals
 *   went in span `fishInStableDays`; and either a nitrite stage was seen (nitrite
 *   above `riseN`) or nitrate rose by `nitrateRiseN` over `seededNitrateRiseDays` with
 *   the animals in (a seeded tank that never shows ammonia or nitrite).
 * A test above a zero limit ends the run (and a completion with it) unless it is held:
 * it shows an ammonia dose being worked off (inside the dose's window); or, with animals
 * in or once proven, it is one small ammonia spike (under `ammoniaActionN`, nitrite at
 * zero); or, once proven, it is one trace of nitrite (at most `nitriteTraceN`, ammonia at
 * zero, no other nitrite above zero outside a dose's window in the `fishInStableDays`
 * before it). A held test is excused by a zero test inside its window with no water change
 * between (from rule set 2.0.1, once proven or with animals in, a change between is
 * maintenance and does not undo it). Until then the verdict is not complete. Before completion a long gap between
 * tests restarts the run, and so does a water change in a tank without animals: missing
 * days and dilution are not evidence. With animals in, their load goes on after a change,
 * so routine changes do not restart it (a diluted dose still proves nothing). Zero tests before the first dose (or
 * before the animals) neither count nor spoil: the part of the run after it is what is
 * judged, so a looser zero limit that starts the run earlier never withholds a completion
 * a stricter one grants. Every condition is "there exists" over tests and limits, so
 * stricter limits can only delay completion.
 */

import type { RuleOptions } from './options'
import { HOUR_MS } from './time'
import type { History, TimedEvent, TimedReading } from './history'
import type { CycleMethod, CycleEvent, Thresholds } from './types'

/** An ammonia dose and what became of it. */
export interface DoseOutcome {
  readonly event: CycleEvent
  readonly t: number
  /** The first later test showing the dose arrived (ammonia at least the arrival share of it), if any. */
  readonly arrivedBy: TimedReading | null
  /** The zero test after the arrival, inside the window, that cleared it; null if none. */
  readonly clearedBy: TimedReading | null
  /** A water change in its window: any fall could be dilution. */
  readonly diluted: boolean
  /** The last test with ammonia or nitrite inside its window. */
  readonly lastInWindow: TimedReading | null
}

/** A completion, and the test that ended it if it no longer holds. */
export interface Completion {
  readonly reading: TimedReading
  readonly runStart: TimedReading
  readonly zeroTests: number
  readonly nitrate: TimedReading | null
  /** The lowest nitrate test before it: the cycle's nitrate rise is measured from here. */
  readonly nitrateLow: TimedReading | null
  /** The proven doses of consecutive days that proved a fishless cycle; empty with animals in. */
  readonly provenDoses: readonly DoseOutcome[]
  /** True when the proof was a nitrite stage or a nitrate rise with animals in. */
  readonly withAnimals: boolean
  readonly lostBy: TimedReading | null
}

/** Why the count of zero tests restarted. */
export type RunRestart
  = | { readonly reason: 'gap', readonly from: TimedReading, readonly to: TimedReading, readonly endedRun: boolean }
    | { readonly reason: 'water-change', readonly event: CycleEvent, readonly t: number, readonly endedRun: boolean, readonly dilutedDose: boolean }

/** The part of a zero run that counts as evidence: its tests after the first dose, or since the animals went in. */
export interface CountedRun {
  readonly first: TimedReading
  readonly zeroTests: number
}

/** The current run of consecutive zero tests. */
export interface ZeroRun {
  readonly first: TimedReading
  readonly last: TimedReading
  readonly zeroTests: number
  /** Zero tests of the run after the first ammonia dose (null before it, or with no dose). */
  readonly afterDose: CountedRun | null
  /** Zero tests of the run since the animals went in (null while there are none). */
  readonly withAnimals: CountedRun | null
  /** The longest chain of proven doses on consecutive days so far in the run, latest first counted. */
  readonly provenChain: readonly DoseOutcome[]
}

/** Everything the pass learned. */
export interface Course {
  /** Completion within the current run: the cycle is proven as of the last test. */
  readonly completion: Completion | null
  /**
   * A completion waiting on a test above zero (a dose or a spike being worked off): it stands
   * again if ammonia and nitrite read zero by `until`, and is lost otherwise.
   */
  readonly held: { readonly completion: Completion, readonly by: TimedReading, readonly until: number } | null
  /** Earlier completions later ended by a test above the limits. */
  readonly lost: readonly Completion[]
  readonly run: ZeroRun | null
  /** First test above `riseN`. */
  readonly firstRise: TimedReading | null
  /** First test with nitrite above `riseN`: a nitrite stage. */
  readonly nitriteStage: TimedReading | null
  /** First test with ammonia at zero after ammonia had been above zero. */
  readonly ammoniaFallen: TimedReading | null
  readonly doses: readonly DoseOutcome[]
  /** Undiluted doses whose window is still open at `now`. */
  readonly openDoses: readonly DoseOutcome[]
  readonly restarts: readonly RunRestart[]
  readonly latestNitrate: TimedReading | null
  /** Lowest nitrate test so far, and the first nitrate test with animals in. */
  readonly nitrateLow: TimedReading | null
  readonly firstNitrateWithAnimals: TimedReading | null
}

interface MutableDose {
  event: CycleEvent
  t: number
  arrivedBy: TimedReading | null
  clearedBy: TimedReading | null
  diluted: boolean
  /** Diluted once proven or with animals in (rule set 2.0.1): it proves nothing, but tests working it off are still held. */
  holdsAfterChange: boolean
  lastInWindow: TimedReading | null
}

interface MutableCount {
  first: TimedReading
  zeroTests: number
}

interface MutableRun {
  first: TimedReading
  last: TimedReading
  zeroTests: number
  afterDose: MutableCount | null
  withAnimals: MutableCount | null
  /** The proven chain as of the run's last test (see `provenChain`). */
  provenChain: ChainView
  /** The chain over the run's settled doses, folded once (see `provenChain`). */
  settledChain: SettledChain
  completion: Completion | null
}

/**
 * The proven chain folded over the doses that can no longer change: the scan's doses before
 * `next`, all of them out of `pending`. `chain` only ever grows by push or is replaced by a new
 * array, so a prefix of it taken earlier (array and length) stays what it was.
 */
interface SettledChain {
  next: number
  chain: MutableDose[]
}

/** A chain without copying it at every test: a prefix of the settled chain, then doses of its own. */
interface ChainView {
  readonly prefix: readonly MutableDose[]
  readonly prefixLength: number
  readonly tail: readonly MutableDose[]
}

const EMPTY_CHAIN: ChainView = { prefix: [], prefixLength: 0, tail: [] }

function chainLength(view: ChainView): number {
  return view.prefixLength + view.tail.length
}

function chainDoses(view: ChainView): MutableDose[] {
  return [...view.prefix.slice(0, view.prefixLength), ...view.tail]
}

/** Proven doses on consecutive days: each at least this long after the previous counted one ... */
const CHAIN_MIN_GAP_MS = 12 * 3_600_000
/** ... and at most this long after it. */
const CHAIN_MAX_GAP_MS = 36 * 3_600_000

/** A test above zero inside a dose window, waiting for a zero test by `deadline` to excuse it. */
interface Held {
  readonly reading: TimedReading
  readonly deadline: number
}

interface ScanSettings {
  readonly thresholds: Thresholds
  readonly method: CycleMethod
  /** When animals first went in: the fish of a fish-in start, or the first livestock event. */
  readonly animalsT: number
  readonly windowMs: number
  readonly spanMs: number
  readonly gapMs: number
  readonly options: RuleOptions
}

function count(counted: MutableCount | null, r: TimedReading): MutableCount {
  return counted === null ? { first: r, zeroTests: 1 } : { first: counted.first, zeroTests: counted.zeroTests + 1 }
}

/** A course scan's fields as plain data (see `CourseScan.state`). */
type CourseScanState = Record<string, unknown>

/** What a course feed has taken in, as plain data: its events, how many it has fed, and the scan's fields. */
export interface CourseFeedState {
  readonly events: readonly TimedEvent[]
  readonly next: number
  readonly scan: CourseScanState
}

class CourseScan {
  run: MutableRun | null = null
  lost: Completion[] = []
  firstRise: TimedReading | null = null
  nitriteStage: TimedReading | null = null
  firstDoseT = Number.POSITIVE_INFINITY
  nitrateLow: TimedReading | null = null
  firstNitrateWithAnimals: TimedReading | null = null
  ammoniaUpSeen = false
  ammoniaFallen: TimedReading | null = null
  pending: MutableDose[] = []
  doses: MutableDose[] = []
  restarts: RunRestart[] = []
  latestNitrate: TimedReading | null = null
  lastNitrogen: TimedReading | null = null
  held: Held[] = []
  /** When a trace was last carried across a dose (rule set 2.0.1). */
  lastCarryT = Number.NEGATIVE_INFINITY
  /** The latest test with nitrite above zero outside a dose's window, excused or not. */
  lastNitriteUpT = Number.NEGATIVE_INFINITY

  constructor(private readonly s: ScanSettings) {}

  /** Every field but the settings, as plain data shared with the scan: copy it before either goes on. */
  state(): CourseScanState {
    return Object.fromEntries(Object.entries(this).filter(([key]) => key !== 's'))
  }

  /** A scan with these settings going on from `state` (a copy of another scan's). */
  static restored(s: ScanSettings, state: CourseScanState): CourseScan {
    return Object.assign(new CourseScan(s), state)
  }

  private get completed(): boolean {
    return this.run?.completion != null
  }

  onEvent({ event, t }: TimedEvent): void {
    if (event.kind === 'ammonia-dose') {
      this.firstDoseT = Math.min(this.firstDoseT, t)
      const dose: MutableDose = { event, t, arrivedBy: null, clearedBy: null, diluted: false, holdsAfterChange: false, lastInWindow: null }
      if (this.s.options.traceHeldAcrossDose) this.carryTraceAcrossDose(t)
      this.pending.push(dose)
      this.doses.push(dose)
    }
    else if (event.kind === 'water-change') {
      const dilutedDose = this.pending.some(dose => !dose.diluted && dose.t + this.s.windowMs >= t)
      // Rule set 2.0.1: once proven, or with animals in, a change is maintenance, not the test of
      // the bacteria: tests working off a dose or a small spike stay held for the next zero test,
      // and a relapse still shows as a second test above zero. Before that, dilution is no evidence.
      const maintenance = this.s.options.heldThroughWaterChange && (this.completed || this.animalsIn(t))
      for (const dose of this.pending) {
        if (maintenance && !dose.diluted) dose.holdsAfterChange = true
        dose.diluted = true
      }
      // After a water change no zero test can excuse a held test: the dose may have been diluted away.
      if (!maintenance) this.resolveHeld(Number.POSITIVE_INFINITY)
      // With animals in, their ammonia keeps coming after the change, so later zero tests still
      // show the bacteria keep up: routine changes do not restart the count.
      if (this.completed || this.animalsIn(t)) return
      const endedRun = this.run !== null
      this.run = null
      if (endedRun || dilutedDose) this.restarts.push({ reason: 'water-change', event, t, endedRun, dilutedDose })
    }
  }

  onReading(r: TimedReading): void {
    if (r.nitrateN !== undefined) this.noteNitrate(r, r.nitrateN)
    if (r.ammoniaN === undefined && r.nitriteN === undefined) return
    const th = this.s.thresholds
    const aboveA = r.ammoniaN !== undefined && r.ammoniaN > th.ammoniaZeroN
    const aboveN = r.nitriteN !== undefined && r.nitriteN > th.nitriteZeroN
    const zero = r.ammoniaN !== undefined && r.nitriteN !== undefined && !aboveA && !aboveN
    this.noteMilestones(r, aboveA)
    this.checkGap(r)
    this.resolveHeld(r.t)
    this.settleDoses(r, zero)
    if (aboveA || aboveN) this.holdOrBreak(r)
    else if (zero) {
      // A zero test inside every held test's window excuses them all: the dose was worked off.
      this.held = []
      this.extendRun(r)
    }
    // Nitrite inside a dose's window is that dose being worked off, not nitrite coming back.
    if (aboveN && !Number.isFinite(this.doseDeadline(r))) this.lastNitriteUpT = r.t
    this.lastNitrogen = r
  }

  private noteNitrate(r: TimedReading, value: number): void {
    this.latestNitrate = r
    // The low point is what the completion measures the rise from, so it is the low point up to now.
    if (this.nitrateLow === null || value < (this.nitrateLow.nitrateN ?? 0)) this.nitrateLow = r
    if (this.firstNitrateWithAnimals === null && r.t >= this.s.animalsT) this.firstNitrateWithAnimals = r
  }

  /**
   * Once proven, a dose given while the latest waiting test is a trace (ammonia at zero, nitrite
   * at most `nitriteTraceN`) carries the waiting tests to this dose's window: the zero test that
   * clears it shows the trace gone too. At most once in `fishInStableDays`, so nitrite that keeps
   * coming back still loses the proof (common practice, no published source).
   */
  private carryTraceAcrossDose(t: number): void {
    const last = this.held[this.held.length - 1]
    const th = this.s.thresholds
    if (!this.completed || last === undefined || this.held.some(h => h.deadline < t)) return
    const trace = (last.reading.ammoniaN ?? 0) <= th.ammoniaZeroN && (last.reading.nitriteN ?? 0) <= th.nitriteTraceN
    if (!trace || t - this.lastCarryT <= th.fishInStableDays * 24 * HOUR_MS) return
    this.lastCarryT = t
    this.held = this.held.map(h => ({ reading: h.reading, deadline: Math.max(h.deadline, t + this.s.windowMs) }))
  }

  /** Breaks the run at the first held test whose window closed before `t`. */
  private resolveHeld(t: number): void {
    const expired = this.held.find(h => h.deadline < t)
    if (expired === undefined) return
    this.held = []
    this.breakRun(expired.reading)
  }

  /** When the windows of the undiluted doses `r` falls inside close; -Infinity when it falls in none. */
  private doseDeadline(r: TimedReading): number {
    let deadline = Number.NEGATIVE_INFINITY
    for (const dose of this.pending) {
      if ((!dose.diluted || dose.holdsAfterChange) && dose.t < r.t && r.t <= dose.t + this.s.windowMs) deadline = Math.max(deadline, dose.t + this.s.windowMs)
    }
    return deadline
  }

  private holdOrBreak(r: TimedReading): void {
    let deadline = this.doseDeadline(r)
    // One test of a little ammonia (under the action level, nitrite at zero) that the next
    // test, inside the clearance window, shows gone is a feeding spike the bacteria dealt
    // with: it neither undoes a proven tank nor restarts the week of zero tests a tank with
    // animals proves itself by. A second test above zero, or none in time, does.
    const th = this.s.thresholds
    const spike = (r.ammoniaN ?? 0) <= th.ammoniaActionN && (r.nitriteN ?? 0) <= th.nitriteZeroN
    if ((this.completed || this.animalsIn(r.t)) && spike && this.held.length === 0) deadline = Math.max(deadline, r.t + this.s.windowMs)
    // Nitrite is the last thing a cycle clears, so before the proof any nitrite restarts the
    // count. Once proven, one trace of it (ammonia at zero) that the next test shows gone is a
    // misread or a passing pulse; a second within the proving days is not.
    if (this.completed && this.nitriteTrace(r) && this.held.length === 0) deadline = Math.max(deadline, r.t + this.s.windowMs)
    if (Number.isFinite(deadline) && this.run !== null) this.held.push({ reading: r, deadline })
    else this.breakRun(r)
  }

  /** A trace of nitrite with ammonia at zero, the first nitrite above zero in the proving days. */
  private nitriteTrace(r: TimedReading): boolean {
    const th = this.s.thresholds
    return (r.ammoniaN ?? 0) <= th.ammoniaZeroN
      && (r.nitriteN ?? 0) <= th.nitriteTraceN
      && r.t - this.lastNitriteUpT > th.fishInStableDays * 24 * HOUR_MS
  }

  private noteMilestones(r: TimedReading, aboveA: boolean): void {
    const riseN = this.s.thresholds.riseN
    if (this.firstRise === null && ((r.ammoniaN ?? 0) > riseN || (r.nitriteN ?? 0) > riseN)) this.firstRise = r
    if (this.nitriteStage === null && (r.nitriteN ?? 0) > riseN) this.nitriteStage = r
    if (aboveA) this.ammoniaUpSeen = true
    else if (r.ammoniaN !== undefined && this.ammoniaUpSeen && this.ammoniaFallen === null) this.ammoniaFallen = r
  }

  private checkGap(r: TimedReading): void {
    const last = this.lastNitrogen
    if (last === null || r.t - last.t <= this.s.gapMs || this.completed) return
    this.restarts.push({ reason: 'gap', from: last, to: r, endedRun: this.run !== null })
    this.run = null
    this.held = []
  }

  /**
   * Notes arrivals and clearances. A dose counts as cleared only by a zero test after a
   * test that showed it arrived; it stays open for its whole window.
   */
  private settleDoses(r: TimedReading, zero: boolean): void {
    // Every window is the same length and doses arrive in time order, so the doses dropped
    // here are always the oldest of `pending`: `pending` stays a suffix of `doses`.
    const stillOpen: MutableDose[] = []
    const arrivalShare = this.s.thresholds.doseArrivalFraction
    for (const dose of this.pending) {
      if (r.t > dose.t + this.s.windowMs) continue
      stillOpen.push(dose)
      if (r.t <= dose.t) continue
      dose.lastInWindow = r
      if (dose.diluted) continue
      const amount = dose.event.amount
      const ammonia = r.ammoniaN ?? 0
      if (dose.arrivedBy === null && amount !== undefined && ammonia > this.s.thresholds.ammoniaZeroN && ammonia >= arrivalShare * amount) dose.arrivedBy = r
      if (zero && dose.arrivedBy !== null && dose.clearedBy === null) dose.clearedBy = r
    }
    this.pending = stillOpen
  }

  private breakRun(r: TimedReading): void {
    const completion = this.run?.completion
    if (completion) this.lost.push({ ...completion, lostBy: r })
    this.run = null
    this.held = []
  }

  private extendRun(r: TimedReading): void {
    // Every dose so far is at or before this test: none of them can join a run it starts.
    const run: MutableRun = this.run ?? { first: r, last: r, zeroTests: 0, afterDose: null, withAnimals: null, provenChain: EMPTY_CHAIN, settledChain: { next: this.doses.length, chain: [] }, completion: null }
    this.run = run
    run.last = r
    run.zeroTests += 1
    // Events up to r are already seen, so the first dose and the animals' arrival are known here.
    if (r.t > this.firstDoseT) run.afterDose = count(run.afterDose, r)
    if (this.animalsIn(r.t)) run.withAnimals = count(run.withAnimals, r)
    run.provenChain = this.provenChain(run, r.t)
    if (run.completion === null && this.proves(run, r)) {
      const withAnimals = this.animalsIn(r.t)
      const counted = (withAnimals ? run.withAnimals : run.afterDose) ?? run
      run.completion = {
        reading: r,
        runStart: counted.first,
        zeroTests: counted.zeroTests,
        nitrate: this.latestNitrate,
        nitrateLow: withAnimals ? this.firstNitrateWithAnimals : this.nitrateLow,
        provenDoses: withAnimals ? [] : chainDoses(run.provenChain),
        withAnimals,
        lostBy: null,
      }
    }
  }

  /** A dose is proven by `t` when its amount is known and large enough, it arrived, and it cleared by `t`. */
  private proven(dose: MutableDose, t: number): boolean {
    const amount = dose.event.amount
    return amount !== undefined && amount >= this.s.thresholds.clearanceMinDoseN
      && !dose.diluted && dose.clearedBy !== null && dose.clearedBy.t <= t
  }

  /**
   * The chain of proven doses on consecutive days ending with the latest decided dose in
   * the run, as of `t`. A dose that failed (no amount, never arrived, not cleared in time,
   * diluted) breaks the chain; a dose still inside its window is not yet decided.
   *
   * One left-to-right fold over the doses, done without re-reading years of them at every
   * zero test: a dose out of `pending` is settled (its window closed before an earlier test,
   * nothing changes it again, and every step of the fold gives it the same answer at any later
   * `t`), and the settled doses are a prefix of `doses`. So the fold over that prefix is kept on
   * the run and extended, and only the doses still pending (those of the last window) are folded
   * afresh each time. The result is the full fold's, step for step.
   */
  private provenChain(run: MutableRun, t: number): ChainView {
    const settled = run.settledChain
    const settledCount = this.doses.length - this.pending.length
    for (; settled.next < settledCount; settled.next += 1) {
      const dose = this.doses[settled.next]!
      const step = this.chainStep(settled.chain[settled.chain.length - 1], dose, run, t)
      if (step === 'reset') settled.chain = []
      else if (step === 'restart') settled.chain = [dose]
      else if (step === 'extend') settled.chain.push(dose)
    }
    // The doses still pending, folded on top of the settled chain without touching it.
    let prefixLength = settled.chain.length
    let tail: MutableDose[] = []
    for (let i = Math.max(settledCount, settled.next); i < this.doses.length; i += 1) {
      const dose = this.doses[i]!
      const previous = tail.length > 0 ? tail[tail.length - 1] : prefixLength > 0 ? settled.chain[prefixLength - 1] : undefined
      const step = this.chainStep(previous, dose, run, t)
      if (step === 'reset') {
        prefixLength = 0
        tail = []
      }
      else if (step === 'restart') {
        prefixLength = 0
        tail = [dose]
      }
      else if (step === 'extend') tail.push(dose)
    }
    return { prefix: settled.chain, prefixLength, tail }
  }

  /**
   * One step of the chain's fold: what `dose`, as of `t`, does to a chain whose last dose is
   * `previous`. Skipped: before the run, after `t`, or still open. Reset: it failed. Restart:
   * the first proven dose, or too long after the last. Extend: the next day's proven dose.
   * Keep: a second proven dose the same day.
   */
  private chainStep(previous: MutableDose | undefined, dose: MutableDose, run: MutableRun, t: number): 'skip' | 'reset' | 'restart' | 'extend' | 'keep' {
    if (dose.t <= run.first.t || dose.t >= t) return 'skip'
    const open = !dose.diluted && dose.clearedBy === null && t <= dose.t + this.s.windowMs
    if (open) return 'skip'
    if (!this.proven(dose, t)) return 'reset'
    if (previous === undefined) return 'restart'
    if (dose.t - previous.t > CHAIN_MAX_GAP_MS) return 'restart'
    if (dose.t - previous.t >= CHAIN_MIN_GAP_MS) return 'extend'
    return 'keep'
  }

  private animalsIn(t: number): boolean {
    return this.s.animalsT <= t
  }

  private proves(run: MutableRun, r: TimedReading): boolean {
    const th = this.s.thresholds
    const nitrate = this.latestNitrate?.nitrateN
    if (nitrate === undefined || nitrate <= th.nitratePresentN) return false
    // Nobody doses ammonia onto animals: with animals in, the tank proves itself under their load.
    if (this.animalsIn(r.t)) return this.provesWithAnimals(run.withAnimals, r, nitrate)
    const counted = run.afterDose
    return this.s.method === 'fishless'
      && counted !== null
      && counted.zeroTests >= th.stableMinTests
      && r.t - counted.first.t >= this.s.spanMs
      && this.firstRise !== null
      && nitrate - (this.nitrateLow?.nitrateN ?? 0) >= th.nitrateRiseN
      && chainLength(run.provenChain) >= th.clearanceDays
  }

  private provesWithAnimals(counted: MutableCount | null, r: TimedReading, nitrate: number): boolean {
    const th = this.s.thresholds
    if (counted === null || counted.zeroTests < th.stableMinTests) return false
    if (r.t - counted.first.t < Math.max(this.s.spanMs, th.fishInStableDays * 24 * 3_600_000)) return false
    if (this.nitriteStage !== null) return true
    const from = this.firstNitrateWithAnimals
    return from !== null
      && this.latestNitrate !== null
      && this.latestNitrate.t - from.t >= th.seededNitrateRiseDays * 24 * 3_600_000
      && nitrate - (from.nitrateN ?? 0) >= th.nitrateRiseN
  }

  result(nowMs: number): Course {
    // A held test whose window has closed by `now` was never excused: it ends the run.
    this.resolveHeld(nowMs)
    // A diluted dose can no longer prove anything, so it is not a test under way.
    const open = this.pending.filter(dose => !dose.diluted && nowMs <= dose.t + this.s.windowMs)
    const run = this.run
    // A test still waiting to be excused is above the limits now: no completion holds meanwhile.
    const onHold = this.held.length > 0
    const waiting = this.held[this.held.length - 1]
    return {
      completion: onHold ? null : run?.completion ?? null,
      held: onHold && run?.completion && waiting ? { completion: run.completion, by: waiting.reading, until: Math.min(...this.held.map(h => h.deadline)) } : null,
      lost: this.lost,
      run: run ? { first: run.first, last: run.last, zeroTests: run.zeroTests, afterDose: run.afterDose, withAnimals: run.withAnimals, provenChain: chainDoses(run.provenChain) } : null,
      firstRise: this.firstRise,
      nitriteStage: this.nitriteStage,
      ammoniaFallen: this.ammoniaFallen,
      doses: this.doses,
      openDoses: open,
      restarts: this.restarts,
      latestNitrate: this.latestNitrate,
      nitrateLow: this.nitrateLow,
      firstNitrateWithAnimals: this.firstNitrateWithAnimals,
    }
  }
}

/**
 * Feeds the course scan a history one test at a time, each after the events at or before its time
 * (events at the same instant as a test come first): the whole history's order, whether the tests
 * come from an array (traceCourse) or stream past once and are not kept (history-stream.ts).
 */
export class CourseFeed {
  private scan: CourseScan
  private next = 0
  private settings: ScanSettings

  /** `events` are the history's events as of `now`, in order. */
  constructor(private events: readonly TimedEvent[], thresholds: Thresholds, method: CycleMethod, startedMs: number, options: RuleOptions) {
    const livestock = events.find(e => e.event.kind === 'livestock-added')
    const fishIn = method === 'fish-in' ? startedMs : Number.POSITIVE_INFINITY
    this.settings = {
      thresholds,
      method,
      animalsT: Math.min(fishIn, livestock ? livestock.t : Number.POSITIVE_INFINITY),
      windowMs: thresholds.clearanceWindowHours * HOUR_MS,
      spanMs: thresholds.stableSpanHours * HOUR_MS,
      gapMs: thresholds.zeroRunMaxGapHours * HOUR_MS,
      options,
    }
    this.scan = new CourseScan(this.settings)
  }

  /**
   * What the feed has taken in so far, as plain data shared with it: copy it (structuredClone,
   * with whatever else refers to the same tests) before either goes on.
   */
  state(): CourseFeedState {
    return { events: this.events, next: this.next, scan: this.scan.state() }
  }

  /** A feed with this one's settings going on from `state` (a copy of a feed's state). */
  withState(state: CourseFeedState): CourseFeed {
    const feed: CourseFeed = Object.create(CourseFeed.prototype)
    feed.settings = this.settings
    feed.events = state.events
    feed.next = state.next
    feed.scan = CourseScan.restored(this.settings, state.scan)
    return feed
  }

  /** The next test in history order (none after `now`). */
  reading(reading: TimedReading): void {
    const { events } = this
    for (let event = events[this.next]; event !== undefined && event.t <= reading.t; event = events[this.next]) {
      this.scan.onEvent(event)
      this.next += 1
    }
    this.scan.onReading(reading)
  }

  /** The course as of `nowMs`, once every test has been fed. */
  result(nowMs: number): Course {
    for (const event of this.events.slice(this.next)) this.scan.onEvent(event)
    this.next = this.events.length
    return this.scan.result(nowMs)
  }
}

/** Follows the cycle through the ordered history. Events at the same instant as a test come first. */
export function traceCourse(history: History, thresholds: Thresholds, method: CycleMethod, startedMs: number, nowMs: number, options: RuleOptions): Course {
  const feed = new CourseFeed(history.events, thresholds, method, startedMs, options)
  for (const reading of history.readings) feed.reading(reading)
  return feed.result(nowMs)
}
