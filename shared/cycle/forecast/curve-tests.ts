/**
 * Which tests trace the forecast's curves: all but the checks that a proof dose arrived (a test
 * within DOSE_CHECK_HOURS of a dose given after a zero test), which show the dose, not the
 * bacteria's progress. A fold, so a history streamed past once (history-stream.ts) counts the
 * same tests an array of them keeps.
 */
import type { TimedEvent } from '../history'
import { HOUR_MS } from '../time'
import type { Thresholds } from '../types'
import { DOSE_CHECK_HOURS } from './parameters'
import type { TimedTest } from './series'

/** An ammonia dose as the forecast reads it. */
export interface ProofDose {
  t: number
  /** mg/L as N; 0 when logged without an amount. */
  amount: number
}

/** Ammonia doses among `events` (at or before now), oldest first. */
export function dosesOf(events: readonly TimedEvent[]): ProofDose[] {
  return events.filter(e => e.event.kind === 'ammonia-dose').map(e => ({ t: e.t, amount: e.event.amount ?? 0 }))
}

/** Whether a test reads zero ammonia and zero nitrite, both measured. */
export function readsZero(test: TimedTest, th: Thresholds): boolean {
  return test.ammoniaN !== undefined && test.nitriteN !== undefined && test.ammoniaN <= th.ammoniaZeroN && test.nitriteN <= th.nitriteZeroN
}

/** A curve fold's progress as plain data (see `CurveTestFold.state`). */
export interface CurveFoldState {
  readonly last: TimedTest | undefined
  readonly count: number
  readonly d: number
  readonly lastDose: number
  readonly lastDoseProof: boolean
}

/** The curve tests of a history's tests taken one at a time, in the forecast's order. */
export class CurveTestFold {
  /** The latest curve test so far. */
  last: TimedTest | undefined
  /** How many curve tests so far. */
  count = 0
  private d = 0
  private lastDose = Number.NEGATIVE_INFINITY
  private lastDoseProof = false

  constructor(private readonly doses: readonly ProofDose[], private readonly th: Thresholds) {}

  /** Its progress as plain data (the doses and limits stay shared): copy it before either goes on. */
  state(): CurveFoldState {
    return { last: this.last, count: this.count, d: this.d, lastDose: this.lastDose, lastDoseProof: this.lastDoseProof }
  }

  /** A fold over the same doses and limits going on from `state` (a copy of a fold's state). */
  withState(state: CurveFoldState): CurveTestFold {
    return Object.assign(new CurveTestFold(this.doses, this.th), state)
  }

  /** Takes the next test; true when it traces the curve. */
  push(test: TimedTest): boolean {
    const { doses } = this
    while (this.d < doses.length && doses[this.d]!.t < test.t) {
      this.lastDose = doses[this.d]!.t
      this.lastDoseProof = this.last !== undefined && readsZero(this.last, this.th)
      this.d += 1
    }
    if (this.lastDoseProof && test.t - this.lastDose <= DOSE_CHECK_HOURS * HOUR_MS) return false
    this.last = test
    this.count += 1
    return true
  }
}

/**
 * The curve tests among `tests`, the history's tests from some point on, the fold going on from
 * `state`: the fold as it stood before the first of them (a window's `curve.atStart`).
 */
export function curveTestsFrom(state: CurveFoldState, tests: readonly TimedTest[], doses: readonly ProofDose[], th: Thresholds): TimedTest[] {
  const fold = new CurveTestFold(doses, th).withState(state)
  return tests.filter(test => fold.push(test))
}

/** The tests that trace the curves, in order. */
export function curveTests(tests: readonly TimedTest[], doses: readonly ProofDose[], th: Thresholds): TimedTest[] {
  const fold = new CurveTestFold(doses, th)
  return tests.filter(test => fold.push(test))
}
