/**
 * One forward pass over the history that follows the cycle's course: runs of zero
 * tests, rises, ammonia doses and whether they were cleared, and the moment the
 * cycle was proven. Linear in the number of readings and events.
 *
 * Completion at a reading R is decided from what was known at R only, and needs:
 * - R and the consecutive tests before it read zero ammonia and nitrite, at least
 *   `stableMinTests` of them spanning at least `stableSpanHours`;
 * - nitrate present on the latest nitrate test;
 * - a rise (ammonia or nitrite above `riseN`) at some point: readings that were
 *   always zero prove nothing;
 * - for a fishless tank with no livestock yet: an ammonia dose cleared, that is a
 *   zero test inside the zero run and within `clearanceWindowHours` of the dose,
 *   with no water change in between.
 * A test above a zero limit ends the run (and a completion with it) unless it
 * shows an ammonia dose being worked off: it falls inside the dose's window and a
 * zero test follows inside that window, with no water change in between. Such a
 * test neither counts nor breaks; until the zero test comes it holds the run open,
 * so the verdict is not complete meanwhile. Before completion, a water change or a
 * long gap between tests also restarts the run: dilution and missing days are not
 * evidence. Every condition is "there exists" over tests and limits, so stricter
 * limits can only delay completion.
 */

import { HOUR_MS } from './time'
import type { History, TimedEvent, TimedReading } from './history'
import type { CycleMethod, CycleEvent, Thresholds } from './types'

/** An ammonia dose and what became of it. */
export interface DoseOutcome {
  readonly event: CycleEvent
  readonly t: number
  /** The zero test that cleared it, if any. */
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
  readonly clearedDose: DoseOutcome | null
  readonly lostBy: TimedReading | null
}

/** Why the count of zero tests restarted. */
export type RunRestart
  = | { readonly reason: 'gap', readonly from: TimedReading, readonly to: TimedReading, readonly endedRun: boolean }
    | { readonly reason: 'water-change', readonly event: CycleEvent, readonly t: number, readonly endedRun: boolean, readonly dilutedDose: boolean }

/** The current run of consecutive zero tests. */
export interface ZeroRun {
  readonly first: TimedReading
  readonly last: TimedReading
  readonly zeroTests: number
  readonly clearedDoses: readonly DoseOutcome[]
}

/** Everything the pass learned. */
export interface Course {
  /** Completion within the current run: the cycle is proven as of the last test. */
  readonly completion: Completion | null
  /** Earlier completions later ended by a test above the limits. */
  readonly lost: readonly Completion[]
  readonly run: ZeroRun | null
  /** First test above `riseN`. */
  readonly firstRise: TimedReading | null
  /** First test with ammonia at zero after ammonia had been above zero. */
  readonly ammoniaFallen: TimedReading | null
  readonly doses: readonly DoseOutcome[]
  /** Undiluted doses whose window is still open at `now`. */
  readonly openDoses: readonly DoseOutcome[]
  readonly restarts: readonly RunRestart[]
  readonly latestNitrate: TimedReading | null
}

interface MutableDose {
  event: CycleEvent
  t: number
  clearedBy: TimedReading | null
  diluted: boolean
  lastInWindow: TimedReading | null
}

interface MutableRun {
  first: TimedReading
  last: TimedReading
  zeroTests: number
  clearedDoses: DoseOutcome[]
  completion: Completion | null
}

/** A test above zero inside a dose window, waiting for a zero test by `deadline` to excuse it. */
interface Held {
  readonly reading: TimedReading
  readonly deadline: number
}

interface ScanSettings {
  readonly thresholds: Thresholds
  readonly method: CycleMethod
  readonly firstLivestockT: number
  readonly windowMs: number
  readonly spanMs: number
  readonly gapMs: number
}

class CourseScan {
  run: MutableRun | null = null
  lost: Completion[] = []
  firstRise: TimedReading | null = null
  ammoniaUpSeen = false
  ammoniaFallen: TimedReading | null = null
  pending: MutableDose[] = []
  doses: MutableDose[] = []
  restarts: RunRestart[] = []
  latestNitrate: TimedReading | null = null
  lastNitrogen: TimedReading | null = null
  held: Held[] = []

  constructor(private readonly s: ScanSettings) {}

  private get completed(): boolean {
    return this.run?.completion != null
  }

  onEvent({ event, t }: TimedEvent): void {
    if (event.kind === 'ammonia-dose') {
      const dose: MutableDose = { event, t, clearedBy: null, diluted: false, lastInWindow: null }
      this.pending.push(dose)
      this.doses.push(dose)
    }
    else if (event.kind === 'water-change') {
      const dilutedDose = this.pending.some(dose => !dose.diluted && dose.t + this.s.windowMs >= t)
      for (const dose of this.pending) dose.diluted = true
      // After a water change no zero test can excuse a held test: the dose may have been diluted away.
      this.resolveHeld(Number.POSITIVE_INFINITY)
      if (this.completed) return
      const endedRun = this.run !== null
      this.run = null
      if (endedRun || dilutedDose) this.restarts.push({ reason: 'water-change', event, t, endedRun, dilutedDose })
    }
  }

  onReading(r: TimedReading): void {
    if (r.nitrateN !== undefined) this.latestNitrate = r
    if (r.ammoniaN === undefined && r.nitriteN === undefined) return
    const th = this.s.thresholds
    const aboveA = r.ammoniaN !== undefined && r.ammoniaN > th.ammoniaZeroN
    const aboveN = r.nitriteN !== undefined && r.nitriteN > th.nitriteZeroN
    const zero = r.ammoniaN !== undefined && r.nitriteN !== undefined && !aboveA && !aboveN
    this.noteMilestones(r, aboveA)
    this.checkGap(r)
    this.resolveHeld(r.t)
    const cleared = this.settleDoses(r, zero)
    if (aboveA || aboveN) this.holdOrBreak(r)
    else if (zero) {
      // A zero test inside every held test's window excuses them all: the dose was worked off.
      this.held = []
      this.extendRun(r, cleared)
    }
    this.lastNitrogen = r
  }

  /** Breaks the run at the first held test whose window closed before `t`. */
  private resolveHeld(t: number): void {
    const expired = this.held.find(h => h.deadline < t)
    if (expired === undefined) return
    this.held = []
    this.breakRun(expired.reading)
  }

  private holdOrBreak(r: TimedReading): void {
    let deadline = Number.NEGATIVE_INFINITY
    for (const dose of this.pending) {
      if (!dose.diluted && dose.t < r.t && r.t <= dose.t + this.s.windowMs) deadline = Math.max(deadline, dose.t + this.s.windowMs)
    }
    if (Number.isFinite(deadline) && this.run !== null) this.held.push({ reading: r, deadline })
    else this.breakRun(r)
  }

  private noteMilestones(r: TimedReading, aboveA: boolean): void {
    const riseN = this.s.thresholds.riseN
    if (this.firstRise === null && ((r.ammoniaN ?? 0) > riseN || (r.nitriteN ?? 0) > riseN)) this.firstRise = r
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

  /** Returns the doses this test shows cleared; a dose stays open for its whole window so any zero test in it counts. */
  private settleDoses(r: TimedReading, zero: boolean): MutableDose[] {
    const stillOpen: MutableDose[] = []
    const cleared: MutableDose[] = []
    for (const dose of this.pending) {
      if (r.t > dose.t + this.s.windowMs) continue
      stillOpen.push(dose)
      if (r.t <= dose.t) continue
      dose.lastInWindow = r
      if (!zero || dose.diluted) continue
      if (dose.clearedBy === null) dose.clearedBy = r
      cleared.push(dose)
    }
    this.pending = stillOpen
    return cleared
  }

  private breakRun(r: TimedReading): void {
    const completion = this.run?.completion
    if (completion) this.lost.push({ ...completion, lostBy: r })
    this.run = null
    this.held = []
  }

  private extendRun(r: TimedReading, cleared: readonly MutableDose[]): void {
    const run: MutableRun = this.run ?? { first: r, last: r, zeroTests: 0, clearedDoses: [], completion: null }
    this.run = run
    run.last = r
    run.zeroTests += 1
    for (const dose of cleared) {
      if (this.countsAsClearance(dose) && !run.clearedDoses.includes(dose)) run.clearedDoses.push(dose)
    }
    if (run.completion === null && this.proves(run, r)) {
      run.completion = {
        reading: r,
        runStart: run.first,
        zeroTests: run.zeroTests,
        nitrate: this.latestNitrate,
        clearedDose: run.clearedDoses[run.clearedDoses.length - 1] ?? null,
        lostBy: null,
      }
    }
  }

  private countsAsClearance(dose: MutableDose): boolean {
    const amount = dose.event.amount
    return amount === undefined || amount >= this.s.thresholds.clearanceMinDoseN
  }

  private proves(run: MutableRun, r: TimedReading): boolean {
    const th = this.s.thresholds
    const nitrate = this.latestNitrate?.nitrateN
    return run.zeroTests >= th.stableMinTests
      && r.t - run.first.t >= this.s.spanMs
      && nitrate !== undefined && nitrate > th.nitratePresentN
      && this.firstRise !== null
      && (!this.needsClearance(r.t) || run.clearedDoses.length > 0)
  }

  private needsClearance(t: number): boolean {
    // Nobody doses ammonia onto animals: once livestock is in, a rise and fall is the proof.
    return this.s.method === 'fishless' && !(this.s.firstLivestockT <= t)
  }

  result(nowMs: number): Course {
    // A held test whose window has closed by `now` was never excused: it ends the run.
    this.resolveHeld(nowMs)
    // A diluted dose can no longer prove anything, so it is not a test under way.
    const open = this.pending.filter(dose => !dose.diluted && nowMs <= dose.t + this.s.windowMs)
    const run = this.run
    // A test still waiting to be excused is above the limits now: no completion holds meanwhile.
    const onHold = this.held.length > 0
    return {
      completion: onHold ? null : run?.completion ?? null,
      lost: this.lost,
      run: run ? { first: run.first, last: run.last, zeroTests: run.zeroTests, clearedDoses: run.clearedDoses } : null,
      firstRise: this.firstRise,
      ammoniaFallen: this.ammoniaFallen,
      doses: this.doses,
      openDoses: open,
      restarts: this.restarts,
      latestNitrate: this.latestNitrate,
    }
  }
}

/** Follows the cycle through the ordered history. Events at the same instant as a test come first. */
export function traceCourse(history: History, thresholds: Thresholds, method: CycleMethod, nowMs: number): Course {
  const livestock = history.events.find(e => e.event.kind === 'livestock-added')
  const scan = new CourseScan({
    thresholds,
    method,
    firstLivestockT: livestock ? livestock.t : Number.POSITIVE_INFINITY,
    windowMs: thresholds.clearanceWindowHours * HOUR_MS,
    spanMs: thresholds.stableSpanHours * HOUR_MS,
    gapMs: thresholds.zeroRunMaxGapHours * HOUR_MS,
  })
  const { readings, events } = history
  let next = 0
  for (const reading of readings) {
    for (let event = events[next]; event !== undefined && event.t <= reading.t; event = events[next]) {
      scan.onEvent(event)
      next += 1
    }
    scan.onReading(reading)
  }
  for (const event of events.slice(next)) scan.onEvent(event)
  return scan.result(nowMs)
}
