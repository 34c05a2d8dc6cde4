/**
 * A history held only in its latest part: the tests from `startMs` to the one moment it was read
 * for, with what the verdict needs of the tests before (the course over all of them, the first
 * test that showed ammonia or nitrite, the forecast's curve count) folded as they streamed past.
 * A tank with years of imported tests is judged holding weeks of them, not years.
 *
 * Exact or nothing: every read of the tests goes through `reads.ts`, which answers only what the
 * held part settles and otherwise throws `BeyondWindow`; the caller then evaluates the whole
 * history as before. So a windowed verdict is the whole history's verdict, or it is not made.
 */
import type { Course } from './course'
import type { CurveFoldState } from './forecast/curve-tests'
import type { TimedTest } from './forecast/series'
import type { PreparedHistory, TimedReading } from './history'
import type { RuleOptions } from './options'
import type { CycleEvent, CycleMethod, CycleReading, Thresholds } from './types'

/**
 * What a fold of the tests was made with: the rule set, the tank's cycle method and start, and the
 * limits. The course and facts folded with one set say nothing about an evaluation asked with another.
 */
export interface FoldedFor {
  readonly thresholds: Thresholds
  readonly method: CycleMethod
  readonly startedMs: number
  readonly options: RuleOptions
}

/** What a windowed history holds of the tests before its start, folded as they streamed past. */
export interface HistoryWindow extends FoldedFor {
  /** `readings` holds every test taken from this time up to `nowMs` (its time parsed), and none before it; minus infinity when it holds them all. */
  readonly startMs: number
  /** The one moment the history was read for: the course and the facts below are as of it. */
  readonly nowMs: number
  /** The course over the whole history as of `nowMs`. */
  readonly course: Course
  /** The first test of the whole history showing ammonia or nitrite above zero (`showsNitrogen`), or null. */
  readonly firstShown: TimedReading | null
  /** Whether a test before `startMs` lost a value (the input rule names each such test). */
  readonly repairedBeforeStart: boolean
  /**
   * The forecast's curve tests of the whole history as of `nowMs`: the latest, how many, and the
   * fold as it stood before the first test held (the held tests replayed from it are the whole
   * history's curve tests from the start on).
   */
  readonly curve: { readonly last: TimedTest | null, readonly count: number, readonly atStart: CurveFoldState }
  /**
   * The history continued by `later` tests and events (all after its latest and at or before
   * `atMs`), held for the same window and read at `atMs`: the forecast's assumed futures.
   * Undefined when the fold cannot go on with them.
   */
  readonly continuedTo: (atMs: number, later: { readonly readings: readonly CycleReading[], readonly events: readonly CycleEvent[] }) => PreparedHistory | undefined
}

/** Thrown when a verdict or forecast needs tests from before a windowed history's start. */
export class BeyondWindow extends Error {
  constructor(what: string) {
    super(`The verdict needs tests from before the part of the history held: ${what}.`)
    this.name = 'BeyondWindow'
  }
}

/** Where the tests held begin: minus infinity for a whole history. */
export function windowStart(history: { readonly window?: HistoryWindow }): number {
  return history.window?.startMs ?? Number.NEGATIVE_INFINITY
}

/** Whether two sets of resolved limits are the same, limit for limit. */
function sameThresholds(a: Thresholds, b: Thresholds): boolean {
  const keys = Object.keys(a) as (keyof Thresholds)[]
  return keys.length === Object.keys(b).length && keys.every(key => a[key] === b[key])
}

/**
 * Whether a fold made for `folded` serves an evaluation asked for `asked`: the same rule set
 * version, cycle method, start and limits. The one test of it, for the stream that decides whether
 * its fold gives an input (`HistoryStream.inputAt`) and for the engine and forecast that decide
 * whether a window's facts answer (`assertWindowFits`), so the two cannot come to disagree.
 */
export function foldServes(folded: FoldedFor, asked: FoldedFor): boolean {
  return folded.options === asked.options && folded.method === asked.method && folded.startedMs === asked.startedMs
    && sameThresholds(folded.thresholds, asked.thresholds)
}

/**
 * Throws BeyondWindow unless the window was folded for this very evaluation: the same moment,
 * limits, tank and rule set version. A window read for one `now` says nothing about another.
 */
export function assertWindowFits(window: HistoryWindow, asked: FoldedFor, nowMs: number): void {
  if (window.nowMs !== nowMs || !foldServes(window, asked)) throw new BeyondWindow('it was read for another moment, limits, tank or rule set')
}
