/**
 * How the rules read a history's tests. Every read goes through here, so a history that holds
 * only its latest part (a window, window.ts) answers exactly what the whole history would, or
 * throws BeyondWindow when the tests it holds cannot settle the answer. For a whole history each
 * read is the plain one: a binary search to a time, a walk back from it, or a filter.
 */
import { partitionPoint } from '../sorted'
import { HOUR_MS } from './time'
import { positionOf, readingsBetween, type Conditions } from './snapshot'
import { BeyondWindow, windowStart } from './window'
import type { History, TimedReading } from './history'
import type { Thresholds } from './types'

/** The tests taken from `fromMs` to `toMs`, both included, in order. */
export function readingsFrom(history: History, fromMs: number, toMs = Number.POSITIVE_INFINITY): readonly TimedReading[] {
  if (fromMs < windowStart(history)) throw new BeyondWindow(`tests from ${new Date(fromMs).toISOString()}`)
  return readingsBetween(history.readings, fromMs, toMs)
}

/** The tests taken after `afterMs` (not at it) up to `toMs` (included), in order. */
export function readingsAfter(history: History, afterMs: number, toMs: number): readonly TimedReading[] {
  if (afterMs < windowStart(history)) throw new BeyondWindow(`tests after ${Number.isFinite(afterMs) ? new Date(afterMs).toISOString() : 'the first'}`)
  const { readings } = history
  return readings.slice(partitionPoint(readings, r => r.t <= afterMs), partitionPoint(readings, r => r.t <= toMs))
}

/**
 * The latest test taken before `beforeMs` (`inclusive`: at or before it) for which `wanted` holds,
 * looking back no further than `afterMs` (tests at or before it are not asked); null when none.
 */
export function lastWhere(history: History, beforeMs: number, inclusive: boolean, wanted: (r: TimedReading) => boolean, afterMs = Number.NEGATIVE_INFINITY): TimedReading | null {
  const { readings } = history
  for (let i = partitionPoint(readings, r => r.t < beforeMs || (inclusive && r.t === beforeMs)) - 1; i >= 0; i -= 1) {
    const r = readings[i]!
    if (r.t <= afterMs) return null
    if (wanted(r)) return r
  }
  // Every test held was asked; tests before the start could still be the one.
  if (afterMs < windowStart(history)) throw new BeyondWindow('the latest such test may be older than the tests held')
  return null
}

/** Whether a test taken after `afterMs` satisfies `wanted`. */
export function anyAfter(history: History, afterMs: number, wanted: (r: TimedReading) => boolean): boolean {
  const { readings } = history
  for (let i = partitionPoint(readings, r => r.t <= afterMs); i < readings.length; i += 1) if (wanted(readings[i]!)) return true
  if (afterMs < windowStart(history)) throw new BeyondWindow('no test held answers, and older ones may')
  return false
}

/** Every test of the history, in order. */
export function everyReading(history: History): readonly TimedReading[] {
  if (windowStart(history) > Number.NEGATIVE_INFINITY) throw new BeyondWindow('every test of the history')
  return history.readings
}

/** The latest test, if any. */
export function lastReading(history: History): TimedReading | undefined {
  const last = history.readings[history.readings.length - 1]
  if (last === undefined && windowStart(history) > Number.NEGATIVE_INFINITY) throw new BeyondWindow('the latest test is older than the tests held')
  return last
}

/** The latest test with ammonia or nitrite, or null. */
export function latestNitrogen(history: History): TimedReading | null {
  return lastWhere(history, Number.POSITIVE_INFINITY, true, r => r.ammoniaN !== undefined || r.nitriteN !== undefined)
}

/** Whether a test shows ammonia or nitrite above the kit's zero: something is feeding the bacteria. */
export function showsNitrogen(r: TimedReading, thresholds: Thresholds): boolean {
  return (r.ammoniaN ?? 0) > thresholds.ammoniaZeroN || (r.nitriteN ?? 0) > thresholds.nitriteZeroN
}

/**
 * The first test of the history showing ammonia or nitrite (`showsNitrogen`), or null; a window
 * folded it while the tests streamed past (with the same limits: the engine checks the window fits).
 */
export function firstShown(history: History, thresholds: Thresholds): TimedReading | null {
  if (history.window) return history.window.firstShown
  return history.readings.find(r => showsNitrogen(r, thresholds)) ?? null
}

/** The tests that lost a value (`repairedReadingIds`), in order. */
export function repairedReadings(history: History): readonly TimedReading[] {
  if (history.window?.repairedBeforeStart) throw new BeyondWindow('a test that lost a value is older than the tests held')
  const ids = history.repairedReadingIds
  return ids.length === 0 ? [] : history.readings.filter(r => ids.includes(r.id))
}

/** Finds pH, temperature and salinity for the test `at` (which must be in the history), each from it or the latest earlier test within `maxAgeHours`. */
export function conditionsAt(history: History, at: TimedReading, maxAgeHours: number): Conditions {
  const { readings } = history
  const oldest = at.t - maxAgeHours * HOUR_MS
  const found: Conditions = {}
  const index = positionOf(readings, at)
  if (index < 0) {
    if (at.t < windowStart(history)) throw new BeyondWindow('the conditions of a test older than the tests held')
    return found
  }
  // Walk back from the test itself: the nearest earlier value describes the water best.
  for (let i = index; i >= 0; i -= 1) {
    const r = readings[i]!
    if (r.t < oldest) return found
    if (found.pH === undefined && r.pH !== undefined) found.pH = { value: r.pH, from: r }
    if (found.temperatureC === undefined && r.temperatureC !== undefined) found.temperatureC = { value: r.temperatureC, from: r }
    if (found.salinity === undefined && r.salinity !== undefined) found.salinity = { value: r.salinity, from: r }
    if (found.pH && found.temperatureC && found.salinity) return found
  }
  if (oldest < windowStart(history)) throw new BeyondWindow('conditions that may come from a test older than the tests held')
  return found
}
