/**
 * The latest value of each measured quantity, the tests of a stretch of time, and the water
 * conditions that go with an ammonia test (carried forward from an earlier test when not
 * retaken; found by `conditionsAt` in reads.ts).
 */

import { partitionPoint } from '../sorted'
import { MEASURED_FIELDS, type MeasuredField } from '../vocabulary'
import type { TimedReading } from './history'

/** Latest reading carrying each value; readings are in time order. */
export type Latest = Readonly<Partial<Record<MeasuredField, TimedReading>>>

/** A latest-values record being built (see `noteLatest`). */
export type LatestSoFar = Partial<Record<MeasuredField, TimedReading>>

/** Takes `reading`, the next in time order, as the latest of each value it carries. */
export function noteLatest(latest: LatestSoFar, reading: TimedReading): void {
  for (const key of MEASURED_FIELDS) if (reading[key] !== undefined) latest[key] = reading
}

/** Latest reading for each measured value. */
export function latestValues(readings: readonly TimedReading[]): Latest {
  const latest: LatestSoFar = {}
  for (const reading of readings) noteLatest(latest, reading)
  return latest
}

/** `latest` after `added` joined the readings: it takes each value it carries unless a reading `after` it already does. */
export function updatedLatest(latest: Latest, added: TimedReading, after: (a: TimedReading, b: TimedReading) => boolean): Latest {
  const next: Partial<Record<MeasuredField, TimedReading>> = { ...latest }
  for (const key of MEASURED_FIELDS) {
    const current = next[key]
    if (added[key] !== undefined && (current === undefined || !after(current, added))) next[key] = added
  }
  return next
}

/** Index of the first reading (in time order) taken at or after `t` (`strictlyAfter`: after it). */
function firstFrom(readings: readonly TimedReading[], t: number, strictlyAfter: boolean): number {
  return partitionPoint(readings, r => r.t < t || (strictlyAfter && r.t === t))
}

/**
 * The readings (in time order) taken from `fromMs` to `toMs`, both included, in order: the same
 * as filtering the whole history by time, found by binary search, so a rule that looks at the
 * last days costs those days and not the years before them.
 */
export function readingsBetween(readings: readonly TimedReading[], fromMs: number, toMs = Number.POSITIVE_INFINITY): readonly TimedReading[] {
  return readings.slice(firstFrom(readings, fromMs, false), firstFrom(readings, toMs, true))
}

/**
 * Where `at` stands in `readings` (in time order), or -1: a binary search to its time, then
 * a step over the tests of the same time. A rule may ask this for every test of a window, so
 * a scan from the start would make the verdict's cost grow with the square of the history.
 */
export function positionOf(readings: readonly TimedReading[], at: TimedReading): number {
  for (let i = partitionPoint(readings, r => r.t < at.t); i < readings.length && readings[i]!.t === at.t; i += 1) if (readings[i] === at) return i
  return -1
}

/** Water conditions for a test, each taken from it or from the latest earlier test within `maxAgeHours`. */
export interface Conditions {
  pH?: { value: number, from: TimedReading }
  temperatureC?: { value: number, from: TimedReading }
  salinity?: { value: number, from: TimedReading }
}
