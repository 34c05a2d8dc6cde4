/**
 * Shapes of the completion forecast. Times are ISO 8601 (UTC); a range is an
 * interval of INTERVAL_PROBABILITY, never a promise: the engine's verdict decides.
 */

import type { LivestockGroup } from '../types'

/** A stretch of time the event is likely to fall in. */
export interface ForecastRange {
  /** Earliest likely time (ISO). */
  from: string
  /** Latest likely time (ISO). */
  to: string
}

/** Why no range is given. */
export type ForecastGap
  = | 'not-started' // the cycle has not started
    | 'before-nitrite' // still in the ammonia stage: the nitrite stage decides the date
    | 'sparse' // too few tests, or tests too far apart
    | 'stale' // no test for too long
    | 'rising' // nitrite (or ammonia) is still rising
    | 'not-falling' // the curve is flat: a stall, not a decline
    | 'erratic' // tests scatter too widely around any curve
    | 'too-far' // the fitted pace puts completion beyond the horizon or the range is too wide

/** One falling test curve, fitted on a log scale. */
export interface DeclineFit {
  series: 'ammonia' | 'nitrite'
  /** Days for the value to halve, from the weighted fit. */
  halvingDays: number
  /** First test of the fitted stretch (its peak), ISO. */
  since: string
  /** Tests in the fitted stretch. */
  tests: number
  /** When the curve is expected to read zero on the kit (range), ISO. */
  readsZero: ForecastRange
}

/** What the forecast rests on, for plain words and for staff who want the numbers. */
export interface ForecastBasis {
  /** Falling curves fitted (empty when the tank already reads zero). */
  fits: DeclineFit[]
  /** True when ammonia and nitrite already read zero and only the proof is outstanding. */
  readingZero: boolean
  /** Assumed test interval for the days ahead, hours. */
  testEveryHours: number
  /** Latest test used, ISO. */
  latestTest: string | null
  /** Days the late end leaves for nitrite to come back once after the first full proof doses (0: none). */
  relapseDays: number
}

/** The forecast for one tank at one moment. */
export interface CycleForecast {
  forecastVersion: string
  ruleSetVersion: string
  /** `complete`: the engine has proven it; `forecast`: a range; `not-enough-data`: no range, see `gap`. */
  status: 'complete' | 'forecast' | 'not-enough-data'
  gap: ForecastGap | null
  /** Probability the range is meant to hold (0.8). */
  probability: number
  /** When the engine is likely to prove the cycle complete; for `complete`, from = to = completedOn. */
  completion: ForecastRange | null
  /** Most likely single time inside `completion`, for sorting only: never shown as a date to expect. */
  likely: string | null
  /** Earliest likely time each group may go in, as far as the cycle's timeline decides it. */
  groups: Record<LivestockGroup, ForecastRange | null>
  basis: ForecastBasis
}
